-- The buffer catalogue, the metal complexes, the chelators and the gases
-- checked against values from outside the project. Each check names its
-- source; "[from memory]" marks a value recalled, not re-read. The reference
-- values are computed here from the published numbers (an independent van't
-- Hoff and pK(T) implementation), never taken from the engine.
local fails, n = 0, 0
local function check(what, got, ref, tol, src)
  n = n + 1
  local ok = math.abs(got - ref) <= tol
  if not ok then fails = fails + 1 end
  print(string.format("%s %-46s %10.4f  ref %10.4f  diff %+.4f  (%s)", ok and "ok  " or "FAIL",
                      what, got, ref, got - ref, src))
end

-- 1. pK at 25 and 37 C ----------------------------------------------------
local R, LN10, TH = 8.314462, math.log(10), 298.15
-- integrated van't Hoff with constant dCp (Goldberg et al. 2002, eq. 4)
local function vant_hoff(pK, dH, dCp, T)
  dH, dCp = dH * 1000, dCp or 0
  return pK + dH / (R * LN10) * (1 / T - 1 / TH) - dCp / (R * LN10) * (TH / T - 1 + math.log(T / TH))
end
-- the form of the emf papers: pK = A/T + B + C ln T
local function roy(A, B, C, T) return A / T + B + C * math.log(T) end

-- the engine's pK, read exactly: ideal activities, pK = pH - log10(m(base)/m(acid))
local function engine_pK(acid, base, adds, t)
  local s = eq.solution{ water = "1 kg", temperature = t, activity = "ideal" }
  for _, a in ipairs(adds) do s:add(a[1], a[2]) end
  local r = s:equilibrate()
  return r.pH - math.log(r:molality(base) / r:molality(acid), 10)
end
local half_base = function(reagent) return { { reagent, "10 mmol" }, { "NaOH", "5 mmol" } } end
local half_acid = function(reagent) return { { reagent, "10 mmol" }, { "HCl", "5 mmol" } } end

-- pK(T) functions of the emf papers (abstracts seen; see the species files)
local roy_sets = {
  { "ACES", "ACES", "ACES-", half_base("ACES"), 2548.60, -20.03159, 3.2172, "Roy et al. 1997, J. Chem. Eng. Data 42, 41" },
  { "CHES", "CHES", "CHES-", half_base("CHES"), 1917.66, 5.7940, -0.4971, "Roy et al. 1997, J. Chem. Eng. Data 42, 41" },
  { "EPPS", "EPPS", "EPPS-", half_base("EPPS"), 359.23, 21.0324, -2.50647, "Roy et al. 1997, J. Chem. Thermodyn. 29, 1323" },
  { "MOPSO", "MOPSO", "MOPSO-", half_base("MOPSO"), 432.25, 22.99923, -3.08415, "Roy et al. 1997, J. Chem. Thermodyn. 29, 1323" },
  { "TAPSO", "TAPSO", "TAPSO-", half_base("TAPSO"), 2254.0057, -4.9783, 0.88672, "Roy et al. 1997, J. Chem. Eng. Data 42, 446" },
  { "CAPS", "CAPS", "CAPS-", half_base("CAPS"), 1046.64, 35.10191, -4.9342, "Roy et al. 1997, J. Chem. Thermodyn. 29, 749" },
  { "CAPSO", "CAPSO", "CAPSO-", half_base("CAPSO"), 2106.21, 9.08772, -1.11049, "Roy et al. 1997, J. Chem. Thermodyn. 29, 749" },
  { "TAPS", "TAPS", "TAPS-", half_base("TAPS"), 2969.61, -17.05052, 2.73697, "Roy et al. 2006, J. Chem. Thermodyn. 38, 413" },
  { "POPSO", "HPOPSO-", "POPSO^2-", { { "POPSO", "10 mmol" }, { "NaOH", "15 mmol" } },
    -1041.77, 51.0459, -6.97646, "Roy et al. 2014, J. Biophys. Chem. 5, 143" },
  { "Bis-Tris", "BisTrisH+", "BisTris", half_acid("BisTris"), 921.66, 14.0007, -1.86197, "Roy et al. 2014, J. Biophys. Chem. 5, 118" },
}
for _, b in ipairs(roy_sets) do
  for _, t in ipairs{ 25, 37 } do
    check(b[1] .. " pK at " .. t .. " C", engine_pK(b[2], b[3], b[4], t),
          roy(b[5], b[6], b[7], t + 273.15), 0.002, b[8])
  end
