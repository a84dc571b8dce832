local s = eq.solution{}
s:set_temperature(120)
