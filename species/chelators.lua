-- EDTA, EGTA and NTA: protonation and metal complexes, and the reagents a lab
-- buys.
--
-- Names: the fully deprotonated ligand carries its charge ("EDTA^4-",
-- "EGTA^4-"); protonated forms prefix H ("HEDTA^3-", "H2EDTA^2-", ...,
-- "H4EDTA" is the free acid); a metal complex puts the metal first
-- ("CaEDTA^2-", "FeEDTA-", "CaEGTA^2-", "CaNTA-", neutral "FeNTA(aq)").
--
-- The critical compilations give these constants at 25 C and I = 0.1 mol/L
-- (KCl or KNO3 medium); they are converted to I = 0 with the Davies
-- equation (docs/methods.md, "Constants at I = 0"), so that the activity
-- model brings them back at the ionic strength of the solution. The
-- published value stays visible as the first argument of I0 or pK0.
-- No dH is recorded: away from 25 C the constants are used at their 25 C
-- value and the result says so.
local A, I = 0.5108, 0.1                    -- Davies A at 25 C (molal scale)
local f = math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I
-- formation log K at I = 0 from I = 0.1; dz2 = sum z^2 reactants - products
local function I0(logK, dz2) return logK + A * f * dz2 end
-- pKa at I = 0 of HA (charge z) = A (charge z - 1) + H+, from I = 0.1
local function pK0(pKa, z) return pKa + A * f * ((z - 1) ^ 2 + 1 - z ^ 2) end