end

-- pK, dH (kJ/mol), dCp (J/(K mol)) at 25 C: Goldberg, Kishore & Lennen 2002
-- [from memory] unless said; the engine must reproduce their van't Hoff
local vh_sets = {
  { "ADA pK3", "HADA-", "ADA^2-", { { "ADA", "10 mmol" }, { "NaOH", "15 mmol" } }, 6.844, 12.23, 0, "Goldberg 2002 p. 242 [seen]" },
  { "PIPES pK2", "HPIPES-", "PIPES^2-", { { "PIPES", "10 mmol" }, { "NaOH", "15 mmol" } }, 7.141, 11.2, 22, "Goldberg 2002" },
  { "BES", "BES", "BES-", half_base("BES"), 7.187, 24.25, 0, "Vega & Bates 1976; dH Goldberg 2002" },
  { "TES", "TES", "TES-", half_base("TES"), 7.550, 32.13, 0, "Vega & Bates 1976; dH Goldberg 2002" },
  { "HEPPSO", "HEPPSO", "HEPPSO-", half_base("HEPPSO"), 8.042, 24.5, 0, "Roy et al. 1998 (dH derived)" },
  { "Tricine", "Tricine", "Tricine-", half_base("Tricine"), 8.135, 31.37, -53, "Goldberg 2002" },
  { "Bicine", "Bicine", "Bicine-", half_base("Bicine"), 8.333, 26.34, 0, "Roy et al. 2006; dH Goldberg 2002" },
  { "glycylglycine pK2", "GlyGly", "GlyGly-", half_base("GlyGly"), 8.265, 43.4, -16, "Goldberg 2002" },
  { "ethanolamine", "EthanolamineH+", "Ethanolamine", half_acid("Ethanolamine"), 9.498, 50.52, 26, "Goldberg 2002" },
  { "triethanolamine", "TEAH+", "TEA", half_acid("TEA"), 7.762, 33.6, 50, "Goldberg 2002" },
  { "ammonium", "NH4+", "NH3", half_acid("NH3"), 9.245, 51.95, 8, "Goldberg 2002" },
  { "formic acid", "HCOOH", "HCOO-", half_base("HCOOH"), 3.745, -0.1, -165, "Goldberg 2002" },
  { "succinic pK2", "HSucc-", "Succ^2-", { { "H2Succ", "10 mmol" }, { "NaOH", "15 mmol" } }, 5.636, -0.5, -217, "Goldberg 2002" },
  { "hydrogen sulfate", "HSO4-", "SO4^2-", { { "NaHSO4", "10 mmol" }, { "NaOH", "5 mmol" } }, 1.987, -22.4, -258, "Goldberg 2002" },
  { "boric acid", "B(OH)3", "B(OH)4-", half_base("H3BO3"), 9.237, 13.8, -240, "Goldberg 2002; sign as Manov et al. 1944" },
  { "malic pK1", "H2Mal", "HMal-", half_base("H2Mal"), 3.458, 2.95, -155, "Eden & Bates 1959 (dH, dCp derived)" },
  { "malic pK2", "HMal-", "Mal^2-", { { "H2Mal", "10 mmol" }, { "NaOH", "15 mmol" } }, 5.097, -1.2, -221, "Martell & Smith; dH, dCp from Eden & Bates 1959" },
  { "DIPSO", "DIPSO", "DIPSO-", half_base("DIPSO"), 7.576, 30.18, 0, "Goldberg 2002 [from memory, low-medium]" },
  { "Bis-Tris propane pK1", "BTPH2^2+", "BTPH+", { { "BTP", "10 mmol" }, { "HCl", "15 mmol" } }, 6.65, 28.4, 0, "Goldberg 2002 [from memory, low-medium]" },
  { "Bis-Tris propane pK2", "BTPH+", "BTP", half_acid("BTP"), 9.10, 31.3, 0, "Goldberg 2002 [from memory, low-medium]" },
}
for _, b in ipairs(vh_sets) do
  for _, t in ipairs{ 25, 37 } do
    check(b[1] .. " pK at " .. t .. " C", engine_pK(b[2], b[3], b[4], t),
          vant_hoff(b[5], b[6], b[7], t + 273.15), 0.002, b[8])
  end
