-- Strong acids and bases and their common salts, fully dissociated.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "strong electrolytes",
  about = "HCl, HNO3, NaOH, KOH, NaCl, KCl; no ion pairs are formed.",
  sources = {
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
    tj1974 = "A. H. Truesdell, B. F. Jones, J. Res. U.S. Geol. Surv. 2, 233-248 (1974), the paper that introduced the equation (its title, which names the authors' computer program, is left out here): ion-specific ion size (tj_size, Angstrom) and extra linear term (tj_linear, kg/mol) of the Truesdell-Jones equation [values from memory, medium confidence]",
    nea2003 = "R. Guillaumont, T. Fanghaenel, J. Fuger, I. Grenthe, V. Neck, D. A. Palmer, M. H. Rand, 'Update on the Chemical Thermodynamics of Uranium, Neptunium, Plutonium, Americium and Technetium', Chemical Thermodynamics vol. 5, OECD Nuclear Energy Agency, Elsevier, Amsterdam (2003), Appendix B: SIT interaction coefficients, kg/mol [values and co-author list from memory; medium-high confidence for the chloride and nitrate pairs]",
  },
  size_source = "kielland1937",
  params_source = "tj1974",
  species = {
    { "Na+", size = 4.5, params = { tj_size = 4.0, tj_linear = 0.075 } },
    { "K+", size = 3, params = { tj_size = 3.5, tj_linear = 0.015 } },
    { "Cl-", size = 3, params = { tj_size = 3.5, tj_linear = 0.015 } },
    { "NO3-", size = 3 },
  },
  interactions = {
    { "H+", "Cl-", sit = 0.12, source = "nea2003" },
    { "Na+", "Cl-", sit = 0.03, source = "nea2003" },
    { "K+", "Cl-", sit = 0.00, source = "nea2003" },
    { "H+", "NO3-", sit = 0.07, source = "nea2003" },
    { "Na+", "NO3-", sit = -0.04, source = "nea2003" },
    { "K+", "NO3-", sit = -0.11, source = "nea2003" },
    { "Na+", "OH-", sit = 0.04, source = "nea2003" },
    { "K+", "OH-", sit = 0.09, source = "nea2003" },
  },
  reagents = {
    { "HCl", gives = { ["H+"] = 1, ["Cl-"] = 1 }, names = { "hydrochloric acid", "hydrogen chloride" },
      hazards = { "skin-corrosion", "eye-damage", "organ-toxic-single", "metal-corrosive" } },
    { "HNO3", gives = { ["H+"] = 1, ["NO3-"] = 1 }, names = { "nitric acid" },
      hazards = { "oxidizing-liquid", "skin-corrosion", "eye-damage", "toxic-inhaled", "metal-corrosive" } },
    { "NaOH", gives = { ["Na+"] = 1, ["OH-"] = 1 }, names = { "sodium hydroxide" },
      hazards = { "skin-corrosion", "eye-damage", "metal-corrosive" } },
    { "KOH", gives = { ["K+"] = 1, ["OH-"] = 1 }, names = { "potassium hydroxide" },
      hazards = { "toxic-oral", "skin-corrosion", "eye-damage", "metal-corrosive" } },
    { "NaCl", gives = { ["Na+"] = 1, ["Cl-"] = 1 }, names = { "sodium chloride" } },
    { "KCl", gives = { ["K+"] = 1, ["Cl-"] = 1 }, names = { "potassium chloride" } },
    { "NaNO3", gives = { ["Na+"] = 1, ["NO3-"] = 1 }, names = { "sodium nitrate" },
      hazards = { "oxidizing-solid", "eye-irritation" } },
    { "KNO3", gives = { ["K+"] = 1, ["NO3-"] = 1 }, names = { "potassium nitrate" },
      hazards = { "oxidizing-solid" } },
  },
}
