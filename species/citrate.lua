-- Citric acid and its sodium salts.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "citrate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory: pK high confidence, dH and dCp medium]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "H3Cit", formula = "C6H8O7" },
    { "H2Cit-", formula = "C6H7O7-", size = 3.5 },
    { "HCit^2-", formula = "C6H6O7^2-", size = 4.5 },
    { "Cit^3-", formula = "C6H5O7^3-", size = 5 },
  },
  acids = {
    { "H3Cit", "H2Cit-", "HCit^2-", "Cit^3-", pKa = { 3.128, 4.761, 6.396 },
      dH = { 4.07, 2.23, -3.38 }, dCp = { -131, -178, -254 }, source = "goldberg2002" },
  },
  reagents = {
    { "H3Cit", formula = "C6H8O7", names = { "citric acid" }, hydrates = { 1 },
      hazards = { "eye-irritation" } },
    { "Na3Cit", formula = "C6H5Na3O7", gives = { ["Na+"] = 3, ["Cit^3-"] = 1 },
      names = { "trisodium citrate", "sodium citrate" }, hydrates = { 2 } },
    { "NaH2Cit", formula = "C6H7NaO7", gives = { ["Na+"] = 1, ["H2Cit-"] = 1 },
      names = { "sodium dihydrogen citrate", "monosodium citrate" } },
    { "KH2Cit", formula = "C6H7KO7", gives = { ["K+"] = 1, ["H2Cit-"] = 1 },
      names = { "potassium dihydrogen citrate" } },
  },
  buffers = {
    { "citrate", pair = { "H3Cit", "Na3Cit" },
      notes = { "metals: chelates Ca^2+, Mg^2+, Fe^3+ and other metal ions (common practice)",
                "range: three overlapping pKa values buffer from about pH 2.5 to 7 (Goldberg et al. 2002)" } },
  },
}
