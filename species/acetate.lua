-- Acetic acid and its sodium and potassium salts.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "acetate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory, high confidence]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "CH3COOH" },
    { "CH3COO-", size = 4.5 },
  },
  acids = {
    -- dH, dCp: of the ionization, kJ/mol and J/(K mol)
    { "CH3COOH", "CH3COO-", pKa = 4.756, dH = -0.41, dCp = -142, source = "goldberg2002" },
  },
  buffers = {
    { "acetate", pair = { "CH3COOH", "CH3COONa" },
      notes = { "volatility: acetic acid evaporates from open vessels (common practice)",
                "UV: absorbs below about 230 nm (common practice)" } },
  },
  reagents = {
    { "CH3COOH", names = { "acetic acid", "glacial acetic acid" }, density = 1.049,
      hazards = { "flammable-liquid", "skin-corrosion", "eye-damage" },
      note = "density of the glacial acid near 20 C: 1.049 g/mL, CRC Handbook of Chemistry and Physics, CRC Press, table of physical constants of organic compounds [value from memory, edition not recorded]" },
    { "CH3COONa", gives = { ["Na+"] = 1, ["CH3COO-"] = 1 }, names = { "sodium acetate" },
      hydrates = { 3 } },
    { "CH3COOK", gives = { ["K+"] = 1, ["CH3COO-"] = 1 }, names = { "potassium acetate" } },
  },
}
