-- Boric acid and borate.
-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "borate",
  sources = {
    goldberg2002 = "R. N. Goldberg, N. Kishore, R. M. Lennen, 'Thermodynamic quantities for the ionization reactions of buffers', J. Phys. Chem. Ref. Data 31, 231-370 (2002), 298.15 K, I = 0: pK 9.237, dH 13.8 kJ/mol, dCp -240 J/(K mol) [values from memory, medium-high confidence; the sign of dCp is corroborated by manov1944]",
    manov1944 = "G. G. Manov, N. J. DeLollis, S. F. Acree, 'Ionization constant of boric acid and the pH of certain borax-chloride buffer solutions from 0 to 60 C', J. Res. Natl. Bur. Stand. 33, 287 (1944): pK = 2237.94/T - 3.305 + 0.016883 T, 0-60 C [seen in the abstract]; this gives pK 9.235 at 25 C, dH 14.1 kJ/mol and dCp = -2 R ln10 (0.016883) T = -193 J/(K mol) at 25 C: negative",
  },
  species = {
    { "B(OH)3", formula = "BO3H3" },
    { "B(OH)4-", formula = "BO4H4-" },
  },
  reactions = {
    -- B(OH)3 + H2O = B(OH)4- + H+, pK 9.237; this is its reverse.
    -- dH, dCp are of this formation reaction: minus those of the ionization
    -- (dH 13.8 kJ/mol, dCp -240 J/(K mol)); the ionization's dCp is negative,
    -- as the temperature function of manov1944 shows
    { "B(OH)3", from = { ["B(OH)4-"] = 1, ["H+"] = 1, H2O = -1 }, logK = 9.237, dH = -13.8,
      dCp = 240, source = "goldberg2002" },
  },
  reagents = {
    { "H3BO3", gives = { ["B(OH)3"] = 1 }, names = { "boric acid" }, hazards = { "reproductive-toxicant" } },
    -- borax: Na2B4O7.10H2O = 2 Na+ + 2 B(OH)4- + 2 B(OH)3 + 3 H2O
    { "Na2B4O7", gives = { ["Na+"] = 2, ["B(OH)4-"] = 2, ["B(OH)3"] = 2, H2O = -7 },
      names = { "sodium tetraborate" }, hydrates = { 10 }, hazards = { "reproductive-toxicant" } },
  },
  buffers = {
    { "borate", free = "H3BO3", titrant = "NaOH",
      notes = { "sugars: forms complexes with diols and sugars, which shifts its pKa (common practice)",
                "toxicity: boric acid and borax are classed as reproductive toxicants; see the safety data sheet (common practice)" } },
  },
}
