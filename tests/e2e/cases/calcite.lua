local s = eq.solution{}
s:add("CaCl2", "2 mmol"):add("NaHCO3", "4 mmol")
print(string.format("SI calcite %.3f", s:equilibrate():saturation("calcite")))
