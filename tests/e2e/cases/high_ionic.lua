local s = eq.solution{ activity = "davies" }
s:add("NaCl", "2 mol")
print(string.format("pH %.3f", s:equilibrate().pH))