-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "chelators",
  -- every constant: published at 25 C, I = 0.1 mol/L (KCl or KNO3), Davies to I = 0
  measured = { I = 0.1, t = 25, to_I0 = "davies" },
  sources = {
    nist46_edta = "R. M. Smith, A. E. Martell, NIST Critically Selected Stability Constants of Metal Complexes (NIST SRD 46) / Critical Stability Constants vol. 1, EDTA at 25 C, I = 0.1 mol/L, as tabulated by D. C. Harris, Quantitative Chemical Analysis (appendix on EDTA): pK 1.50, 2.00, 2.69, 6.13, 10.37 (the pK 0.0 of H6EDTA^2+ is left out) [pK values seen as quoted from that table; metal log K from memory, medium-high confidence: Mg 8.79, Ca 10.65, Mn 13.89, Zn 16.50, Cu 18.78, Fe(III) 25.1, Na 1.86, K 0.8]",
    nist46_egta = "R. M. Smith, A. E. Martell, NIST Critically Selected Stability Constants of Metal Complexes (NIST SRD 46), EGTA at 25 C, I = 0.1 mol/L: pK 9.40, 8.79, 2.70, 2.00; log K CaL 10.86, MgL 5.21 [values from memory, medium confidence]",
    nist46_nta = "R. M. Smith, A. E. Martell, NIST Critically Selected Stability Constants of Metal Complexes (NIST SRD 46) / Critical Stability Constants vol. 1, nitrilotriacetic acid at 25 C, I = 0.1 mol/L: log K MgL 5.47, CaL 6.39, MnL 7.44, ZnL 10.66, CuL 12.94 [values from memory, medium confidence]",
    nta_fe = "'The iron(III) and iron(II) complexes of nitrilotriacetic acid' (R. L. Gustafson, A. E. Martell [authors and journal from memory]), 25.0 C, I = 0.100 (KCl) [seen in the abstract]: protonation log K 9.59, 2.52, 1.47; Fe(III) log K ML 15.9 (the accepted value, not re-measured), ML2 8.07, hydrolysis of ML -4.36 and of M(OH)L -7.58",
  },
  species = {
    { "H5EDTA+", formula = "C10H17N2O8+" }, { "H4EDTA", formula = "C10H16N2O8" },
    { "H3EDTA-", formula = "C10H15N2O8-" }, { "H2EDTA^2-", formula = "C10H14N2O8^2-" },
    { "HEDTA^3-", formula = "C10H13N2O8^3-" }, { "EDTA^4-", formula = "C10H12N2O8^4-" },
    { "MgEDTA^2-", formula = "C10H12MgN2O8^2-" }, { "CaEDTA^2-", formula = "C10H12CaN2O8^2-" },
    { "MnEDTA^2-", formula = "C10H12MnN2O8^2-" }, { "ZnEDTA^2-", formula = "C10H12N2O8Zn^2-" },
    { "CuEDTA^2-", formula = "C10H12CuN2O8^2-" }, { "FeEDTA-", formula = "C10H12FeN2O8-" },
    { "NaEDTA^3-", formula = "C10H12N2NaO8^3-" }, { "KEDTA^3-", formula = "C10H12KN2O8^3-" },
    { "H4EGTA", formula = "C14H24N2O10" }, { "H3EGTA-", formula = "C14H23N2O10-" },
    { "H2EGTA^2-", formula = "C14H22N2O10^2-" }, { "HEGTA^3-", formula = "C14H21N2O10^3-" },
    { "EGTA^4-", formula = "C14H20N2O10^4-" },
    { "CaEGTA^2-", formula = "C14H20CaN2O10^2-" }, { "MgEGTA^2-", formula = "C14H20MgN2O10^2-" },
    { "H3NTA", formula = "C6H9NO6" }, { "H2NTA-", formula = "C6H8NO6-" },
    { "HNTA^2-", formula = "C6H7NO6^2-" }, { "NTA^3-", formula = "C6H6NO6^3-" },
    { "MgNTA-", formula = "C6H6MgNO6-" }, { "CaNTA-", formula = "C6H6CaNO6-" },
    { "MnNTA-", formula = "C6H6MnNO6-" }, { "ZnNTA-", formula = "C6H6NO6Zn-" },
    { "CuNTA-", formula = "C6H6CuNO6-" }, { "FeNTA(aq)", formula = "C6H6FeNO6" },
    { "FeOHNTA-", formula = "C6H7FeNO7-" }, { "Fe(OH)2NTA^2-", formula = "C6H8FeNO8^2-" },
    { "Fe(NTA)2^3-", formula = "C12H12FeN2O12^3-" },
  },
  acids = {
    { "H5EDTA+", "H4EDTA", "H3EDTA-", "H2EDTA^2-", "HEDTA^3-", "EDTA^4-",
      pKa = { pK0(1.50, 1), pK0(2.00, 0), pK0(2.69, -1), pK0(6.13, -2), pK0(10.37, -3) },
      source = "nist46_edta", note = "published pK at 25 C, I = 0.1: 1.50, 2.00, 2.69, 6.13, 10.37" },
    { "H4EGTA", "H3EGTA-", "H2EGTA^2-", "HEGTA^3-", "EGTA^4-",
      pKa = { pK0(2.00, 0), pK0(2.70, -1), pK0(8.79, -2), pK0(9.40, -3) },
      source = "nist46_egta", note = "published pK at 25 C, I = 0.1: 2.00, 2.70, 8.79, 9.40" },
    { "H3NTA", "H2NTA-", "HNTA^2-", "NTA^3-",
      pKa = { pK0(1.47, 0), pK0(2.52, -1), pK0(9.59, -2) },
      source = "nta_fe", note = "published pK at 25 C, I = 0.1 (KCl): 1.47, 2.52, 9.59" },
  },
  reactions = {
    { "MgEDTA^2-", from = { ["Mg^2+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(8.79, 4 + 16 - 4),
      source = "nist46_edta" },
    { "CaEDTA^2-", from = { ["Ca^2+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(10.65, 4 + 16 - 4),
      source = "nist46_edta" },
    { "MnEDTA^2-", from = { ["Mn^2+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(13.89, 4 + 16 - 4),
      source = "nist46_edta" },
    { "ZnEDTA^2-", from = { ["Zn^2+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(16.50, 4 + 16 - 4),
      source = "nist46_edta" },
    { "CuEDTA^2-", from = { ["Cu^2+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(18.78, 4 + 16 - 4),
      source = "nist46_edta" },
    { "FeEDTA-", from = { ["Fe^3+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(25.1, 9 + 16 - 1),
      source = "nist46_edta" },
    { "NaEDTA^3-", from = { ["Na+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(1.86, 1 + 16 - 9),
      source = "nist46_edta" },
    { "KEDTA^3-", from = { ["K+"] = 1, ["EDTA^4-"] = 1 }, logK = I0(0.8, 1 + 16 - 9),
      source = "nist46_edta" },
    { "CaEGTA^2-", from = { ["Ca^2+"] = 1, ["EGTA^4-"] = 1 }, logK = I0(10.86, 4 + 16 - 4),
      source = "nist46_egta" },
    { "MgEGTA^2-", from = { ["Mg^2+"] = 1, ["EGTA^4-"] = 1 }, logK = I0(5.21, 4 + 16 - 4),
      source = "nist46_egta" },
    -- NTA: M^2+ + NTA^3- = MNTA- (dz2 4 + 9 - 1); Fe^3+ + NTA^3- = FeNTA (9 + 9)
    { "MgNTA-", from = { ["Mg^2+"] = 1, ["NTA^3-"] = 1 }, logK = I0(5.47, 12), source = "nist46_nta" },
    { "CaNTA-", from = { ["Ca^2+"] = 1, ["NTA^3-"] = 1 }, logK = I0(6.39, 12), source = "nist46_nta" },
    { "MnNTA-", from = { ["Mn^2+"] = 1, ["NTA^3-"] = 1 }, logK = I0(7.44, 12), source = "nist46_nta" },
    { "ZnNTA-", from = { ["Zn^2+"] = 1, ["NTA^3-"] = 1 }, logK = I0(10.66, 12), source = "nist46_nta" },
    { "CuNTA-", from = { ["Cu^2+"] = 1, ["NTA^3-"] = 1 }, logK = I0(12.94, 12), source = "nist46_nta" },
    { "FeNTA(aq)", from = { ["Fe^3+"] = 1, ["NTA^3-"] = 1 }, logK = I0(15.9, 18), source = "nta_fe" },
    { "Fe(NTA)2^3-", from = { ["FeNTA(aq)"] = 1, ["NTA^3-"] = 1 }, logK = I0(8.07, 9 - 9),
      source = "nta_fe", note = "stepwise log K 8.07 at I = 0.1" },
    -- hydrolysis of FeNTA, published as FeL + H2O = Fe(OH)L- + H+ (log K -4.36 at
    -- I = 0.1; dz2 0 - 2); written here from OH- with pKw 13.995 (IAPWS R11-07)
    { "FeOHNTA-", from = { ["FeNTA(aq)"] = 1, ["OH-"] = 1 }, logK = I0(-4.36, -2) + 13.995,
      source = "nta_fe", note = "log *K -4.36 at I = 0.1; Davies to I = 0, then + pKw" },
    { "Fe(OH)2NTA^2-", from = { ["FeOHNTA-"] = 1, ["OH-"] = 1 }, logK = I0(-7.58, 1 - 5) + 13.995,
      source = "nta_fe", note = "log *K -7.58 at I = 0.1; Davies to I = 0, then + pKw" },
  },
  reagents = {
    { "H4EDTA", names = { "EDTA free acid", "edetic acid" }, hazards = { "toxic-inhaled", "organ-toxic-repeated", "eye-irritation" },
      note = "dissolves only as NaOH is added" },
    { "Na2H2EDTA", formula = "C10H14N2Na2O8", gives = { ["Na+"] = 2, ["H2EDTA^2-"] = 1 },
      names = { "disodium EDTA", "disodium edetate" }, hydrates = { 2 },
      hazards = { "toxic-inhaled", "organ-toxic-repeated" } },
    { "K2H2EDTA", formula = "C10H14K2N2O8", gives = { ["K+"] = 2, ["H2EDTA^2-"] = 1 },
      names = { "dipotassium EDTA" }, hydrates = { 2 }, hazards = { "toxic-inhaled", "organ-toxic-repeated" } },
    { "Na4EDTA", formula = "C10H12N2Na4O8", gives = { ["Na+"] = 4, ["EDTA^4-"] = 1 },
      names = { "tetrasodium EDTA" }, hydrates = { 2, 4 }, hazards = { "toxic-oral", "toxic-inhaled", "eye-damage", "organ-toxic-repeated" } },
    { "CaNa2EDTA", formula = "C10H12CaN2Na2O8", gives = { ["Na+"] = 2, ["CaEDTA^2-"] = 1 },
      names = { "calcium disodium EDTA", "edetate calcium disodium" }, hydrates = { 2 } },
    { "H3NTA", names = { "NTA", "NTA free acid", "nitrilotriacetic acid" },
      hazards = { "toxic-oral", "eye-irritation", "carcinogen" },
      note = "dissolves only as NaOH is added" },
    { "Na3NTA", formula = "C6H6NNa3O6", gives = { ["Na+"] = 3, ["NTA^3-"] = 1 },
      names = { "trisodium NTA", "trisodium nitrilotriacetate" }, hydrates = { 1 },
      hazards = { "toxic-oral", "eye-irritation", "carcinogen" } },
    { "H4EGTA", names = { "EGTA", "EGTA free acid", "egtazic acid" }, hazards = { "skin-irritation", "eye-irritation" },
      note = "dissolves only as NaOH or KOH is added" },
  },
}
