-- 10 mM CaCl2 + 5 mM Na2CO3: [Ca2+][CO3 2-] is of order 5e-3 x 1e-3, far above
-- calcite's Ksp of 10^-8.48 (Plummer & Busenberg 1982): the text must warn.
local s = eq.solution{ water = "1 kg" }
s:add("CaCl2", "10 mmol"):add("Na2CO3", "5 mmol")
local r = s:equilibrate()
print(string.format("SI %.2f", r:saturation("calcite")))
