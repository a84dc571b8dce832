-- warnings of a titration and of a pH adjustment reach the command with
-- their lines: 0.8 mol/kg NaCl is beyond Davies' stated range (I <= 0.5)
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("NaCl", "0.8 mol"):add("CH3COOH", "10 mmol")
local c = s:titrate{ with = "NaOH", step = "1 mmol", to = "5 mmol" }
local mol = s:adjust_pH(5.0, "NaOH")
print(string.format("%d points; %.4f mmol NaOH", #c, mol * 1e3))