end

-- the same pK against a second, independent measurement at 37 C
local cross = {
  { "HEPPSO pK at 37 C", "HEPPSO", "HEPPSO-", half_base("HEPPSO"), 7.876, "Roy et al. 1998, J. Solution Chem. 27, 425" },
  { "Bicine pK at 37 C", "Bicine", "Bicine-", half_base("Bicine"), 8.156, "Roy et al. 2006, J. Solution Chem. 35, 605" },
  { "TAPS pK at 37 C", "TAPS", "TAPS-", half_base("TAPS"), 8.225, "Roy et al. 2006, J. Chem. Thermodyn. 38, 413" },
  { "Bis-Tris pK at 37 C", "BisTrisH+", "BisTris", half_acid("BisTris"), 6.2906, "Roy et al. 2014, J. Biophys. Chem. 5, 118" },
  { "MOPS pK at 37 C", "MOPS", "MOPS-", half_base("MOPS"), 7.044, "Roy et al., J. Solution Chem. (MOPS, 5-55 C)" },
  { "boric acid pK at 0 C", "B(OH)3", "B(OH)4-", half_base("H3BO3"), 9.4997, "Manov, DeLollis & Acree 1944: 2237.94/T - 3.305 + 0.016883 T" },
}
for _, c in ipairs(cross) do
  local t = c[1]:find("0 C$") and 0 or 37
  check(c[1], engine_pK(c[2], c[3], c[4], t), c[5], 0.01, c[6])
end
-- malic pK1 at 0 and 50 C against the emf equation of M. Eden, R. G. Bates,
-- J. Res. NBS 62 (1959): -log K1 = 135x.85/T - 5.1382 + 0.013550 T, x
-- illegible in the copy seen (8 taken; 7 would lower it by 0.0034 at 0 C);
-- tolerance 0.01 covers that digit and constant dCp
for _, t in ipairs{ 0, 50 } do
  local Tk = t + 273.15
  check("malic pK1 at " .. t .. " C", engine_pK("H2Mal", "HMal-", half_base("H2Mal"), t),
        1358.85 / Tk - 5.1382 + 0.013550 * Tk, 0.01, "Eden & Bates 1959 [abstract seen]")
end

-- pK at 25 C of the ladders without temperature data (the engine's ideal pK
-- must be the published one; away from 25 C they carry a warning instead)
local pk25 = {
  { "pyrophosphate pK3", "H2P2O7^2-", "HP2O7^3-", { { "Na2H2P2O7", "10 mmol" }, { "NaOH", "5 mmol" } }, 6.72, "Martell & Smith vol. 4 [from memory]" },
  { "pyrophosphate pK4", "HP2O7^3-", "P2O7^4-", { { "Na4P2O7", "10 mmol" }, { "HCl", "5 mmol" } }, 9.46, "Martell & Smith vol. 4 [from memory]" },
  { "ATP pK (HATP3-)", "HATP^3-", "ATP^4-", { { "Na2ATP", "10 mmol" }, { "NaOH", "15 mmol" } }, 7.60, "Alberty 2003, Table 1.2 [seen]" },
  { "ATP pK (H2ATP2-)", "H2ATP^2-", "HATP^3-", { { "Na2ATP", "10 mmol" }, { "NaOH", "5 mmol" } }, 4.68, "Alberty 2003, Table 1.2 [seen]" },
  { "ADP pK (HADP2-)", "HADP^2-", "ADP^3-", { { "Na2HADP", "10 mmol" }, { "NaOH", "5 mmol" } }, 7.18, "Alberty 2003, Table 1.2 [seen]" },
  { "ADP pK (H2ADP-)", "H2ADP-", "HADP^2-", { { "KH2ADP", "10 mmol" }, { "NaOH", "5 mmol" } }, 4.36, "Alberty 2003, Table 1.2 [seen]" },
}
for _, b in ipairs(pk25) do
  check(b[1] .. " at 25 C", engine_pK(b[2], b[3], b[4], 25), b[5], 0.002, b[6])
