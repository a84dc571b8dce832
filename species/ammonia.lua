-- Ammonium and ammonia, and ammonia gas.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "ammonia",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0: pK 9.245, dH 51.95 kJ/mol, dCp 8 J/(K mol) [values from memory, high confidence]",
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
    clegg1989 = "S. L. Clegg, P. Brimblecombe, 'Solubility of ammonia in pure aqueous and multicomponent solutions', J. Phys. Chem. 93, 7237-7248 (1989): ln K_H/(mol kg-1 atm-1) = -8.09694 + 3917.507/T - 0.00314 T [equation from memory, medium confidence; it gives K_H 60.7 mol/(kg atm) at 25 C and d ln K_H/d(1/T) = 4200 K, as the compilation of R. Sander, Atmos. Chem. Phys. 15, 4399 (2015) lists]",
  },
  size_source = "kielland1937",
  species = {
    { "NH4+", size = 2.5 },
    { "NH3" },
  },
  acids = {
    { "NH4+", "NH3", pKa = 9.245, dH = 51.95, dCp = 8, source = "goldberg2002" },
  },
  gases = {
    -- log10 K_H = (-8.09694 + 3917.507/T - 0.00314 T) / ln 10
    { "NH3(g)", dissolves = "NH3", logKH = 1.783, source = "clegg1989", T_range = { 273.15, 313.15 },
      logKH_T = { a = -8.09694 / math.log(10), b = -0.00314 / math.log(10),
                  c = 3917.507 / math.log(10) } },
  },
  reagents = {
    { "NH3", names = { "ammonia" }, hazards = { "skin-corrosion", "eye-damage", "organ-toxic-single", "aquatic-acute" } },
    { "NH4Cl", gives = { ["NH4+"] = 1, ["Cl-"] = 1 }, names = { "ammonium chloride" },
      hazards = { "toxic-oral", "eye-irritation" } },
    { "(NH4)2SO4", gives = { ["NH4+"] = 2, ["SO4^2-"] = 1 }, names = { "ammonium sulfate" } },
    { "CH3COONH4", gives = { ["NH4+"] = 1, ["CH3COO-"] = 1 }, names = { "ammonium acetate" } },
    { "HCOONH4", gives = { ["NH4+"] = 1, ["HCOO-"] = 1 }, names = { "ammonium formate" } },
    { "NH4HCO3", gives = { ["NH4+"] = 1, ["HCO3-"] = 1 }, names = { "ammonium bicarbonate",
      "ammonium hydrogen carbonate" } },
  },
  buffers = {
    { "ammonia", pair = { "NH4Cl", "NH3" }, free = "NH4Cl", titrant = "NaOH",
      notes = { "volatility: ammonia escapes from open and warm solutions (common practice)",
                "metals: binds Cu^2+, Zn^2+ and Ni^2+ as ammine complexes (common practice)",
                "temperature: pKa falls about 0.03 per degree C (dH 51.95 kJ/mol, Goldberg et al. 2002)" } },
    { "ammonium bicarbonate", pair = { "NH4HCO3", "NH3" },
      notes = { "volatility: volatile; used where the buffer must be removed by drying (common practice)" } },
  },
}
