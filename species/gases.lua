-- Oxygen and nitrogen: Henry's law with temperature. The dissolved gases
-- take part in no reaction; they are here for air-saturated media.
-- Battino's form, x = mole fraction at 1 atm partial pressure:
--   ln x = A + B/(T/100) + C ln(T/100)
-- K_H = m/p (mol kg-1 atm-1) = x / M_w for x << 1, M_w = 0.0180153 kg/mol:
--   log10 K_H = (A - C ln 100)/ln 10 - log10 M_w + (100 B/ln 10)/T + (C/ln 10) ln T
local L10, LMW = math.log(10), math.log(0.0180153, 10)
local function battino(A, B, C)
  return { a = (A - C * math.log(100)) / L10 - LMW, c = 100 * B / L10, d = C / L10 }
end
return {
  system = "oxygen and nitrogen",
  sources = {
    battino1983 = "R. Battino, T. R. Rettich, T. Tominaga, 'The solubility of oxygen and ozone in liquids', J. Phys. Chem. Ref. Data 12, 163-178 (1983), after B. B. Benson, D. Krause, J. Solution Chem. 9, 895 (1980): O2 ln x = -66.7354 + 87.4755/(T/100) + 24.4526 ln(T/100), 273-348 K [coefficients from memory, medium-high confidence: they give K_H 1.27e-3 mol/(kg atm) at 25 C and d ln K_H/d(1/T) = 1460 K; the compilation of R. Sander, Atmos. Chem. Phys. 15, 4399 (2015) lists 1.3e-3 and 1500 K]",
    battino1984 = "R. Battino, T. R. Rettich, T. Tominaga, 'The solubility of nitrogen and air in liquids', J. Phys. Chem. Ref. Data 13, 563-600 (1984): N2 ln x = -67.3877 + 86.3213/(T/100) + 24.7981 ln(T/100), 273-348 K [coefficients from memory, medium confidence: they give K_H 6.5e-4 mol/(kg atm) at 25 C and 1240 K; Sander 2015 lists 6.4e-4 and 1300 K]",
  },
  species = {
    { "O2" },
    { "N2" },
  },
  gases = {
    { "O2(g)", dissolves = "O2", logKH = -2.896, source = "battino1983",
      logKH_T = battino(-66.7354, 87.4755, 24.4526), T_range = { 273.15, 348.15 } },
    { "N2(g)", dissolves = "N2", logKH = -3.184, source = "battino1984",
      logKH_T = battino(-67.3877, 86.3213, 24.7981), T_range = { 273.15, 348.15 } },
  },
}
