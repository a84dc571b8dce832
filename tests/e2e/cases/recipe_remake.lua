-- Each recipe re-made from its printed quantities gives the target pH back
-- to 0.005. The re-make follows the printed procedure: the
-- weighed solids, the titrant stock by volume, the make-up water.
local function remake(r, titrant_M, T)
  local s = eq.solution{ water = string.format("%.9f kg", r.items[#r.items].mL * 1e-3 *
                         (r.solution:water() / r.solution:volume())), temperature = T }
  for _, it in ipairs(r.items) do
    if it.role == "solid" or it.role == "salt" then
      s:add(it.reagent, it.printed)
    elseif it.role == "titrant" then
      local stock = eq.solution{ volume = "1 L", temperature = T }
      stock:add(it.reagent, string.format("%g mol", titrant_M))
      s:pour(stock, it.printed)
    end
  end
  return s:equilibrate().pH
end

local cases = {
  { buffer = "phosphate", pH = 6.8, total = "100 mM", volume = "250 mL", temperature = 25 },
  { buffer = "phosphate", pH = 7.4, total = "50 mM", volume = "1 L", temperature = 37,
    ionic_strength = "0.15 M", using = { "NaH2PO4.2H2O", "Na2HPO4.12H2O" } },
  { buffer = "Tris", pH = 8.1, total = "20 mM", volume = "500 mL", temperature = 4,
    using = { "Tris", "HCl" }, titrant = "1 M" },
  { buffer = "acetate", pH = 4.6, total = "50 mM", volume = "1 L", temperature = 25 },
  { buffer = "HEPES", pH = 7.5, total = "25 mM", volume = "100 mL", temperature = 37,
    using = { "HEPES", "NaOH" }, titrant = "0.5 M", activity = "sit" },
}
for _, c in ipairs(cases) do
  c.quiet = true
  local r = eq.recipe(c)
  local M = c.titrant and eq.quantity(c.titrant) or 1
  local pH = remake(r, M, c.temperature)
  print(string.format("%-10s target %.2f at %2d C: recipe %.4f, re-made %.4f", c.buffer, c.pH,
                      c.temperature, r.pH, pH))
  assert(math.abs(pH - c.pH) <= 0.005, "re-made recipe misses its pH")
end
print("all recipes re-made within 0.005 pH")
