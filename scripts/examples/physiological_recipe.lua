-- A phosphate buffer at physiological ionic strength, from hydrates on the
-- shelf (scenario invented): 1 L, pH 7.40 at 37 C, 50 mM phosphate, ionic
-- strength 0.16 mol/kg with NaCl.

local r = eq.recipe{
  buffer = "phosphate", pH = 7.40, total = "50 mM", volume = "1 L", temperature = 37,
  ionic_strength = "0.16 mol/kg", salt = "NaCl",
  using = { "NaH2PO4.H2O", "Na2HPO4.7H2O" },
}
-- re-make it from the printed quantities, as the bench would
local s = eq.solution{ water = string.format("%.6f kg", r.items[#r.items].mL * 1e-3 *
                                              0.99333), temperature = 37 }
for _, it in ipairs(r.items) do
  if it.role ~= "water" then s:add(it.reagent, it.printed) end
end
local pH = s:equilibrate().pH
print(string.format("re-made from the printed amounts: pH %.4f at 37 C", pH))
assert(math.abs(pH - 7.40) <= 0.005, "the printed recipe does not give its pH back")

-- the buffer's capacity around its target, made the same way at each pH
eq.capacity{ buffers = { "phosphate" }, total = "50 mM", temperature = 37, pH = { 5.5, 9 },
             window = { 7.35, 7.45 } }:plot(params.plot or "phosphate_capacity.svg")
