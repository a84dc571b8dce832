-- Dissolved carbon dioxide, bicarbonate and carbonate; CO2 of the air.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "carbonate",
  about = "CO2(aq) (standing for CO2(aq) + H2CO3), HCO3-, CO3^2-, and CO2 gas.",
  sources = {
    pb1982 = "L. N. Plummer, E. Busenberg, 'The solubilities of calcite, aragonite and vaterite in CO2-H2O solutions between 0 and 90 C, and an evaluation of the aqueous model for the system CaCO3-CO2-H2O', Geochim. Cosmochim. Acta 46, 1011-1040 (1982): log K_H, log K1 and log K2 as functions of T, 0-250 C; at 25 C they give log K_H -1.468, pK1 6.352, pK2 10.329 [the three equations as printed in the paper's abstract]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "CO2" },
    { "HCO3-", size = 4.5 },
    { "CO3^2-", size = 4.5 },
  },
  acids = {
    -- pK2 = -log K2 of Plummer & Busenberg: log K2 = -107.8871 - 0.03252849 T
    -- + 5151.79/T + 38.92561 log10 T - 563713.9/T^2 (ln T = ln 10 log10 T)
    { "HCO3-", "CO3^2-", pKa = 10.329, source = "pb1982", T_range = { 273.15, 363.15 },
      pKa_T = { { a = 107.8871, b = 0.03252849, c = -5151.79, d = -38.92561 / math.log(10), e = 563713.9 } } },
  },
  reactions = {
    -- CO2(aq) + H2O = HCO3- + H+ has log K1 = -356.3094 - 0.06091964 T
    -- + 21834.37/T + 126.8339 log10 T - 1684915/T^2; this is its reverse
    { "CO2", from = { ["HCO3-"] = 1, ["H+"] = 1, H2O = -1 }, logK = 6.352, source = "pb1982",
      logK_T = { a = 356.3094, b = 0.06091964, c = -21834.37, d = -126.8339 / math.log(10), e = 1684915 },
      T_range = { 273.15, 363.15 } },
  },
  gases = {
    -- K_H = m(CO2(aq)) / p(CO2), mol kg-1 atm-1: log K_H = 108.3865 + 0.01985076 T
    -- - 6919.53/T - 40.45154 log10 T + 669365/T^2
    { "CO2(g)", dissolves = "CO2", logKH = -1.468, source = "pb1982", T_range = { 273.15, 363.15 },
      logKH_T = { a = 108.3865, b = 0.01985076, c = -6919.53, d = -40.45154 / math.log(10), e = 669365 } },
  },
  reagents = {
    { "NaHCO3", gives = { ["Na+"] = 1, ["HCO3-"] = 1 }, names = { "sodium bicarbonate", "sodium hydrogen carbonate" } },
    { "Na2CO3", gives = { ["Na+"] = 2, ["CO3^2-"] = 1 }, names = { "sodium carbonate" },
      hydrates = { 10 }, hazards = { "eye-irritation" } },
    { "KHCO3", gives = { ["K+"] = 1, ["HCO3-"] = 1 }, names = { "potassium bicarbonate" } },
    { "CO2", names = { "carbon dioxide" } },
  },
  buffers = {
    { "carbonate", pair = { "NaHCO3", "Na2CO3" },
      notes = { "air: exchanges CO2 with the air; keep closed, or use s:expose to follow it (common practice)",
                "metals: precipitates Ca^2+ and Mg^2+ as carbonates (common practice)" } },
  },
}
