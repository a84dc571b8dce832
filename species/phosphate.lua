-- Orthophosphoric acid and its sodium and potassium salts.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "phosphate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory; pK3 and its dH medium-high confidence]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
    nea2003 = "R. Guillaumont, T. Fanghaenel, J. Fuger, I. Grenthe, V. Neck, D. A. Palmer, M. H. Rand, 'Update on the Chemical Thermodynamics of Uranium, Neptunium, Plutonium, Americium and Technetium', Chemical Thermodynamics vol. 5, OECD Nuclear Energy Agency, Elsevier, Amsterdam (2003), Appendix B: SIT interaction coefficients, kg/mol [values and co-author list from memory, low-medium confidence]",
  },
  interactions = {
    { "Na+", "H2PO4-", sit = -0.08, source = "nea2003" },
    { "Na+", "HPO4^2-", sit = -0.15, source = "nea2003" },
    { "Na+", "PO4^3-", sit = -0.25, source = "nea2003" },
  },
  size_source = "kielland1937",
  species = {
    { "H3PO4" },
    { "H2PO4-", size = 4.5 },
    { "HPO4^2-", size = 4 },
    { "PO4^3-", size = 4 },
  },
  acids = {
    -- dH, dCp: of each ionization, kJ/mol and J/(K mol)
    { "H3PO4", "H2PO4-", "HPO4^2-", "PO4^3-",
      pKa = { 2.148, 7.198, 12.35 }, dH = { -8.0, 3.6, 16.0 }, dCp = { -141, -230, -242 },
      source = "goldberg2002" },
  },
  buffers = {
    { "phosphate", pair = { "NaH2PO4", "Na2HPO4" },
      notes = { "metals: precipitates Ca^2+ and Mg^2+ and binds many metal ions (common practice)",
                "enzymes: inhibits some kinases and phosphatases (common practice)",
                "temperature: pK2 moves little with temperature (dH 3.6 kJ/mol, Goldberg et al. 2002)" } },
    { "potassium phosphate", pair = { "KH2PO4", "K2HPO4" },
      notes = { "metals: precipitates Ca^2+ and Mg^2+ (common practice)" } },
  },
  reagents = {
    { "H3PO4", names = { "phosphoric acid", "orthophosphoric acid" }, hazards = { "skin-corrosion", "eye-damage", "metal-corrosive" } },
    { "NaH2PO4", gives = { ["Na+"] = 1, ["H2PO4-"] = 1 },
      names = { "sodium dihydrogen phosphate", "monosodium phosphate" }, hydrates = { 1, 2 } },
    { "Na2HPO4", gives = { ["Na+"] = 2, ["HPO4^2-"] = 1 },
      names = { "disodium hydrogen phosphate", "disodium phosphate" }, hydrates = { 2, 7, 12 } },
    { "Na3PO4", gives = { ["Na+"] = 3, ["PO4^3-"] = 1 }, names = { "trisodium phosphate" },
      hydrates = { 12 }, hazards = { "skin-irritation", "eye-irritation" } },
    { "KH2PO4", gives = { ["K+"] = 1, ["H2PO4-"] = 1 },
      names = { "potassium dihydrogen phosphate", "monopotassium phosphate" } },
    { "K2HPO4", gives = { ["K+"] = 2, ["HPO4^2-"] = 1 },
      names = { "dipotassium hydrogen phosphate", "dipotassium phosphate" }, hydrates = { 3 } },
    { "K3PO4", gives = { ["K+"] = 3, ["PO4^3-"] = 1 }, names = { "tripotassium phosphate" },
      hazards = { "skin-irritation", "eye-irritation" } },
  },
}
