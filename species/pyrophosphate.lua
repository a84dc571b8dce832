-- Pyrophosphate (diphosphate): the four ionizations of H4P2O7, its sodium and
-- potassium salts, and its magnesium complexes.
--
-- Names: the phosphate-style formulas ("H2P2O7^2-", "P2O7^4-"); a complex puts
-- the metal first ("MgP2O7^2-", "MgHP2O7-").
--
-- The pK values are for I = 0 (tetramethylammonium media extrapolated, so
-- without Na+ and K+ ion pairs, which are left out here as in metals.lua).
-- The magnesium constants were published for I = 0.1 mol/L and are converted
-- to I = 0 with the Davies equation (docs/methods.md, "Constants at I = 0");
-- the published value stays visible as the first argument of I0.
-- Pyrophosphate hydrolyses slowly to orthophosphate, faster in acid and warm:
-- this file describes a fresh solution.
local A, I = 0.5108, 0.1                    -- Davies A at 25 C (molal scale)
local f = math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I
-- formation log K at I = 0 from I = 0.1; dz2 = sum z^2 reactants - products
local function I0(logK, dz2) return logK + A * f * dz2 end

-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "pyrophosphate",
  measured = { I = 0, t = 25 },             -- every entry, unless it says otherwise
  sources = {
    ms_p2o7 = "R. M. Smith, A. E. Martell, NIST Critically Selected Stability Constants of Metal Complexes (NIST SRD 46) / Critical Stability Constants vol. 4: Inorganic Complexes, Plenum, New York (1976), diphosphate at 25 C, I = 0: pK 0.83, 2.26, 6.72, 9.46 [values from memory, medium confidence; no enthalpies recorded here; handbooks also quote 0.85, 1.96, 6.60, 9.41, medium not checked]",
    ms_p2o7_mg = "R. M. Smith, A. E. Martell, Critical Stability Constants vol. 4 (1976) / NIST SRD 46, Mg^2+ with diphosphate at 25 C, I = 0.1 mol/L (tetramethylammonium salt): log K MgL 5.70, MgHL 3.06 [values from memory, low-medium confidence]",
  },
  species = {
    { "H4P2O7" }, { "H3P2O7-" }, { "H2P2O7^2-" }, { "HP2O7^3-" },
    { "P2O7^4-" },
    { "MgP2O7^2-" }, { "MgHP2O7-" },
  },
  acids = {
    { "H4P2O7", "H3P2O7-", "H2P2O7^2-", "HP2O7^3-", "P2O7^4-",
      pKa = { 0.83, 2.26, 6.72, 9.46 }, source = "ms_p2o7" },
  },
  reactions = {
    { "MgP2O7^2-", from = { ["Mg^2+"] = 1, ["P2O7^4-"] = 1 }, logK = I0(5.70, 4 + 16 - 4),
      source = "ms_p2o7_mg",
      measured = { I = 0.1, t = 25, medium = "tetramethylammonium salt", to_I0 = "davies" },
      note = "log K 5.70 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "MgHP2O7-", from = { ["Mg^2+"] = 1, ["HP2O7^3-"] = 1 }, logK = I0(3.06, 4 + 9 - 1),
      source = "ms_p2o7_mg",
      measured = { I = 0.1, t = 25, medium = "tetramethylammonium salt", to_I0 = "davies" },
      note = "log K 3.06 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
  },
  reagents = {
    { "Na4P2O7", gives = { ["Na+"] = 4, ["P2O7^4-"] = 1 },
      names = { "tetrasodium pyrophosphate", "sodium pyrophosphate", "tetrasodium diphosphate" },
      hydrates = { 10 }, hazards = { "eye-irritation" } },
    { "Na2H2P2O7", gives = { ["Na+"] = 2, ["H2P2O7^2-"] = 1 },
      names = { "disodium dihydrogen pyrophosphate", "sodium acid pyrophosphate",
                "disodium pyrophosphate" }, hydrates = { 6 }, hazards = { "eye-irritation" } },
    { "K4P2O7", gives = { ["K+"] = 4, ["P2O7^4-"] = 1 },
      names = { "tetrapotassium pyrophosphate", "potassium pyrophosphate" },
      hydrates = { 3 }, hazards = { "eye-irritation" } },
  },
  buffers = {
    { "pyrophosphate", pair = { "Na2H2P2O7", "Na4P2O7" }, free = "Na2H2P2O7", titrant = "NaOH",
      notes = { "metals: binds Mg^2+, Ca^2+ and transition metal ions strongly; calcium and magnesium pyrophosphates precipitate (common practice)",
                "enzymes: a product and inhibitor of many phosphoryl-transfer enzymes (common practice)",
                "stability: hydrolyses slowly to orthophosphate, faster in acid and when warm; make fresh (common practice)",
                "temperature: no temperature data in this library; 25 C constants are used",
                "data: Ca^2+ complexes are not in the library (no source re-checked); results with Ca^2+ overstate free Ca^2+" } },
  },
}
