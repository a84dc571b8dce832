-- The calcium and magnesium phosphate solids (saturation indices, and
-- precipitation where a script allows it), and the dicalcium phosphate
-- reagent. Builds on calcium.lua (Ca^2+, Mg^2+), phosphate.lua and
-- ammonia.lua (NH4+, for struvite).
--
-- Every log Ksp is for I = 0 (activities), written for the solid as it
-- dissolves to the library's species; water of hydration is listed and
-- counts at unit activity. Where a source gives log Ksp at 25 and 37 C
-- only, dH is the van't Hoff enthalpy through those two points [D]:
-- dH = -R ln10 (log K37 - log K25) / (1/310.15 - 1/298.15).
-- Hazard classes (GHS keys, docs/species-format.md): suppliers' safety data
-- sheets [from memory; the safety data sheet of the product in hand decides].
local R, L10 = 8.314462e-3, math.log(10)          -- kJ/(K mol)
local function dH2(logK25, logK37)                -- kJ/mol, to 0.1
  local dH = -R * L10 * (logK37 - logK25) / (1 / 310.15 - 1 / 298.15)
  return math.floor(dH * 10 + 0.5) / 10
end

return {
  system = "calcium and magnesium phosphate solids",
  sources = {
    dorozhkin2010 = "S. V. Dorozhkin, Materials 3, 3994-4050 (2010), Table 3 'Properties of the biologically relevant calcium orthophosphates' (reproduced there from M. Epple) [table seen; author from memory]: -log Ksp at 25 C and 37 C, ion products of the formulae without hydrate water, I = 0: brushite 6.59, 6.63; monetite 6.90, 7.02; octacalcium phosphate 96.6, 95.9; hydroxyapatite (Ca10(PO4)6(OH)2) 116.8, 117.2. The original measurements [from memory]: brushite, T. M. Gregory, E. C. Moreno, W. E. Brown, J. Res. Natl. Bur. Stand. 74A, 461-475 (1970), 5-37.5 C (corroborated by E. C. Moreno, T. M. Gregory, W. E. Brown, J. Res. Natl. Bur. Stand. 70A, 545 (1966) [abstract seen]: (Ca)(HPO4) = 2.19e-7 at 37.5 C); monetite, H. McDowell, W. E. Brown, J. R. Sutter, Inorg. Chem. 10, 1638-1643 (1971); octacalcium phosphate, M. S. Tung, N. Eidelman, B. Sieck, W. E. Brown, J. Res. Natl. Bur. Stand. 93, 613-624 (1988), 4-37 C, Ksp = (Ca)^4 (H)(PO4)^3 per Ca4H(PO4)3.2.5H2O, doubled for Ca8H2(PO4)6.5H2O; hydroxyapatite, H. McDowell, T. M. Gregory, W. E. Brown, J. Res. Natl. Bur. Stand. 81A, 273-281 (1977), 5-37 C; here per Ca5(PO4)3OH, half the log Ksp of Ca10(PO4)6(OH)2",
    ohlinger1998 = "K. N. Ohlinger, T. M. Young, E. D. Schroeder, 'Predicting struvite formation in digestion', Water Res. 32, 3607-3614 (1998): pKsp of MgNH4PO4.6H2O = 13.26 at 25 C, I = 0, (Mg)(NH4)(PO4) [value from memory, medium confidence; older values range from 12.6 to 13.36]",
    racz1968 = "'Solubility of dimagnesium phosphate trihydrate and trimagnesium phosphate', G. J. Racz, R. J. Soper, Can. J. Soil Sci. 48, 265-269 (1968) [abstract seen; authors and journal from memory]: pKsp of MgHPO4.3H2O = 5.83 +- 0.01 at 25 C, (Mg)(HPO4); A. W. Taylor, A. W. Frazier, E. L. Gurney, J. P. Smith, Trans. Faraday Soc. 59, 1585 (1963) gave 5.82 [from memory]",
  },
  solids = {
    { "brushite", formula = "CaHPO4.2H2O",
      dissolves = { ["Ca^2+"] = 1, ["HPO4^2-"] = 1, H2O = 2 },
      logKsp = -6.59, dH = dH2(-6.59, -6.63), T_range = { 278.15, 310.65 },
      source = "dorozhkin2010", note = "dH from the 25 and 37 C values" },
    { "monetite", formula = "CaHPO4",
      dissolves = { ["Ca^2+"] = 1, ["HPO4^2-"] = 1 },
      logKsp = -6.90, dH = dH2(-6.90, -7.02), T_range = { 278.15, 310.15 },
      source = "dorozhkin2010", note = "dH from the 25 and 37 C values" },
    { "octacalcium phosphate", formula = "Ca8H2(PO4)6.5H2O",
      dissolves = { ["Ca^2+"] = 8, ["H+"] = 2, ["PO4^3-"] = 6, H2O = 5 },
      logKsp = -96.6, dH = dH2(-96.6, -95.9), T_range = { 277.15, 310.15 },
      source = "dorozhkin2010", note = "dH from the 25 and 37 C values" },
    { "hydroxyapatite", formula = "Ca5(PO4)3OH",
      dissolves = { ["Ca^2+"] = 5, ["PO4^3-"] = 3, ["OH-"] = 1 },
      logKsp = -116.8 / 2, dH = dH2(-116.8 / 2, -117.2 / 2), T_range = { 278.15, 310.15 },
      source = "dorozhkin2010", note = "per Ca5(PO4)3OH; dH from the 25 and 37 C values" },
    { "struvite", formula = "MgNH4PO4.6H2O",
      dissolves = { ["Mg^2+"] = 1, ["NH4+"] = 1, ["PO4^3-"] = 1, H2O = 6 },
      logKsp = -13.26, source = "ohlinger1998",
      note = "25 C only: no enthalpy in the source" },
    { "newberyite", formula = "MgHPO4.3H2O",
      dissolves = { ["Mg^2+"] = 1, ["HPO4^2-"] = 1, H2O = 3 },
      logKsp = -5.83, source = "racz1968",
      note = "25 C only: no enthalpy in the source" },
  },
  reagents = {
    { "CaHPO4", gives = { ["Ca^2+"] = 1, ["HPO4^2-"] = 1 },
      names = { "calcium hydrogen phosphate", "dicalcium phosphate" }, hydrates = { 2 } },
  },
}
