-- Solids whose ions come from other species files load with them: in the
-- whole library, in a library of only the solids' file (which brings what
-- it builds on), and not at all when their file is left out.
local function sat(lib, solid, adds)
  local s = eq.solution{ water = "1 kg", library = lib }
  for _, a in ipairs(adds) do s:add(a, "10 mmol") end
  local r = s:equilibrate()
  local ok, si = pcall(r.saturation, r, solid)
  return ok and si or nil
end
local caphos, caso4 = { "CaCl2", "Na2HPO4" }, { "CaCl2", "Na2SO4" }
assert(sat(nil, "brushite", caphos) > 0 and sat(nil, "gypsum", caso4) < 0)
assert(sat({ only = { "solids_phosphate" } }, "brushite", caphos) > 0)
assert(sat({ only = { "solids_phosphate" } }, "struvite", caphos) == -math.huge)
assert(sat({ only = { "solids_sulfate" } }, "gypsum", caso4) < 0)
assert(sat({ only = { "solids_phosphate", "sulfate" } }, "gypsum", caso4) == nil)
assert(sat({ only = { "calcium", "phosphate" } }, "brushite", caphos) == nil)
assert(sat({ without = { "solids_phosphate" } }, "hydroxyapatite", caphos) == nil)
-- struvite needs NH4+: ammonia cannot go without the phosphate solids
local ok, err = pcall(eq.solution, { library = { without = { "ammonia", "metals", "chelators" } } })
assert(not ok and tostring(err):find("solids_phosphate.lua builds on it", 1, true), tostring(err))
assert(pcall(eq.solution, { library = { without = { "ammonia", "metals", "chelators",
                                                   "solids_phosphate" } } }))
print("ok solids library")
