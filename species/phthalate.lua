-- o-Phthalic acid and potassium hydrogen phthalate.
return {
  system = "phthalate",
  sources = {
    hamer1945a = "W. J. Hamer, G. D. Pinching, S. F. Acree, 'First dissociation constant of o-phthalic acid from 0 to 60 C', J. Res. Natl. Bur. Stand. 35, 539 (1945): pK1 = 561.57/T - 1.2843 + 0.0078833 T, 0-60 C [equation from memory, medium confidence: it gives the tabulated 2.950 at 25 C; checked against the 0.05 mol/kg KHP standard of hamer1946]",
    hamer1946 = "W. J. Hamer, G. D. Pinching, S. F. Acree, 'pH standards at various temperatures: aqueous solutions of acid potassium phthalate', J. Res. Natl. Bur. Stand. 36, 47 (1946): pH of 0.05 mol/kg KHP = 1336.08/T - 5.2678 + 0.016069 T, T = t + 273.16, 0-60 C [seen in the abstract]; used by the tests, not by the model",
    hamer1945b = "W. J. Hamer, S. F. Acree, 'Second dissociation constant of o-phthalic acid', J. Res. Natl. Bur. Stand. 35, 381 (1945): pK2 = 2175.83/T - 9.5508 + 0.025694 T, T in K, 0-60 C; it gives 5.408 at 25 C and 5.433 at 0 C [equation and title from memory, medium-high confidence]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
  },
  species = {
    { "H2Phthalate", formula = "C8H6O4" },
    { "HPhthalate-", formula = "C8H5O4-" },
    { "Phthalate^2-", formula = "C8H4O4^2-", size = 6, size_source = "kielland1937" },
  },
  acids = {
    -- pK1 = 561.57/T - 1.2843 + 0.0078833 T
    { "H2Phthalate", "HPhthalate-", pKa = 2.950, source = "hamer1945a",
      pKa_T = { { a = -1.2843, b = 0.0078833, c = 561.57 } }, T_range = { 273.15, 333.15 } },
    -- pK2 = 2175.83/T - 9.5508 + 0.025694 T
    { "HPhthalate-", "Phthalate^2-", pKa = 5.408, source = "hamer1945b",
      pKa_T = { { a = -9.5508, b = 0.025694, c = 2175.83 } }, T_range = { 273.15, 333.15 } },
  },
  buffers = {
    { "phthalate", free = "KHC8H4O4", titrant = "NaOH",
      notes = { "UV: absorbs strongly in the UV (common practice)" } },
  },
  reagents = {
    { "KHC8H4O4", gives = { ["K+"] = 1, ["HPhthalate-"] = 1 },
      names = { "potassium hydrogen phthalate", "KHP" } },
  },
}
