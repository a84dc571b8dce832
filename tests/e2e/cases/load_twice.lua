-- Loading a file of the library again, and the same inline table twice, is
-- a no-op (constants invented for the test).
eq.load_species((params.species or "species") .. "/phosphate.lua")
local t = {
  sources = { demo = "invented for this test" },
  species = { { "HV", formula = "C2H4O2" }, { "V-", formula = "C2H3O2-" } },
  acids = { { "HV", "V-", pKa = 4.4, source = "demo" } },
}
for _ = 1, 2 do eq.load_species(t) end
for _ = 1, 2 do
  local s = eq.solution{ species = t }
  s:add("KH2PO4", "1 mmol"):add("HV", "1 mmol")
  s:equilibrate()
end
print("loaded twice ok")
