-- Demo: the harvest-wash buffer of a (fictional) algae-culture bench.
--
-- The team washes harvested microalgae in a sodium/potassium phosphate
-- buffer at 25 C. They are choosing between a strong and a dilute
-- version of the same recipe, and want to know how far a 2 mmol acid spill
-- (the acidic growth medium carried over with the cells) moves each one.

local recipes = {
  { name = "wash buffer, 50 mM", KH2PO4 = "20 mmol", Na2HPO4 = "30 mmol" },
  { name = "wash buffer, 10 mM", KH2PO4 = "4 mmol",  Na2HPO4 = "6 mmol" },
}

print(string.format("%-20s %8s %12s %12s %12s", "recipe", "pH", "I (mol/kg)",
                    "H2PO4- (mM)", "HPO4^2- (mM)"))
for _, rec in ipairs(recipes) do
  local s = eq.solution{ water = "1 kg", temperature = 25, activity = "davies" }
  s:add("KH2PO4", rec.KH2PO4)
  s:add("Na2HPO4", rec.Na2HPO4)
  local r = s:equilibrate()
  print(string.format("%-20s %8.3f %12.4f %12.3f %12.3f", rec.name, r.pH, r.ionic_strength,
                      r:molarity("H2PO4-") * 1e3, r:molarity("HPO4^2-") * 1e3))

  -- the same buffer after the spill: a copy, plus 2 mmol of HCl
  local spill = s:copy()
  spill:add("HCl", "2 mmol")
  local r2 = spill:equilibrate()
  print(string.format("%-20s %8.3f   (pH moved by %+.3f)", "  after 2 mmol HCl", r2.pH,
                      r2.pH - r.pH))
end

print()
print("Full speciation of the 50 mM wash buffer:")
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KH2PO4", "20 mmol"):add("Na2HPO4", "30 mmol")
print(s:equilibrate())

-- the phosphate forms against pH at the ionic strength of the 50 mM buffer
local I = s:equilibrate().ionic_strength
eq.distribution{ system = "phosphate", ionic_strength = I, pH = { 4, 10 } }
  :plot(params.plot or "phosphate_distribution.svg")
