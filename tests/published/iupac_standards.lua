-- The IUPAC primary pH standards at 25 C, using only the core names.
-- Published values: R. P. Buck et al., "Measurement of pH. Definition,
-- standards, and procedures (IUPAC Recommendations 2002)", Pure Appl. Chem.
-- 74, 2169-2200 (2002) [values from memory, high confidence].
-- Tolerance 0.02 pH with the Davies model.
local standards = {
  { "phosphate 0.025/0.025 mol/kg", 6.865, { { "KH2PO4", "0.025 mol/kg" }, { "Na2HPO4", "0.025 mol/kg" } } },
  { "phosphate 0.008695/0.03043 mol/kg", 7.413, { { "KH2PO4", "0.008695 mol/kg" }, { "Na2HPO4", "0.03043 mol/kg" } } },
  { "potassium hydrogen phthalate 0.05 mol/kg", 4.005, { { "KHP", "0.05 mol/kg" } } },
}
local worst = 0
for _, st in ipairs(standards) do
  local s = eq.solution{ water = "1 kg", temperature = 25, activity = "davies" }
  for _, a in ipairs(st[3]) do s:add(a[1], a[2]) end
  local r = s:equilibrate()
  local d = r.pH - st[2]
  print(string.format("%-44s computed %.4f  published %.3f  diff %+.4f", st[1], r.pH, st[2], d))
  worst = math.max(worst, math.abs(d))
end
assert(worst <= 0.02, string.format("a standard is off by %.4f pH", worst))
print("all within 0.02 pH")
