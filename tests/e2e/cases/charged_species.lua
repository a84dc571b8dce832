local s = eq.solution{}
s:add("Na+", "1 mmol")
