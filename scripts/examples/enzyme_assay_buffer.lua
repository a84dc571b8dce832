-- Choosing a buffer for an enzyme assay that releases acid (scenario
-- invented): the reaction releases up to 2 mM H+ at 30 C in a 100 mM
-- buffer at pH 7.2, and the assay tolerates +-0.05 pH. Which buffers hold?

local ranked = eq.compare_buffers{ pH = 7.2, temperature = 30, total = "100 mM", volume = "1 L",
                                   load = "2 mM", load_with = "HCl", window = 0.05 }
print()
local best = ranked[1]
print(string.format("best: %s (pH moves %+.3f under the load)", best.buffer, best.shift))

-- the chosen buffer's own budget: how much acid and base before the window is left
local r = eq.recipe{ buffer = best.buffer, pH = 7.2, total = "100 mM", volume = "1 L",
                     temperature = 30, quiet = true }
local b = r.solution:load_budget{ window = 0.05 }
print(string.format("%s budget within +-0.05: %.2f mM acid, %.2f mM base", best.buffer, b.acid_mM,
                    b.base_mM))

-- capacity against pH of the four best candidates, the assay's window shaded
local names = {}
for i = 1, #ranked do
  if ranked[i].possible and #names < 4 then names[#names + 1] = ranked[i].buffer end
end
eq.capacity{ buffers = names, total = "100 mM", temperature = 30, pH = { 5.5, 9.5 },
             window = { 7.15, 7.25 } }:plot(params.plot or "assay_capacity.svg")
