-- The calcium sulfate solids, gypsum and anhydrite (saturation indices, and
-- precipitation where a script allows it), and the calcium sulfate reagent.
-- Builds on calcium.lua (Ca^2+) and sulfate.lua (SO4^2-).
--
-- log Ksp at I = 0 as a function of T (K), log10 T written as ln T / ln 10.
-- Below about 40-60 C gypsum is the stable phase and anhydrite dissolves
-- to supersaturate it; anhydrite forms from solution only slowly.
return {
  system = "calcium sulfate solids",
  sources = {
    nordstrom1990 = "D. K. Nordstrom, L. N. Plummer, D. Langmuir, E. Busenberg, H. M. May, B. F. Jones, D. L. Parkhurst, 'Revised chemical equilibrium data for major water-mineral reactions and their limitations', in D. C. Melchior, R. L. Bassett (eds.), Chemical Modeling of Aqueous Systems II, ACS Symp. Ser. 416, 398-413 (1990): I = 0; gypsum log K -4.58 and log K = 68.2401 - 3221.51/T - 25.0627 log10 T; anhydrite log K -4.36 and log K = 197.52 - 8669.8/T - 69.835 log10 T, T in K [values and equations from memory, medium-high confidence: each equation reproduces its 25 C value to 0.005]",
  },
  solids = {
    { "gypsum", formula = "CaSO4.2H2O",
      dissolves = { ["Ca^2+"] = 1, ["SO4^2-"] = 1, H2O = 2 },
      logKsp = -4.58, source = "nordstrom1990", T_range = { 273.15, 373.15 },
      logKsp_T = { a = 68.2401, c = -3221.51, d = -25.0627 / math.log(10) } },
    { "anhydrite", formula = "CaSO4",
      dissolves = { ["Ca^2+"] = 1, ["SO4^2-"] = 1 },
      logKsp = -4.36, source = "nordstrom1990", T_range = { 273.15, 373.15 },
      logKsp_T = { a = 197.52, c = -8669.8, d = -69.835 / math.log(10) } },
  },
  reagents = {
    { "CaSO4", gives = { ["Ca^2+"] = 1, ["SO4^2-"] = 1 }, names = { "calcium sulfate" },
      hydrates = { 2 },
      note = "CaSO4.2H2O is gypsum: soluble to about 15 mmol/kg at 25 C" },
  },
}
