local s = eq.solution{}
s:add("KCl", "5 furlongs")
