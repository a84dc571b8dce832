-- Unicode and state-symbol spellings wherever a name is taken.
local s = eq.solution{ water = "1 kg", temperature = 25 }
s:add("CaCl2", "1 mmol"):add("NaHCO3", "2 mmol")
local r = s:equilibrate()
-- a solid by its formula and state symbol is refused when two solids share it
local ok, err = pcall(r.saturation, r, "CaCO3(s)")
assert(not ok and err:find("calcite, aragonite", 1, true), err)
assert(r:saturation("calcite") == r:saturation("calcite"))
-- gases and molar masses in Unicode: Na2HPO4.7H2O is 268.06 g/mol from the abridged
-- standard atomic weights (CIAAW/IUPAC 2021: Na 22.990, H 1.0080, P 30.974, O 15.999)
local w = s:copy()
w:expose("CO₂(g)", "426.9 uatm")
local M = eq.molar_mass("Na₂HPO₄·7H₂O")
assert(math.abs(M - 268.07) < 0.01, M)
print("ok notation more")
