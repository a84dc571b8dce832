-- o-Phthalic acid and potassium hydrogen phthalate.
return {
  system = "phthalate",
  sources = {
    hamer1945 = "W. J. Hamer, G. D. Pinching, S. F. Acree, 'First and second dissociation constants of o-phthalic acid from 0 to 60 C', J. Res. Natl. Bur. Stand. 35, 539 (1945): pK1 2.950, pK2 5.408 at 25 C [from memory, medium confidence]",
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
  },
  species = {
    { "H2Phthalate", formula = "C8H6O4" },
    { "HPhthalate-", formula = "C8H5O4-" },
    { "Phthalate-2", formula = "C8H4O4-2", size = 6, size_source = "kielland1937" },
  },
  acids = {
    { "H2Phthalate", "HPhthalate-", "Phthalate-2", pKa = { 2.950, 5.408 }, source = "hamer1945" },
  },
  reagents = {
    { "KHC8H4O4", gives = { ["K+"] = 1, ["HPhthalate-"] = 1 },
      names = { "potassium hydrogen phthalate", "KHP" } },
  },
}
