-- Zwitterionic buffers of the Good et al. (1966) family: MES, MOPS, HEPES.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
-- Suppliers differ for MES, MOPS and HEPES: some do not classify them at all.
return {
  system = "Good's buffers",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [dH and dCp from memory, medium confidence]",
    vega1976 = "C. A. Vega, R. G. Bates, 'Buffers for the physiological pH range: thermodynamic constants of four substituted aminoethanesulfonic acids from 5 to 50 C', Anal. Chem. 48, 1293-1296 (1976): pK2 at 25 C, MES 6.270, HEPES 7.565 [values seen in the publication; title from memory]; dH and dCp from R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002) [from memory, medium confidence]",
    good1966 = "N. E. Good, G. D. Winget, W. Winter, T. N. Connolly, S. Izawa, R. M. M. Singh, 'Hydrogen ion buffers for biological research', Biochemistry 5, 467-477 (1966): buffers chosen for negligible metal binding [from memory]",
  },
  species = {
    { "MES", formula = "C6H13NO4S" },     { "MES-", formula = "C6H12NO4S-" },
    { "MOPS", formula = "C7H15NO4S" },    { "MOPS-", formula = "C7H14NO4S-" },
    { "HEPES", formula = "C8H18N2O4S" },  { "HEPES-", formula = "C8H17N2O4S-" },
  },
  acids = {
    -- the sulfonic-acid/ammonium zwitterion HL loses the ammonium proton
    { "MES", "MES-", pKa = 6.270, dH = 14.8, dCp = 5, source = "vega1976" },
    { "MOPS", "MOPS-", pKa = 7.184, dH = 21.1, dCp = 25, source = "goldberg2002" },
    -- HEPES 7.565 as Vega & Bates measured it (Goldberg et al. tabulate 7.564)
    { "HEPES", "HEPES-", pKa = 7.565, dH = 20.4, dCp = 47, source = "vega1976" },
  },
  reagents = {
    { "MES", names = { "MES free acid" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "MESNa", formula = "C6H12NNaO4S", gives = { ["Na+"] = 1, ["MES-"] = 1 }, names = { "MES sodium salt" } },
    { "MOPS", names = { "MOPS free acid" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "MOPSNa", formula = "C7H14NNaO4S", gives = { ["Na+"] = 1, ["MOPS-"] = 1 }, names = { "MOPS sodium salt" } },
    { "HEPES", names = { "HEPES free acid" }, hazards = { "skin-irritation", "eye-irritation" } },
    { "HEPESNa", formula = "C8H17N2NaO4S", gives = { ["Na+"] = 1, ["HEPES-"] = 1 }, names = { "HEPES sodium salt" } },
  },
  buffers = {
    { "MES", pair = { "MES", "MESNa" }, free = "MES", titrant = "NaOH",
      notes = { "metals: negligible binding of most metal ions (Good et al. 1966)" } },
    { "MOPS", pair = { "MOPS", "MOPSNa" }, free = "MOPS", titrant = "NaOH",
      notes = { "metals: negligible binding of most metal ions (Good et al. 1966)",
                "light: solutions yellow and degrade in light; store dark (common practice)" } },
    { "HEPES", pair = { "HEPES", "HEPESNa" }, free = "HEPES", titrant = "NaOH",
      notes = { "metals: negligible binding of most metal ions (Good et al. 1966)",
                "light: with riboflavin under light it forms hydrogen peroxide (common practice)" } },
  },
}
