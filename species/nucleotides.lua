-- ATP and ADP: their protonation, their magnesium and calcium complexes, and
-- the salts a lab buys.
--
-- Names: the fully deprotonated nucleotide carries its charge ("ATP^4-",
-- "ADP^3-"), protonated forms prefix H ("HATP^3-", "H2ATP^2-"), a complex puts
-- the metal first ("MgATP^2-", "MgHATP-", "Mg2ATP(aq)", "CaADP-").
--
-- Only the two protonations that matter above pH 3 are here (phosphate, then
-- the adenine N1): below about pH 3 results are not valid. Na+ and K+ bind
-- ATP^4- weakly (log K near 1); those pairs are left out, as in metals.lua.
-- The Ca^2+ constants were published for I = 0.1 mol/L and are converted to
-- I = 0 with the Davies equation (docs/methods.md, "Constants at I = 0").
-- No enthalpies are recorded: away from 25 C the constants are used at their
-- 25 C value and the result says so. ATP hydrolyses slowly in solution,
-- faster in acid, warm, and with divalent metal ions: this describes a fresh
-- solution.
local A, I = 0.5108, 0.1                    -- Davies A at 25 C (molal scale)
local f = math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I
-- formation log K at I = 0 from I = 0.1; dz2 = sum z^2 reactants - products
local function I0(logK, dz2) return logK + A * f * dz2 end

return {
  system = "nucleotides",
  measured = { I = 0, t = 25 },             -- every entry, unless it says otherwise
  sources = {
    alberty2003 = "R. A. Alberty, Thermodynamics of Biochemical Reactions, Wiley-Interscience, Hoboken (2003), Table 1.2 'Equilibrium constants in the ATP series at 298.15 K', pK at I = 0 [seen]: HATP3- 7.60, H2ATP2- 4.68, MgATP2- 6.18, MgHATP- 3.63, Mg2ATP 2.69 (Mg2+ + MgATP2-); HADP2- 7.18, H2ADP- 4.36, MgADP- 4.65, MgHADP 2.50 (dissociation pK, equal to the log K of formation)",
    ms_atp_ca = "A. E. Martell, R. M. Smith, Critical Stability Constants vol. 2: Amines (nucleotides), Plenum, New York (1975) / NIST SRD 46, Ca^2+ at 25 C, I = 0.1 mol/L: log K CaATP 3.91, CaADP 2.82 [values from memory, low-medium confidence]",
  },
  species = {
    { "H2ATP^2-", formula = "C10H14N5O13P3^2-" }, { "HATP^3-", formula = "C10H13N5O13P3^3-" },
    { "ATP^4-", formula = "C10H12N5O13P3^4-" },
    { "MgATP^2-", formula = "C10H12MgN5O13P3^2-" }, { "MgHATP-", formula = "C10H13MgN5O13P3-" },
    { "Mg2ATP(aq)", formula = "C10H12Mg2N5O13P3" }, { "CaATP^2-", formula = "C10H12CaN5O13P3^2-" },
    { "H2ADP-", formula = "C10H13N5O10P2-" }, { "HADP^2-", formula = "C10H12N5O10P2^2-" },
    { "ADP^3-", formula = "C10H11N5O10P2^3-" },
    { "MgADP-", formula = "C10H11MgN5O10P2-" }, { "MgHADP(aq)", formula = "C10H12MgN5O10P2" },
    { "CaADP-", formula = "C10H11CaN5O10P2-" },
  },
  acids = {
    { "H2ATP^2-", "HATP^3-", "ATP^4-", pKa = { 4.68, 7.60 }, source = "alberty2003" },
    { "H2ADP-", "HADP^2-", "ADP^3-", pKa = { 4.36, 7.18 }, source = "alberty2003" },
  },
  reactions = {
    { "MgATP^2-", from = { ["Mg^2+"] = 1, ["ATP^4-"] = 1 }, logK = 6.18, source = "alberty2003" },
    { "MgHATP-", from = { ["Mg^2+"] = 1, ["HATP^3-"] = 1 }, logK = 3.63, source = "alberty2003" },
    { "Mg2ATP(aq)", from = { ["Mg^2+"] = 1, ["MgATP^2-"] = 1 }, logK = 2.69, source = "alberty2003" },
    { "MgADP-", from = { ["Mg^2+"] = 1, ["ADP^3-"] = 1 }, logK = 4.65, source = "alberty2003" },
    { "MgHADP(aq)", from = { ["Mg^2+"] = 1, ["HADP^2-"] = 1 }, logK = 2.50, source = "alberty2003" },
    { "CaATP^2-", from = { ["Ca^2+"] = 1, ["ATP^4-"] = 1 }, logK = I0(3.91, 4 + 16 - 4),
      source = "ms_atp_ca", measured = { I = 0.1, t = 25, to_I0 = "davies" },
      note = "log K 3.91 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
    { "CaADP-", from = { ["Ca^2+"] = 1, ["ADP^3-"] = 1 }, logK = I0(2.82, 4 + 9 - 1),
      source = "ms_atp_ca", measured = { I = 0.1, t = 25, to_I0 = "davies" },
      note = "log K 2.82 at 25 C, I = 0.1 mol/L; Davies to I = 0" },
  },
  reagents = {
    -- ATP as sold: the disodium salt Na2H2ATP, usually a hydrate of about 3 H2O
    -- (the label gives the water content of the lot)
    { "Na2ATP", formula = "C10H14N5Na2O13P3", gives = { ["Na+"] = 2, ["H2ATP^2-"] = 1 },
      names = { "Na2H2ATP", "ATP disodium salt", "disodium ATP", "adenosine 5'-triphosphate disodium salt" },
      hydrates = { 3 }, note = "dissolves to an acid solution (pH near 3.5); neutralize with NaOH or Tris. Below about pH 3 results are not valid: the further protonations of ATP are not in the library" },
    { "Na2HADP", formula = "C10H12N5Na2O10P2", gives = { ["Na+"] = 2, ["HADP^2-"] = 1 },
      names = { "ADP disodium salt", "disodium ADP" } },
    { "KH2ADP", formula = "C10H13KN5O10P2", gives = { ["K+"] = 1, ["H2ADP-"] = 1 },
      names = { "ADP monopotassium salt", "ADP potassium salt" }, hydrates = { 2 } },
  },
}
