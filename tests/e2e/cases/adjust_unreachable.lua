local s = eq.solution{}
s:add("CH3COONa", "10 mmol")
s:adjust_pH(10, "HCl")