end

-- 2. pH standards ------------------------------------------------------------
-- 0.01 mol/kg borax: R. G. Bates, J. Res. NBS 66A, 179 (1962); R. P. Buck et
-- al., Pure Appl. Chem. 74, 2169 (2002) [values from memory, high confidence]
local T = { 0, 5, 10, 15, 20, 25, 30, 35, 37, 40, 45, 50 }
local borax = { 9.464, 9.395, 9.332, 9.276, 9.225, 9.180, 9.139, 9.102, 9.088, 9.068, 9.038, 9.011 }
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("Na2B4O7.10H2O", "0.01 mol/kg")
for i, t in ipairs(T) do
  s:set_temperature(t)
  check("borax 0.01 mol/kg pH at " .. t .. " C", s:equilibrate().pH, borax[i], 0.02, "Bates 1962; Buck et al. 2002")
end
-- 0.05 mol/kg KHP: W. J. Hamer, G. D. Pinching, S. F. Acree, J. Res. NBS 36,
-- 47 (1946): pH = 1336.08/T - 5.2678 + 0.016069 T, T = t + 273.16 [seen]
s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KHP", "0.05 mol/kg")
for _, t in ipairs(T) do
  s:set_temperature(t)
  local Tk = t + 273.16
  check("KHP 0.05 mol/kg pH at " .. t .. " C", s:equilibrate().pH,
        1336.08 / Tk - 5.2678 + 0.016069 * Tk, 0.02, "Hamer, Pinching & Acree 1946")
end
-- saturated Ca(OH)2 (0.0203 mol/kg) at 25 C, pH 12.454: R. G. Bates, V. E.
-- Bower, E. R. Smith, J. Res. NBS 56, 305 (1956); Buck et al. 2002 [from memory]
s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("Ca(OH)2", "0.0203 mol/kg")
check("Ca(OH)2 0.0203 mol/kg pH at 25 C", s:equilibrate().pH, 12.454, 0.02, "Bates, Bower & Smith 1956")
-- saturated KH tartrate (0.0341 mol/kg) at 25 C, pH 3.557: Buck et al. 2002 [from memory]
s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KHTart", "0.0341 mol/kg")
check("KH tartrate 0.0341 mol/kg pH at 25 C", s:equilibrate().pH, 3.557, 0.02, "Buck et al. 2002")

-- 3. Ca-EGTA ------------------------------------------------------------------
-- 10 mM EGTA, 5 mM CaCl2, 0.1 M KCl, brought to pH 7.2 with KOH at 25 C.
s = eq.solution{ water = "1 kg", temperature = 25, activity = "davies" }
s:add("KCl", "0.1 mol/kg"):add("H4EGTA", "10 mmol"):add("CaCl2", "5 mmol")
s:adjust_pH(7.2, "KOH")
local r = s:equilibrate()
local ca, cal = r:molality("Ca^2+"), r:molality("CaEGTA^2-")
local kd = ca * (0.010 - cal) / cal
-- apparent Kd about 150 nM at pH 7.2, 0.1 M KCl, 20-25 C: R. Y. Tsien,
-- Biochemistry 19, 2396 (1980); S. M. Harrison, D. M. Bers, Biochim. Biophys.
-- Acta 925, 133 (1987) [from memory]; +-0.15 log units
check("Ca-EGTA apparent Kd at pH 7.2 (nM)", kd * 1e9, 150, 150 * (10 ^ 0.15 - 1),
      "Tsien 1980; Harrison & Bers 1987")
