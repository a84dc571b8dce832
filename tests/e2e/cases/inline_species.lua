-- A user's own buffer system, defined inline (constants invented for the test)
local s = eq.solution{
  activity = "ideal",
  species = {
    sources = { demo = "invented for this test" },
    species = { { "HZ", formula = "C2H4O2" }, { "Z-", formula = "C2H3O2-" } },
    acids = { { "HZ", "Z-", pKa = 5.5, source = "demo" } },
    reagents = { { "NaZ", formula = "C2H3O2Na", gives = { ["Na+"] = 1, ["Z-"] = 1 } } },
  },
}
s:add("HZ", "10 mmol"):add("NaZ", "10 mmol")
local r = s:equilibrate()
-- equal acid and base, ideal: pH = pKa to within the tiny water/H+ terms
print(string.format("pH %.3f", r.pH))
assert(math.abs(r.pH - 5.5) < 1e-3)
