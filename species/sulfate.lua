-- Hydrogen sulfate and sulfate, and their common salts.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "sulfate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0: HSO4- pK 1.987, dH -22.4 kJ/mol, dCp -258 J/(K mol) [values from memory, medium confidence]",
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "HSO4-" },
    { "SO4^2-", size = 4 },
  },
  acids = {
    { "HSO4-", "SO4^2-", pKa = 1.987, dH = -22.4, dCp = -258, source = "goldberg2002" },
  },
  reagents = {
    { "H2SO4", gives = { ["H+"] = 1, ["HSO4-"] = 1 }, names = { "sulfuric acid" },
      density = 1.83, hazards = { "skin-corrosion", "eye-damage", "metal-corrosive" },
      note = "density of the concentrated acid (about 96 %), CRC Handbook [from memory]; the first ionization is complete" },
    { "Na2SO4", gives = { ["Na+"] = 2, ["SO4^2-"] = 1 }, names = { "sodium sulfate" },
      hydrates = { 10 } },
    { "K2SO4", gives = { ["K+"] = 2, ["SO4^2-"] = 1 }, names = { "potassium sulfate" } },
    { "NaHSO4", gives = { ["Na+"] = 1, ["HSO4-"] = 1 }, names = { "sodium hydrogen sulfate",
      "sodium bisulfate" }, hydrates = { 1 }, hazards = { "eye-damage" } },
    { "KHSO4", gives = { ["K+"] = 1, ["HSO4-"] = 1 }, names = { "potassium hydrogen sulfate" },
      hazards = { "skin-corrosion", "eye-damage", "organ-toxic-single" } },
  },
  buffers = {
    { "sulfate", pair = { "NaHSO4", "Na2SO4" },
      notes = { "range: buffers near pH 2 (Goldberg et al. 2002)",
                "metals: pairs with Ca^2+ and Mg^2+; calcium sulfate may precipitate (common practice)" } },
  },
}
