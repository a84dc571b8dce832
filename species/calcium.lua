-- Calcium and magnesium ions, their chlorides and carbonates, the calcium
-- carbonate solids and the hydroxides portlandite and brucite (saturation
-- indices, and precipitation where a script allows it). The hydroxides are
-- written as they dissolve to OH-: log Ksp = log *K - 2 pKw, with the *K
-- (M(OH)2 + 2 H+ = M^2+ + 2 H2O) of the source and pKw = 13.995 at 25 C
-- (IAPWS R11-07, species/water.lua) [D].
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "calcium and magnesium",
  sources = {
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
    pb1982 = "L. N. Plummer, E. Busenberg, 'The solubilities of calcite, aragonite and vaterite in CO2-H2O solutions between 0 and 90 C, and an evaluation of the aqueous model for the system CaCO3-CO2-H2O', Geochim. Cosmochim. Acta 46, 1011-1040 (1982): log Ksp of calcite = -171.9065 - 0.077993 T + 2839.319/T + 71.595 log10 T, of aragonite = -171.9773 - 0.077993 T + 2903.293/T + 71.595 log10 T, T in K, 0-90 C; at 25 C they give -8.480 and -8.336 [equations from memory, medium-high confidence]",
    baes1976 = "C. F. Baes, R. E. Mesmer, The Hydrolysis of Cations, Wiley, New York (1976), 25 C, I = 0: log *K of Ca(OH)2(s) 22.80 (portlandite), Mg(OH)2(s) 16.84 (brucite; the same value in D. K. Nordstrom et al., ACS Symp. Ser. 416, 398 (1990)) [values from memory, medium-high confidence]",
    wagman1982 = "D. D. Wagman et al., 'The NBS tables of chemical thermodynamic properties', J. Phys. Chem. Ref. Data 11, suppl. 2 (1982): dfH at 298.15 K, kJ/mol: Ca(OH)2(cr) -986.09, Mg(OH)2(cr) -924.54, Ca^2+ -542.83, Mg^2+ -466.85, OH- -229.994 [values from memory, medium confidence]; dH of M(OH)2(s) = M^2+ + 2 OH-: portlandite -16.7, brucite -2.3 kJ/mol [D]",
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
    { "portlandite", formula = "Ca(OH)2", dissolves = { ["Ca^2+"] = 1, ["OH-"] = 2 },
      logKsp = 22.80 - 2 * 13.995, dH = -542.83 - 2 * 229.994 + 986.09, source = "baes1976",
      note = "dH from the dfH values of 'wagman1982'; solubility falls as the temperature rises" },
    { "brucite", formula = "Mg(OH)2", dissolves = { ["Mg^2+"] = 1, ["OH-"] = 2 },
      logKsp = 16.84 - 2 * 13.995, dH = -466.85 - 2 * 229.994 + 924.54, source = "baes1976",
      note = "dH from the dfH values of 'wagman1982'" },
  },
}