-- independent computation of free Ca^2+ from the cited constants (NIST SRD 46,
-- 25 C, I = 0.1 mol/L: pK 9.40, 8.79, 2.70, 2.00; log K CaL 10.86), moved to
-- the solution's ionic strength with Davies and solved here by hand
local A = 0.5108
local function fD(I) return math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I end
local dI = fD(r.ionic_strength) - fD(0.1)
local function at_I(logK, dz2) return logK - A * dz2 * dI end   -- formation constant
local h = r:molality("H+")
local K = { at_I(9.40, 16 + 1 - 9), at_I(8.79, 9 + 1 - 4), at_I(2.70, 4 + 1 - 1), at_I(2.00, 1 + 1 - 0) }
-- sum = 1 + h K1 + h^2 K1 K2 + ... over the protonated forms of EGTA
local sum, acc = 1, 0
for i = 1, 4 do acc = acc + K[i]; sum = sum + 10 ^ acc * h ^ i end
local Kc = 10 ^ at_I(10.86, 4 + 16 - 4) / sum      -- conditional constant, per mol/kg of EGTA'
-- Ca_T = Ca + CaL, L_T = L' + CaL, CaL = Kc Ca L'
local CaT, LT = 0.005, 0.010
local b = Kc * (LT - CaT) + 1
local cfree = (-b + math.sqrt(b * b + 4 * Kc * CaT)) / (2 * Kc)
check("free Ca^2+ vs hand computation (nM)", ca * 1e9, cfree * 1e9, cfree * 1e9 * 0.02,
      "NIST SRD 46 constants, Davies, solved here")

