-- Calcium and magnesium ions, their chlorides and carbonates, and the
-- calcium carbonate solids (saturation indices).
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "calcium and magnesium",
  sources = {
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
    pb1982 = "L. N. Plummer, E. Busenberg, 'The solubilities of calcite, aragonite and vaterite in CO2-H2O solutions between 0 and 90 C, and an evaluation of the aqueous model for the system CaCO3-CO2-H2O', Geochim. Cosmochim. Acta 46, 1011-1040 (1982): log Ksp of calcite = -171.9065 - 0.077993 T + 2839.319/T + 71.595 log10 T, of aragonite = -171.9773 - 0.077993 T + 2903.293/T + 71.595 log10 T, T in K, 0-90 C; at 25 C they give -8.480 and -8.336 [equations from memory, medium-high confidence]",
  },
  size_source = "kielland1937",
  species = {
    { "Ca^2+", size = 6 },
    { "Mg^2+", size = 8 },
  },
  reagents = {
    { "CaCl2", gives = { ["Ca^2+"] = 1, ["Cl-"] = 2 }, names = { "calcium chloride" },
      hydrates = { 2, 6 }, hazards = { "eye-irritation" } },
    { "MgCl2", gives = { ["Mg^2+"] = 1, ["Cl-"] = 2 }, names = { "magnesium chloride" },
      hydrates = { 6 } },
    { "CaCO3", gives = { ["Ca^2+"] = 1, ["CO3^2-"] = 1 }, names = { "calcium carbonate" } },
  },
  solids = {
    { "calcite", formula = "CaCO3", dissolves = { ["Ca^2+"] = 1, ["CO3^2-"] = 1 },
      logKsp = -8.48, source = "pb1982", T_range = { 273.15, 363.15 },
      logKsp_T = { a = -171.9065, b = -0.077993, c = 2839.319, d = 71.595 / math.log(10) } },
    { "aragonite", formula = "CaCO3", dissolves = { ["Ca^2+"] = 1, ["CO3^2-"] = 1 },
      logKsp = -8.336, source = "pb1982", T_range = { 273.15, 363.15 },
      logKsp_T = { a = -171.9773, b = -0.077993, c = 2903.293, d = 71.595 / math.log(10) } },
  },
}
