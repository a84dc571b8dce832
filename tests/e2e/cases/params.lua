local s = eq.solution{ water = params.water or "1 kg", activity = "davies" }
s:add("KH2PO4", params.acid or "25 mmol")
s:add("Na2HPO4", params.base or "25 mmol")
local r = s:equilibrate()
print(string.format("pH %.3f", r.pH))
