-- Metal ions beyond Na+, K+, Ca^2+ and Mg^2+ (Mn^2+, Zn^2+, Cu^2+, Fe^3+),
-- their salts, and the complexes of all of them with hydroxide, chloride,
-- acetate, ammonia, phosphate, carbonate, sulfate, citrate, succinate and
-- glycine.
--
-- Names: metal first, then the ligand as its species is named, then the
-- charge: "CaOH+", "CuCH3COO+", "Zn(NH3)4^2+", "CaHPO4(aq)", "CaCit-". A
-- neutral complex takes "(aq)" so that it is never confused with the solid
-- reagent of the same formula ("CaCO3(aq)" is not calcite nor the reagent
-- "CaCO3"). Hydroxo complexes are written as formations from OH- (log beta),
-- so that the ionization of water carries their temperature dependence.
--
-- Every log K here is for I = 0 and 25 C. A value published for I = 0.1
-- mol/L is converted with the Davies equation (docs/methods.md, "Constants
-- at I = 0"); the published value and its medium stay in the entry's note.
-- The hydroxide and oxide solids are written as they dissolve to OH-:
-- log Ksp = log *K - n pKw with the *K (M(OH)n + n H+ = M^n+ + n H2O, or
-- MO + 2 H+ = M^2+ + H2O) of the source, at I = 0 and 25 C.
-- Weak alkali-metal ion pairs (NaHPO4-, KSO4-, ...) are left out on purpose:
-- the pKa values of this library were extrapolated to I = 0 without them,
-- so adding them would count the same interaction twice.
local A, I = 0.5108, 0.1                    -- Davies A at 25 C (molal scale)
local f = math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I
-- log K at I = 0 from log K at I = 0.1 mol/L of a formation reaction;
-- dz2 = sum of z^2 of the reactants minus that of the products
local function I0(logK, dz2) return logK + A * f * dz2 end
local L10 = math.log(10)
-- the conditions of a constant published at I = 0.1 mol/L (medium not stated)
local at_I01 = { I = 0.1, t = 25, to_I0 = "davies" }

-- Hazard classes (GHS keys, docs/species-format.md): the harmonised classification
-- of Regulation (EC) No 1272/2008, Annex VI, where one exists, else suppliers' safety
-- data sheets [from memory; the safety data sheet of the product in hand decides].
return {
  system = "metal ions and their complexes",
  measured = { I = 0, t = 25 },             -- every entry, unless it says otherwise
  sources = {
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
    ms1976 = "A. E. Martell, R. M. Smith, Critical Stability Constants, vols. 1-4, Plenum, New York (1974-1976), 25 C, I = 0, as tabulated in 'E4a: Stepwise association constants', LibreTexts Chemistry reference tables [seen]: acetate log K1 Mg 1.27, Ca 1.18, Mn 1.40, Zn 1.57, Cu 2.22 (K2 1.41); ammonia Cu 4.04, 3.43, 2.80, 1.48, Zn 2.21, 2.29, 2.36, 2.03; chloride Cu 0.40, Fe(III) 1.48, 0.65, Zn 0.43, 0.18, -0.11, -0.3",
    ms1974ca = "A. E. Martell, R. M. Smith, Critical Stability Constants (1974-1989), 25 C, I = 0.1 mol/L, as quoted in Table 9 of a 2016 paper in J. Appl. Phycol. 28, 2561 [seen]: log K of Ca^2+ with citrate 3.45, succinate 1.25 (and hydroxide 1.0, acetate 0.57, which corroborate the I = 0 values used here)",
    gimblett1954 = "F. G. R. Gimblett, C. B. Monk, 'E.m.f. studies of electrolytic dissociation, part 7: some alkali and alkaline earth metal hydroxides in water', Trans. Faraday Soc. 50, 965 (1954): Ca^2+ + OH- = CaOH+, log K 1.30 at 25 C, I = 0, the value selected by Martell & Smith [value from memory, medium-high confidence]",
    baes1976 = "C. F. Baes, R. E. Mesmer, The Hydrolysis of Cations, Wiley, New York (1976), 25 C, I = 0: log *K of M^z+ + n H2O = M(OH)n + n H+: Mg -11.44; Mn -10.59; Zn -8.96, -16.9, -28.4, -40.5 (n = 1-4); Cu -8.0 and Cu2(OH)2^2+ -10.36; Fe(III) -2.19, -5.67, -21.6 (n = 4), Fe2(OH)2^4+ -2.95 [values from memory: Mg, Mn, Zn and Fe medium-high, Cu medium]; log beta = log *K + n pKw with pKw = 13.995 (IAPWS R11-07) [D]; solid Mn(OH)2 (pyrochroite), Mn(OH)2(s) + 2 H+ = Mn^2+ + 2 H2O, log *K 15.2 [from memory, medium confidence]",
    cmn1968 = "A. Chughtai, R. Marshall, G. H. Nancollas, 'Complexes in calcium phosphate solutions', J. Phys. Chem. 72, 208-211 (1968): 25 C, I = 0: CaHPO4 2.739, CaH2PO4+ 1.408, CaPO4- 6.459 [values from memory, medium-high confidence]",
    mgphos = "MgHPO4 log K 2.87 at 25 C, I = 0, as selected in A. E. Martell, R. M. Smith, Critical Stability Constants [value from memory, medium confidence]",
    pb1982 = "L. N. Plummer, E. Busenberg, Geochim. Cosmochim. Acta 46, 1011-1040 (1982): log K(CaHCO3+) = 1209.120 + 0.31294 T - 34765.05/T - 478.782 log10 T; log K(CaCO3 aq) = -1228.732 - 0.299444 T + 35512.75/T + 485.818 log10 T, 0-90 C [equations from memory, medium-high confidence: they give the accepted 1.106 and 3.224 at 25 C]",
    sh1977 = "R. M. Siebert, P. B. Hostetler, 'The stability of the magnesium bicarbonate ion pair from 10 to 90 C' and '... magnesium carbonate ion pair', Am. J. Sci. 277, 697 and 716 (1977): MgHCO3+ log K 1.07, MgCO3 2.98 at 25 C, I = 0 [values from memory, medium confidence]",
    childs1970 = "C. W. Childs, 'A potentiometric study of equilibria in aqueous divalent metal orthophosphate solutions', Inorg. Chem. 9, 2465-2469 (1970): 25 C, I = 0: MgH2PO4+ 1.513, MgPO4- 6.589 [values and title from memory, medium confidence]",
    ms_cit_mg = "A. E. Martell, R. M. Smith, Critical Stability Constants vol. 3 (1977) / NIST SRD 46, citrate at 25 C, I = 0.1 mol/L: MgCit- 3.37, MgHCit 1.92, CaHCit 2.10 [values from memory, low-medium confidence]",
    ms_gly = "A. E. Martell, R. M. Smith, Critical Stability Constants vol. 1: Amino Acids (1974) / NIST SRD 46, glycinate at 25 C, I = 0.1 mol/L: Cu^2+ log beta1 8.15, beta2 15.03; Zn^2+ log beta1 4.96, beta2 9.19 [values from memory: Cu medium, Zn low-medium confidence]",
    sulfpairs = "CaSO4 log K 2.30 (R. P. Bell, J. H. B. George, Trans. Faraday Soc. 49, 619 (1953)) and MgSO4 2.23 at 25 C, I = 0, as selected in Martell & Smith [values from memory, medium confidence]",
    powell2007 = "K. J. Powell, P. L. Brown, R. H. Byrne, T. Gajda, G. Hefter, S. Sjoberg, H. Wanner, 'Chemical speciation of environmentally significant metals with inorganic ligands. Part 2: The Cu2+-OH-, Cl-, CO32-, SO42-, and PO43- systems (IUPAC Technical Report)', Pure Appl. Chem. 79, 895-950 (2007) [title seen]: 25 C, I = 0: log *K of CuO(s) (tenorite) 7.64, Cu(OH)2(s) 8.67 [values from memory, medium confidence]",
    powell2013 = "K. J. Powell et al., 'Chemical speciation of environmentally significant metals with inorganic ligands. Part 5: The Zn2+ + OH-, Cl-, CO32-, SO42-, and PO43- systems (IUPAC Technical Report)', Pure Appl. Chem. 85, 2249-2311 (2013): 25 C, I = 0: log *K of ZnO(s) (zincite) 11.12 (C. F. Baes, R. E. Mesmer 1976: 11.14), epsilon-Zn(OH)2(s) 11.38 [values from memory: ZnO medium, Zn(OH)2 low-medium confidence]",
    nordstrom1990 = "D. K. Nordstrom et al., 'Revised chemical equilibrium data for major water-mineral reactions and their limitations', ACS Symp. Ser. 416, 398-413 (1990): Fe(OH)3 (amorphous, ferrihydrite) log *K 4.891 at 25 C, I = 0 [value from memory, medium confidence]; published values for ferrihydrite span about 3 to 5, with the age and crystallinity of the solid",
  },
  size_source = "kielland1937",
  species = {
    { "Mn^2+", size = 6 }, { "Zn^2+", size = 6 }, { "Cu^2+", size = 6 }, { "Fe^3+", size = 9 },
    { "CaOH+" }, { "MgOH+" }, { "MnOH+" },
    { "ZnOH+" }, { "Zn(OH)2(aq)", formula = "Zn(OH)2" }, { "Zn(OH)3-" }, { "Zn(OH)4^2-" },
    { "CuOH+" }, { "Cu2(OH)2^2+" },
    { "FeOH^2+" }, { "Fe(OH)2+" }, { "Fe(OH)4-" }, { "Fe2(OH)2^4+" },
    { "CuCl+" }, { "FeCl^2+" }, { "FeCl2+" },
    { "ZnCl+" }, { "ZnCl2(aq)", formula = "ZnCl2" }, { "ZnCl3-" }, { "ZnCl4^2-" },
    { "CaCH3COO+" }, { "MgCH3COO+" }, { "MnCH3COO+" }, { "ZnCH3COO+" }, { "CuCH3COO+" },
    { "Cu(CH3COO)2(aq)", formula = "Cu(CH3COO)2" },
    { "Cu(NH3)^2+" }, { "Cu(NH3)2^2+" }, { "Cu(NH3)3^2+" }, { "Cu(NH3)4^2+" },
    { "Zn(NH3)^2+" }, { "Zn(NH3)2^2+" }, { "Zn(NH3)3^2+" }, { "Zn(NH3)4^2+" },
    { "CaHPO4(aq)", formula = "CaHPO4" }, { "CaH2PO4+" }, { "CaPO4-" },
    { "MgHPO4(aq)", formula = "MgHPO4" }, { "MgH2PO4+" }, { "MgPO4-" },
    { "CaHCO3+" }, { "CaCO3(aq)", formula = "CaCO3" },
    { "MgHCO3+" }, { "MgCO3(aq)", formula = "MgCO3" },
    { "CaSO4(aq)", formula = "CaSO4" }, { "MgSO4(aq)", formula = "MgSO4" },
    { "CaCit-", formula = "C6H5CaO7-" },
    { "CaSucc(aq)", formula = "C4H4CaO4" },
    { "MgCit-", formula = "C6H5MgO7-" }, { "MgHCit(aq)", formula = "C6H6MgO7" },
    { "CaHCit(aq)", formula = "C6H6CaO7" },
    { "CuGly+", formula = "C2H4CuNO2+" }, { "Cu(Gly)2(aq)", formula = "C4H8CuN2O4" },
    { "ZnGly+", formula = "C2H4NO2Zn+" }, { "Zn(Gly)2(aq)", formula = "C4H8N2O4Zn" },
  },
  reactions = {
    -- hydroxide
    { "CaOH+", from = { ["Ca^2+"] = 1, ["OH-"] = 1 }, logK = 1.30, source = "gimblett1954" },
    { "MgOH+", from = { ["Mg^2+"] = 1, ["OH-"] = 1 }, logK = -11.44 + 13.995, source = "baes1976" },
    { "MnOH+", from = { ["Mn^2+"] = 1, ["OH-"] = 1 }, logK = -10.59 + 13.995, source = "baes1976" },
    { "ZnOH+", from = { ["Zn^2+"] = 1, ["OH-"] = 1 }, logK = -8.96 + 13.995, source = "baes1976" },
    { "Zn(OH)2(aq)", from = { ["Zn^2+"] = 1, ["OH-"] = 2 }, logK = -16.9 + 2 * 13.995,
      source = "baes1976" },
    { "Zn(OH)3-", from = { ["Zn^2+"] = 1, ["OH-"] = 3 }, logK = -28.4 + 3 * 13.995,
      source = "baes1976" },
    { "Zn(OH)4^2-", from = { ["Zn^2+"] = 1, ["OH-"] = 4 }, logK = -40.5 + 4 * 13.995,
      source = "baes1976" },
    { "CuOH+", from = { ["Cu^2+"] = 1, ["OH-"] = 1 }, logK = -8.0 + 13.995, source = "baes1976" },
    { "Cu2(OH)2^2+", from = { ["Cu^2+"] = 2, ["OH-"] = 2 }, logK = -10.36 + 2 * 13.995,
      source = "baes1976" },
    { "FeOH^2+", from = { ["Fe^3+"] = 1, ["OH-"] = 1 }, logK = -2.19 + 13.995, source = "baes1976" },
    { "Fe(OH)2+", from = { ["Fe^3+"] = 1, ["OH-"] = 2 }, logK = -5.67 + 2 * 13.995,
      source = "baes1976" },
    { "Fe(OH)4-", from = { ["Fe^3+"] = 1, ["OH-"] = 4 }, logK = -21.6 + 4 * 13.995,
      source = "baes1976" },
    { "Fe2(OH)2^4+", from = { ["Fe^3+"] = 2, ["OH-"] = 2 }, logK = -2.95 + 2 * 13.995,
      source = "baes1976" },
    -- chloride (stepwise K of the source summed to overall beta)
    { "CuCl+", from = { ["Cu^2+"] = 1, ["Cl-"] = 1 }, logK = 0.40, source = "ms1976" },
    { "FeCl^2+", from = { ["Fe^3+"] = 1, ["Cl-"] = 1 }, logK = 1.48, source = "ms1976" },
    { "FeCl2+", from = { ["Fe^3+"] = 1, ["Cl-"] = 2 }, logK = 1.48 + 0.65, source = "ms1976" },
    { "ZnCl+", from = { ["Zn^2+"] = 1, ["Cl-"] = 1 }, logK = 0.43, source = "ms1976" },
    { "ZnCl2(aq)", from = { ["Zn^2+"] = 1, ["Cl-"] = 2 }, logK = 0.43 + 0.18, source = "ms1976" },
    { "ZnCl3-", from = { ["Zn^2+"] = 1, ["Cl-"] = 3 }, logK = 0.43 + 0.18 - 0.11,
      source = "ms1976" },
    { "ZnCl4^2-", from = { ["Zn^2+"] = 1, ["Cl-"] = 4 }, logK = 0.43 + 0.18 - 0.11 - 0.3,
      source = "ms1976" },
    -- acetate
    { "CaCH3COO+", from = { ["Ca^2+"] = 1, ["CH3COO-"] = 1 }, logK = 1.18, source = "ms1976" },
    { "MgCH3COO+", from = { ["Mg^2+"] = 1, ["CH3COO-"] = 1 }, logK = 1.27, source = "ms1976" },
    { "MnCH3COO+", from = { ["Mn^2+"] = 1, ["CH3COO-"] = 1 }, logK = 1.40, source = "ms1976" },
    { "ZnCH3COO+", from = { ["Zn^2+"] = 1, ["CH3COO-"] = 1 }, logK = 1.57, source = "ms1976" },
    { "CuCH3COO+", from = { ["Cu^2+"] = 1, ["CH3COO-"] = 1 }, logK = 2.22, source = "ms1976" },
    { "Cu(CH3COO)2(aq)", from = { ["Cu^2+"] = 1, ["CH3COO-"] = 2 }, logK = 2.22 + 1.41,
      source = "ms1976" },
    -- ammonia
    { "Cu(NH3)^2+", from = { ["Cu^2+"] = 1, NH3 = 1 }, logK = 4.04, source = "ms1976" },
    { "Cu(NH3)2^2+", from = { ["Cu^2+"] = 1, NH3 = 2 }, logK = 4.04 + 3.43, source = "ms1976" },
    { "Cu(NH3)3^2+", from = { ["Cu^2+"] = 1, NH3 = 3 }, logK = 4.04 + 3.43 + 2.80,
      source = "ms1976" },
    { "Cu(NH3)4^2+", from = { ["Cu^2+"] = 1, NH3 = 4 }, logK = 4.04 + 3.43 + 2.80 + 1.48,
      source = "ms1976" },
    { "Zn(NH3)^2+", from = { ["Zn^2+"] = 1, NH3 = 1 }, logK = 2.21, source = "ms1976" },
    { "Zn(NH3)2^2+", from = { ["Zn^2+"] = 1, NH3 = 2 }, logK = 2.21 + 2.29, source = "ms1976" },
    { "Zn(NH3)3^2+", from = { ["Zn^2+"] = 1, NH3 = 3 }, logK = 2.21 + 2.29 + 2.36,
      source = "ms1976" },
    { "Zn(NH3)4^2+", from = { ["Zn^2+"] = 1, NH3 = 4 }, logK = 2.21 + 2.29 + 2.36 + 2.03,
      source = "ms1976" },
    -- phosphate
    { "CaHPO4(aq)", from = { ["Ca^2+"] = 1, ["HPO4^2-"] = 1 }, logK = 2.739, source = "cmn1968" },
    { "CaH2PO4+", from = { ["Ca^2+"] = 1, ["H2PO4-"] = 1 }, logK = 1.408, source = "cmn1968" },
    { "CaPO4-", from = { ["Ca^2+"] = 1, ["PO4^3-"] = 1 }, logK = 6.459, source = "cmn1968" },
    { "MgHPO4(aq)", from = { ["Mg^2+"] = 1, ["HPO4^2-"] = 1 }, logK = 2.87, source = "mgphos" },
    { "MgH2PO4+", from = { ["Mg^2+"] = 1, ["H2PO4-"] = 1 }, logK = 1.513, source = "childs1970" },
    { "MgPO4-", from = { ["Mg^2+"] = 1, ["PO4^3-"] = 1 }, logK = 6.589, source = "childs1970" },
    -- carbonate (log10 T written as ln T / ln 10)
    { "CaHCO3+", from = { ["Ca^2+"] = 1, ["HCO3-"] = 1 }, logK = 1.106, source = "pb1982",
      logK_T = { a = 1209.120, b = 0.31294, c = -34765.05, d = -478.782 / L10 },
      T_range = { 273.15, 363.15 } },
    { "CaCO3(aq)", from = { ["Ca^2+"] = 1, ["CO3^2-"] = 1 }, logK = 3.224, source = "pb1982",
      logK_T = { a = -1228.732, b = -0.299444, c = 35512.75, d = 485.818 / L10 },
      T_range = { 273.15, 363.15 } },
    { "MgHCO3+", from = { ["Mg^2+"] = 1, ["HCO3-"] = 1 }, logK = 1.07, source = "sh1977" },
    { "MgCO3(aq)", from = { ["Mg^2+"] = 1, ["CO3^2-"] = 1 }, logK = 2.98, source = "sh1977" },
    -- sulfate
    { "CaSO4(aq)", from = { ["Ca^2+"] = 1, ["SO4^2-"] = 1 }, logK = 2.30, source = "sulfpairs" },
    { "MgSO4(aq)", from = { ["Mg^2+"] = 1, ["SO4^2-"] = 1 }, logK = 2.23, source = "sulfpairs" },
    -- citrate and succinate, published at I = 0.1 mol/L
    { "CaCit-", from = { ["Ca^2+"] = 1, ["Cit^3-"] = 1 }, logK = I0(3.45, 4 + 9 - 1),
      source = "ms1974ca", measured = at_I01,
      note = "log K 3.45 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "CaSucc(aq)", from = { ["Ca^2+"] = 1, ["Succ^2-"] = 1 }, logK = I0(1.25, 4 + 4),
      source = "ms1974ca", measured = at_I01,
      note = "log K 1.25 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "MgCit-", from = { ["Mg^2+"] = 1, ["Cit^3-"] = 1 }, logK = I0(3.37, 4 + 9 - 1),
      source = "ms_cit_mg", measured = at_I01,
      note = "log K 3.37 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "MgHCit(aq)", from = { ["Mg^2+"] = 1, ["HCit^2-"] = 1 }, logK = I0(1.92, 4 + 4),
      source = "ms_cit_mg", measured = at_I01,
      note = "log K 1.92 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "CaHCit(aq)", from = { ["Ca^2+"] = 1, ["HCit^2-"] = 1 }, logK = I0(2.10, 4 + 4),
      source = "ms_cit_mg", measured = at_I01,
      note = "log K 2.10 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    -- glycinate, published at I = 0.1 mol/L (overall beta)
    { "CuGly+", from = { ["Cu^2+"] = 1, ["Gly-"] = 1 }, logK = I0(8.15, 4 + 1 - 1),
      source = "ms_gly", measured = at_I01,
      note = "log beta1 8.15 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "Cu(Gly)2(aq)", from = { ["Cu^2+"] = 1, ["Gly-"] = 2 }, logK = I0(15.03, 4 + 2),
      source = "ms_gly", measured = at_I01,
      note = "log beta2 15.03 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "ZnGly+", from = { ["Zn^2+"] = 1, ["Gly-"] = 1 }, logK = I0(4.96, 4 + 1 - 1),
      source = "ms_gly", measured = at_I01,
      note = "log beta1 4.96 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "Zn(Gly)2(aq)", from = { ["Zn^2+"] = 1, ["Gly-"] = 2 }, logK = I0(9.19, 4 + 2),
      source = "ms_gly", measured = at_I01,
      note = "log beta2 9.19 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
  },
  reagents = {
    { "Ca(OH)2", gives = { ["Ca^2+"] = 1, ["OH-"] = 2 }, names = { "calcium hydroxide",
      "slaked lime" }, hazards = { "skin-irritation", "eye-damage", "organ-toxic-single" },
      note = "soluble to about 20 mmol/kg at 25 C; more stays undissolved in practice" },
    { "MgSO4", gives = { ["Mg^2+"] = 1, ["SO4^2-"] = 1 }, names = { "magnesium sulfate" },
      hydrates = { 7 } },
    { "Ca(NO3)2", gives = { ["Ca^2+"] = 1, ["NO3-"] = 2 }, names = { "calcium nitrate" },
      hydrates = { 4 }, hazards = { "oxidizing-solid", "toxic-oral", "eye-damage" } },
    { "Mg(CH3COO)2", gives = { ["Mg^2+"] = 1, ["CH3COO-"] = 2 }, names = { "magnesium acetate" },
      hydrates = { 4 } },
    { "MnCl2", gives = { ["Mn^2+"] = 1, ["Cl-"] = 2 }, names = { "manganese(II) chloride",
      "manganese chloride" }, hydrates = { 4 }, hazards = { "toxic-oral", "eye-damage", "organ-toxic-repeated", "aquatic-chronic" } },
    { "MnSO4", gives = { ["Mn^2+"] = 1, ["SO4^2-"] = 1 }, names = { "manganese(II) sulfate" },
      hydrates = { 1 }, hazards = { "organ-toxic-repeated", "aquatic-chronic" } },
    { "ZnCl2", gives = { ["Zn^2+"] = 1, ["Cl-"] = 2 }, names = { "zinc chloride" },
      hazards = { "toxic-oral", "skin-corrosion", "eye-damage", "aquatic-acute", "aquatic-chronic" } },
    { "ZnSO4", gives = { ["Zn^2+"] = 1, ["SO4^2-"] = 1 }, names = { "zinc sulfate" },
      hydrates = { 1, 7 }, hazards = { "toxic-oral", "eye-damage", "aquatic-acute", "aquatic-chronic" } },
    { "CuSO4", gives = { ["Cu^2+"] = 1, ["SO4^2-"] = 1 }, names = { "copper(II) sulfate",
      "copper sulfate" }, hydrates = { 5 }, hazards = { "toxic-oral", "skin-irritation", "eye-irritation", "aquatic-acute", "aquatic-chronic" } },
    { "CuCl2", gives = { ["Cu^2+"] = 1, ["Cl-"] = 2 }, names = { "copper(II) chloride" },
      hydrates = { 2 }, hazards = { "toxic-oral", "skin-irritation", "eye-damage", "aquatic-acute", "aquatic-chronic" } },
    { "FeCl3", gives = { ["Fe^3+"] = 1, ["Cl-"] = 3 }, names = { "iron(III) chloride",
      "ferric chloride" }, hydrates = { 6 }, hazards = { "toxic-oral", "skin-irritation", "eye-damage", "metal-corrosive" } },
    { "Fe(NO3)3", gives = { ["Fe^3+"] = 1, ["NO3-"] = 3 }, names = { "iron(III) nitrate",
      "ferric nitrate" }, hydrates = { 9 }, hazards = { "oxidizing-solid", "skin-irritation", "eye-irritation" } },
  },
  solids = {
    { "pyrochroite", formula = "Mn(OH)2", dissolves = { ["Mn^2+"] = 1, ["OH-"] = 2 },
      logKsp = 15.2 - 2 * 13.995, source = "baes1976",
      note = "log *K 15.2 [from memory, medium confidence]; 25 C only" },
    { "zincite", formula = "ZnO", dissolves = { ["Zn^2+"] = 1, ["OH-"] = 2, H2O = -1 },
      logKsp = 11.12 - 2 * 13.995, source = "powell2013", note = "25 C only" },
    { "zinc hydroxide", formula = "Zn(OH)2", dissolves = { ["Zn^2+"] = 1, ["OH-"] = 2 },
      logKsp = 11.38 - 2 * 13.995, source = "powell2013",
      note = "epsilon-Zn(OH)2, the crystalline hydroxide; fresh precipitates are more soluble; 25 C only" },
    { "tenorite", formula = "CuO", dissolves = { ["Cu^2+"] = 1, ["OH-"] = 2, H2O = -1 },
      logKsp = 7.64 - 2 * 13.995, source = "powell2007", note = "25 C only" },
    { "copper(II) hydroxide", formula = "Cu(OH)2", dissolves = { ["Cu^2+"] = 1, ["OH-"] = 2 },
      logKsp = 8.67 - 2 * 13.995, source = "powell2007",
      note = "metastable with respect to tenorite; 25 C only" },
    { "ferrihydrite", formula = "Fe(OH)3", dissolves = { ["Fe^3+"] = 1, ["OH-"] = 3 },
      logKsp = 4.891 - 3 * 13.995, source = "nordstrom1990",
      note = "the amorphous iron(III) hydroxide that forms first; 25 C only" },
  },
}
