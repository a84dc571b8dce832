local s = eq.solution{ water = "1 kg" }
s:add("NaCl", "1 mmol")
print(s:total("Na+1"))
