local s = eq.solution{ water = "1 kg" }
s:add("NaCl", "10 mmol")
s:add("NaCL", "10 mmol")
