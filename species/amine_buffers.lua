-- Amine buffers outside the Good family: Bis-Tris, glycylglycine,
-- ethanolamine and triethanolamine. The protonated amine is "<name>H+".
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "amine buffers",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory: ethanolamine medium-high; glycylglycine and triethanolamine medium]",
    roy2014bistris = "R. N. Roy, L. N. Roy, K. Hundley, J. Dinga, M. Medcalf, L. Tebbe, R. Parmar, J. Veliz, 'Acid dissociation constants and related thermodynamic functions of protonated BIS-TRIS from (278.15 to 328.15) K', J. Biophys. Chem. 5, 118-124 (2014): pKa = 921.66/T + 14.0007 - 1.86197 ln T; 6.4828 at 298.15 K, 6.2906 at 310.15 K; dH 28.273 kJ/mol, dCp 36 J/(K mol) [seen in the abstract]",
    crc_density = "CRC Handbook of Chemistry and Physics, physical constants of organic compounds: density of the liquid near 20 C [from memory]",
  },
  species = {
    { "BisTrisH+", formula = "C8H20NO5+" }, { "BisTris", formula = "C8H19NO5" },
    { "H2GlyGly+", formula = "C4H9N2O3+" }, { "GlyGly", formula = "C4H8N2O3" },
    { "GlyGly-", formula = "C4H7N2O3-" },
    { "EthanolamineH+", formula = "C2H8NO+" }, { "Ethanolamine", formula = "C2H7NO" },
    { "TEAH+", formula = "C6H16NO3+" }, { "TEA", formula = "C6H15NO3" },
  },
  acids = {
    { "BisTrisH+", "BisTris", pKa = 6.483, source = "roy2014bistris", T_range = { 278.15, 328.15 },
      pKa_T = { { a = 14.0007, c = 921.66, d = -1.86197 } } },
    { "H2GlyGly+", "GlyGly", "GlyGly-", pKa = { 3.140, 8.265 }, dH = { 0.11, 43.4 },
      dCp = { -127, -16 }, source = "goldberg2002" },
    { "EthanolamineH+", "Ethanolamine", pKa = 9.498, dH = 50.52, dCp = 26, source = "goldberg2002" },
    { "TEAH+", "TEA", pKa = 7.762, dH = 33.6, dCp = 50, source = "goldberg2002" },
  },
  reagents = {
    { "BisTris", names = { "Bis-Tris", "bis-tris methane" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "BisTrisHCl", formula = "C8H19NO5.HCl", gives = { ["BisTrisH+"] = 1, ["Cl-"] = 1 },
      names = { "Bis-Tris hydrochloride" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "GlyGly", names = { "glycylglycine", "Gly-Gly" } },
    { "Ethanolamine", names = { "ethanolamine", "2-aminoethanol", "monoethanolamine" },
      density = 1.012, hazards = { "toxic-oral", "toxic-dermal", "toxic-inhaled", "skin-corrosion", "eye-damage", "organ-toxic-single" },
      note = "density from crc_density [from memory]" },
    { "EthanolamineHCl", formula = "C2H7NO.HCl", gives = { ["EthanolamineH+"] = 1, ["Cl-"] = 1 },
      names = { "ethanolamine hydrochloride" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "TEA", names = { "triethanolamine", "TEOA" }, density = 1.124, hazards = { "skin-irritation", "eye-irritation" },
      note = "density from crc_density [from memory]" },
    { "TEAHCl", formula = "C6H15NO3.HCl", gives = { ["TEAH+"] = 1, ["Cl-"] = 1 },
      names = { "triethanolamine hydrochloride" }, hazards = { "skin-irritation", "eye-irritation" } },
  },
  buffers = {
    { "Bis-Tris", pair = { "BisTrisHCl", "BisTris" }, free = "BisTris", titrant = "HCl",
      notes = { "metals: binds Cu^2+ and Pb^2+; weak binding of Ca^2+ and Mg^2+ (common practice)",
                "temperature: pKa falls about 0.016 per degree C (dH 28.3 kJ/mol, Roy et al. 2014)" } },
    { "glycylglycine", free = "GlyGly", titrant = "NaOH",
      notes = { "metals: binds Cu^2+ and other transition metal ions (common practice)",
                "temperature: pK2 falls about 0.025 per degree C (dH 43.4 kJ/mol, Goldberg et al. 2002)" } },
    { "ethanolamine", pair = { "EthanolamineHCl", "Ethanolamine" }, free = "Ethanolamine",
      titrant = "HCl",
      notes = { "temperature: pKa falls about 0.03 per degree C (dH 50.5 kJ/mol, Goldberg et al. 2002)",
                "reactivity: a primary amine; absorbs CO2 from the air (common practice)" } },
    { "triethanolamine", pair = { "TEAHCl", "TEA" }, free = "TEA", titrant = "HCl",
      notes = { "metals: binds Cu^2+ and Fe^3+ at high pH (common practice)" } },
  },
}
