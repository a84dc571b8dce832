local s = eq.solution{}
s:add("NaCl", 10)
