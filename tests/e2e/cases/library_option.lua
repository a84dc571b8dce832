-- A species library for one solution: extended by an inline table, or
-- restricted to some species files; the run's library and every other
-- solution stay as they are (the acid's constants are invented for the test).
local mine = {
  sources = { demo = "invented for this test" },
  species = { { "HY", formula = "C2H4O2" }, { "Y-", formula = "C2H3O2-" } },
  acids = { { "HY", "Y-", pKa = 6.2, source = "demo" } },
  reagents = { { "NaY", formula = "C2H3O2Na", gives = { ["Na+"] = 1, ["Y-"] = 1 } } },
}
local a = eq.solution{ activity = "ideal", species = mine }
a:add("HY", "10 mmol"):add("NaY", "10 mmol")
-- equal amounts of acid and salt, ideal: pH = pKa within the tiny H+ and OH- terms
assert(math.abs(a:equilibrate().pH - 6.2) < 1e-3)
local other = eq.solution{}
assert(not pcall(other.add, other, "NaY", "1 mmol"), "another solution does not see NaY")
assert(not pcall(eq.describe, "HY"), "the run's library does not have HY")
-- the same table again: the same library, still only for that solution
local a2 = eq.solution{ activity = "ideal", species = mine }
a2:add("NaY", "1 mmol")

-- only the phosphate system (and what it builds on): the IUPAC primary
-- standard 0.025 m KH2PO4 + 0.025 m Na2HPO4, pH(S) 6.865 at 25 C
local p = eq.solution{ library = { only = { "phosphate" } } }
p:add("KH2PO4", "25 mmol"):add("Na2HPO4", "25 mmol")
local pH = p:equilibrate().pH
local ok, err = pcall(p.add, p, "TrisHCl", "1 mmol")
assert(not ok and err:find("unknown reagent 'TrisHCl'", 1, true), err)
-- restricted and extended at once
local q = eq.solution{ library = { only = { "phosphate" } }, species = mine }
q:add("NaY", "1 mmol"):add("KH2PO4", "1 mmol")
-- options are checked as strictly as any other
ok, err = pcall(eq.solution, { library = { onyl = { "phosphate" } } })
assert(not ok and err:find("unknown option 'onyl' (did you mean 'only'?)", 1, true), err)
ok, err = pcall(eq.solution, { library = { only = { "phosphat" } } })
assert(not ok and err:find("no species file 'phosphat'", 1, true), err)
ok, err = pcall(eq.solution, { library = { without = { "strong" } } })
assert(not ok and err:find("builds on it", 1, true), err)
ok, err = pcall(eq.solution, { library = { only = { "phosphate" }, without = { "tris" } } })
assert(not ok and err:find("either 'only' or 'without'", 1, true), err)
-- many solutions, each with an acid of its own: nothing piles up
for i = 1, 200 do
  local t = {
    sources = { demo = "invented for this test" },
    species = { { "HX9", formula = "C2H4O2" }, { "X9-", formula = "C2H3O2-" } },
    acids = { { "HX9", "X9-", pKa = 5 + i / 100, source = "demo" } },
  }
  local s = eq.solution{ activity = "ideal", species = t }
  s:add("HX9", "1 mmol")
  s:equilibrate()
end
print(string.format("library ok, phosphate pH %.3f", pH))
