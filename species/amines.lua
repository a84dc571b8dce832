-- Glycine and imidazole.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "glycine and imidazole",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory: glycine pK high, dH/dCp medium; imidazole medium-high]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "H2Gly+", formula = "C2H6NO2+", size = 4 },
    { "Gly", formula = "C2H5NO2" },
    { "Gly-", formula = "C2H4NO2-", size = 4.5 },
    { "ImH+", formula = "C3H5N2+" },
    { "Im", formula = "C3H4N2" },
  },
  acids = {
    { "H2Gly+", "Gly", "Gly-", pKa = { 2.351, 9.780 }, dH = { 4.00, 44.2 }, dCp = { -139, -57 },
      source = "goldberg2002" },
    { "ImH+", "Im", pKa = 6.993, dH = 36.64, dCp = -9, source = "goldberg2002" },
  },
  reagents = {
    { "Gly", names = { "glycine" } },
    { "Im", names = { "imidazole" }, hazards = { "toxic-oral", "skin-corrosion", "eye-damage", "reproductive-toxicant" } },
  },
  buffers = {
    { "glycine", free = "Gly", titrant = "NaOH",
      notes = { "range: buffers near pH 9.8 with NaOH, or near 2.4 with HCl (Goldberg et al. 2002)",
                "metals: binds Cu^2+ and other metal ions (common practice)" } },
    { "imidazole", free = "Im", titrant = "HCl",
      notes = { "UV: absorbs below about 230 nm (common practice)",
                "metals: binds Cu^2+, Zn^2+ and Ni^2+ strongly (common practice)",
                "temperature: pKa falls about 0.02 per degree C (dH 36.64 kJ/mol, Goldberg et al. 2002)" } },
  },
}
