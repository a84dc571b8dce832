-- Cacodylic (dimethylarsinic) acid and sodium cacodylate.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "cacodylate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0: (CH3)2AsO2H pK 6.27 [value from memory, about +-0.02]; its dH is not recorded here",
  },
  species = {
    { "HCacodylate", formula = "C2H7AsO2" },
    { "Cacodylate-", formula = "C2H6AsO2-" },
  },
  acids = {
    { "HCacodylate", "Cacodylate-", pKa = 6.27, source = "goldberg2002" },
  },
  reagents = {
    { "HCacodylate", names = { "cacodylic acid", "dimethylarsinic acid" },
      hazards = { "toxic-oral", "toxic-inhaled", "carcinogen", "aquatic-acute", "aquatic-chronic" } },
    { "NaCacodylate", formula = "C2H6AsNaO2", gives = { ["Na+"] = 1, ["Cacodylate-"] = 1 },
      names = { "sodium cacodylate" }, hydrates = { 3 }, hazards = { "toxic-oral", "toxic-inhaled", "carcinogen", "aquatic-acute", "aquatic-chronic" } },
  },
  buffers = {
    { "cacodylate", free = "NaCacodylate", titrant = "HCl",
      notes = { "toxicity: an arsenic compound; toxic and carcinogenic, dispose of as arsenic waste (common practice)",
                "metals: does not precipitate Ca^2+ (common practice in electron microscopy fixatives)",
                "temperature: no temperature data in this library; the 25 C constant is used" } },
  },
}
