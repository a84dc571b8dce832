-- Strong acids and bases and their common salts, fully dissociated.
return {
  system = "strong electrolytes",
  about = "HCl, HNO3, NaOH, KOH, NaCl, KCl; no ion pairs are formed.",
  sources = {
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "Na+", size = 4.5 },
    { "K+", size = 3 },
    { "Cl-", size = 3 },
    { "NO3-", size = 3 },
  },
  reagents = {
    { "HCl", gives = { ["H+"] = 1, ["Cl-"] = 1 }, names = { "hydrochloric acid", "hydrogen chloride" },
      hazards = { "corrosive" } },
    { "HNO3", gives = { ["H+"] = 1, ["NO3-"] = 1 }, names = { "nitric acid" },
      hazards = { "corrosive", "oxidizer" } },
    { "NaOH", gives = { ["Na+"] = 1, ["OH-"] = 1 }, names = { "sodium hydroxide" },
      hazards = { "corrosive" } },
    { "KOH", gives = { ["K+"] = 1, ["OH-"] = 1 }, names = { "potassium hydroxide" },
      hazards = { "corrosive" } },
    { "NaCl", gives = { ["Na+"] = 1, ["Cl-"] = 1 }, names = { "sodium chloride" } },
    { "KCl", gives = { ["K+"] = 1, ["Cl-"] = 1 }, names = { "potassium chloride" } },
    { "NaNO3", gives = { ["Na+"] = 1, ["NO3-"] = 1 }, names = { "sodium nitrate" },
      hazards = { "oxidizer" } },
    { "KNO3", gives = { ["K+"] = 1, ["NO3-"] = 1 }, names = { "potassium nitrate" },
      hazards = { "oxidizer" } },
  },
}
