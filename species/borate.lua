-- Boric acid and borate.
return {
  system = "borate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory, medium-high confidence]",
  },
  species = {
    { "B(OH)3", formula = "BO3H3" },
    { "B(OH)4-", formula = "BO4H4-" },
  },
  reactions = {
    -- B(OH)3 + H2O = B(OH)4- + H+, pK 9.237; this is its reverse.
    -- dH, dCp are of this formation reaction: minus those of the ionization
    { "B(OH)3", from = { ["B(OH)4-"] = 1, ["H+"] = 1, H2O = -1 }, logK = 9.237, dH = -13.8,
      dCp = -240, source = "goldberg2002" },
  },
  reagents = {
    { "H3BO3", gives = { ["B(OH)3"] = 1 }, names = { "boric acid" }, hazards = { "toxic" } },
    -- borax: Na2B4O7.10H2O = 2 Na+ + 2 B(OH)4- + 2 B(OH)3 + 3 H2O
    { "Na2B4O7", gives = { ["Na+"] = 2, ["B(OH)4-"] = 2, ["B(OH)3"] = 2, H2O = -7 },
      names = { "sodium tetraborate" }, hydrates = { 10 }, hazards = { "toxic" } },
  },
  buffers = {
    { "borate", free = "H3BO3", titrant = "NaOH",
      notes = { "sugars: forms complexes with diols and sugars, which shifts its pKa (common practice)",
                "toxicity: boric acid and borax are classed as reproductive toxicants; see the safety data sheet (common practice)" } },
  },
}
