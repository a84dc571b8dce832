-- Tris(hydroxymethyl)aminomethane and its hydrochloride.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "Tris",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0 [values from memory, high confidence]",
  },
  species = {
    { "Tris", formula = "C4H11NO3" },
    { "TrisH+", formula = "C4H12NO3+" },
  },
  acids = {
    { "TrisH+", "Tris", pKa = 8.072, dH = 47.45, dCp = -59, source = "goldberg2002" },
  },
  buffers = {
    { "Tris", pair = { "TrisHCl", "Tris" }, free = "Tris", titrant = "HCl",
      notes = { "temperature: pKa falls about 0.03 per degree C (dH 47.45 kJ/mol, Goldberg et al. 2002)",
                "reactivity: a primary amine; reacts with aldehydes and some reagents (common practice)",
                "electrodes: can interfere with some calomel reference electrodes (common practice)" } },
  },
  reagents = {
    { "Tris", names = { "Tris base", "tromethamine", "tris(hydroxymethyl)aminomethane" },
      hazards = { "skin-irritation", "eye-irritation" } },
    { "TrisHCl", formula = "C4H11NO3.HCl", gives = { ["TrisH+"] = 1, ["Cl-"] = 1 },
      names = { "Tris hydrochloride", "Tris-HCl" }, hazards = { "skin-irritation", "eye-irritation" } },
  },
}