-- 3b. The fixed-free-Ca question with Davies activities: how much CaCl2 gives
-- 1 umol/kg of free Ca^2+ in 10 mmol/kg EGTA at pH 7.2 with 100 mmol/kg KCl,
-- the pH held with KOH, 25 C. The engine meets both targets in one solve; the
-- same equations are solved here by hand (fixed-point on the ionic strength),
-- from the cited constants: EGTA NIST SRD 46 at I = 0.1 (pK 9.40, 8.79, 2.70,
-- 2.00; log K CaL 10.86) taken to I = 0 with Davies as species/chelators.lua
-- says; CaOH+ log K 1.30 (Gimblett & Monk 1954); pKw 13.995 (IAPWS R11-07).
-- Davies A from its formula with the density of Kell (1975) and the
-- permittivity of Malmberg & Maryott (1956) at 25 C.
do
  local t = 25
  local rho = (999.83952 + 16.945176 * t - 7.9870401e-3 * t ^ 2 - 46.170461e-6 * t ^ 3
               + 105.56302e-9 * t ^ 4 - 280.54253e-12 * t ^ 5) / (1 + 16.879850e-3 * t) / 1000
  local eps = 87.740 - 0.40008 * t + 9.398e-4 * t ^ 2 - 1.410e-6 * t ^ 3
  local Ad = 1.82481e6 * math.sqrt(rho) * (eps * (t + 273.15)) ^ -1.5
  local fD01 = math.sqrt(0.1) / (1 + math.sqrt(0.1)) - 0.3 * 0.1
  local function K0(logK, dz2) return 10 ^ (logK + 0.5108 * fD01 * dz2) end  -- the file's conversion
  -- cumulative protonation constants of EGTA^4- at I = 0: beta_j for H_jL
  local steps = { K0(9.40, 16 + 1 - 9), K0(8.79, 9 + 1 - 4), K0(2.70, 4 + 1 - 1), K0(2.00, 1 + 1 - 0) }
  local beta, b = {}, 1
  for j = 1, 4 do b = b * steps[j]; beta[j] = b end
  local KCaL, KCaOH, Kw = K0(10.86, 4 + 16 - 4), 10 ^ 1.30, 10 ^ -13.995
  local aH, mCa, LT, KCl = 10 ^ -7.2, 1e-6, 0.010, 0.100
  local Ih, CaT, KOH = 0.1, 0, 0
  for _ = 1, 200 do
    local sq = math.sqrt(Ih)
    local function g(z) return 10 ^ (-Ad * z * z * (sq / (1 + sq) - 0.3 * Ih)) end
    local mH, aOH = aH / g(1), Kw / aH
    local mOH, aCa = aOH / g(1), mCa * g(2)
    -- m(H_jL) = beta_j aH^j aL / g(4 - j), m(CaL) = K aCa aL / g(2), aL = g(4) mL
    local sumL, prot = 0, 0
    local coef = { [0] = 1 / g(4) }
    for j = 1, 4 do coef[j] = beta[j] * aH ^ j / g(4 - j) end
    for j = 0, 4 do sumL = sumL + coef[j] end
    local cCaL = KCaL * aCa / g(2)
    local aL = LT / (sumL + cCaL)
    local mCaOH = KCaOH * aCa * aOH / g(1)
    for j = 1, 4 do prot = prot + j * coef[j] * aL end
    CaT = mCa + cCaL * aL + mCaOH
    KOH = 4 * LT - (mH - mOH + prot - mCaOH)
    local I2 = (KCl + KOH) + (KCl + 2 * CaT) + mH + mOH + 4 * mCa + mCaOH + 4 * cCaL * aL
    for j = 0, 4 do I2 = I2 + (4 - j) ^ 2 * coef[j] * aL end
    local In = I2 / 2
    if math.abs(In - Ih) < 1e-14 then Ih = In; break end
    Ih = In
  end
  local sE = eq.solution{ water = "1 kg", temperature = 25, activity = "davies" }
  sE:add("H4EGTA", "10 mmol"):add("KCl", "100 mmol")
  local added = sE:adjust{ { pH = 7.2, with = "KOH" }, { species = "Ca^2+", free = "1 umol/kg", with = "CaCl2" } }
  check("CaCl2 for 1 uM free Ca2+, EGTA, Davies (mmol)", added[2].mol * 1e3, CaT * 1e3, CaT * 1e3 * 1e-5,
        "NIST SRD 46 constants, Davies, solved here")
  check("KOH to pH 7.2, EGTA, Davies (mmol)", added[1].mol * 1e3, KOH * 1e3, KOH * 1e3 * 1e-5,
        "NIST SRD 46 constants, Davies, solved here")
  print(string.format("     (ionic strength solved here %.5f mol/kg; relative differences %.1e, %.1e)", Ih,
                      added[2].mol / CaT - 1, added[1].mol / KOH - 1))
end

-- 3c. The same question for Mg^2+ and ATP, ideal activities: how much MgCl2
-- gives 1 mmol/kg free Mg^2+ in 5 mmol/kg Na2ATP at pH 7.2 (KOH), against
-- the closed form from R. A. Alberty, Thermodynamics of Biochemical Reactions
-- (2003), Table 1.2 at I = 0 [seen]: pK 7.60, 4.68; log K MgATP 6.18,
-- MgHATP 3.63, Mg2ATP 2.69; and MgOH+ log *K -11.44 (Baes & Mesmer 1976).
do
  local h, Mg, T, Kw = 10 ^ -7.2, 1e-3, 0.005, 10 ^ -13.995
  local K1, K2 = 10 ^ 7.60, 10 ^ 4.68
  local KM, KMH, KM2 = 10 ^ 6.18, 10 ^ 3.63, 10 ^ 2.69
  local P = 1 + h * K1 + h * h * K1 * K2 + Mg * KM + Mg * h * K1 * KMH + Mg * Mg * KM * KM2
  local L = T / P
  local MgOH = 10 ^ (-11.44) * Mg / h
  local MgT = Mg + MgOH + L * (Mg * KM + Mg * h * K1 * KMH + 2 * Mg * Mg * KM * KM2)
  -- protons: 2 per Na2H2ATP, less one per KOH
  local KOH = 2 * T - (h - Kw / h + L * (h * K1 + 2 * h * h * K1 * K2 + Mg * h * K1 * KMH) - MgOH)
  local sM = eq.solution{ water = "1 kg", temperature = 25, activity = "ideal" }
  sM:add("Na2ATP", "5 mmol")      -- anhydrous: no water of hydration in the kg
  local added = sM:adjust{ { pH = 7.2, with = "KOH" }, { species = "Mg^2+", free = "1 mmol/kg", with = "MgCl2" } }
  check("MgCl2 for 1 mM free Mg2+, 5 mM ATP (mmol)", added[2].mol * 1e3, MgT * 1e3, MgT * 1e3 * 1e-6,
        "Alberty 2003 constants, closed form here")
  check("KOH to pH 7.2, 5 mM Na2ATP (mmol)", added[1].mol * 1e3, KOH * 1e3, KOH * 1e3 * 1e-6,
        "Alberty 2003 constants, closed form here")
end

-- 3d. Free Ca^2+ with NTA, ideal: 5 mmol/kg CaCl2 in 10 mmol/kg Na3NTA at
-- pH 7.0 (HCl), the pH and free Ca^2+ read, total Ca by closed form from
-- the cited constants (the Fe-NTA paper's protonation constants and NIST SRD
-- 46's log K CaL 6.39, all at I = 0.1 and taken to I = 0 as chelators.lua says).
do
  local fD01 = math.sqrt(0.1) / (1 + math.sqrt(0.1)) - 0.3 * 0.1
  local function K0(logK, dz2) return 10 ^ (logK + 0.5108 * fD01 * dz2) end
  local s3 = eq.solution{ water = "1 kg", temperature = 25, activity = "ideal" }
  s3:add("Na3NTA", "10 mmol"):add("CaCl2", "5 mmol")
  s3:adjust_pH(7.0, "HCl")
  local r3 = s3:equilibrate()
  local h, Ca = r3:molality("H+"), r3:molality("Ca^2+")
  local b1 = K0(9.59, 9 + 1 - 4)
  local b2 = b1 * K0(2.52, 4 + 1 - 1)
  local b3 = b2 * K0(1.47, 1 + 1 - 0)
  local KCaL = K0(6.39, 12)
  local L = 0.010 / (1 + b1 * h + b2 * h * h + b3 * h ^ 3 + KCaL * Ca)
  local CaT = Ca + KCaL * Ca * L + 10 ^ 1.30 * Ca * 10 ^ -13.995 / h
  check("total Ca from free Ca2+, NTA pH 7 (mmol/kg)", CaT * 1e3, 5.0, 5.0 * 1e-6,
        "NTA: Fe-NTA paper pK, NIST SRD 46 CaL, closed form here")
end

-- 4. Gases ----------------------------------------------------------------------
-- O2 dissolved from water-saturated air at 1 atm: 14.62 mg/L at 0 C and
-- 8.26 mg/L at 25 C (B. B. Benson, D. Krause, Limnol. Oceanogr. 29, 620
-- (1984), as tabulated in Standard Methods [from memory]); air 20.946 % O2,
-- water vapour 0.6113 and 3.1690 kPa (IAPWS [from memory])
for _, c in ipairs{ { 0, 0.6113, 14.62 }, { 25, 3.1690, 8.26 } } do
  s = eq.solution{ volume = "1 L", temperature = c[1], activity = "davies" }
  local p = 0.20946 * (101.325 - c[2]) / 101.325
  s:expose("O2(g)", string.format("%.6f atm", p))
  r = s:equilibrate()
  check("O2 from moist air at " .. c[1] .. " C (mg/L)", r:molarity("O2") * 31.998e3, c[3], 0.1,
        "Benson & Krause 1984")
end

print(string.format("%d checks, %d failed", n, fails))
assert(fails == 0, "a catalogue check failed")
print("all catalogue checks passed")
