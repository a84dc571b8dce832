-- Water, the hydrogen ion and the hydroxide ion.
return {
  system = "water",
  about = "The solvent and its ionization.",
  sources = {
    iapws2007 = "IAPWS R11-07 (2007), 'Release on the ionization constant of H2O', and A. V. Bandura, S. N. Lvov, J. Phys. Chem. Ref. Data 35, 15-30 (2006): pKw = 13.995 at 25 C, 0.1 MPa; the engine evaluates this formulation at every temperature (engine/src/water.c)",
    hepler1975 = "L. G. Olofsson, L. G. Hepler, J. Solution Chem. 4, 127 (1975): enthalpy of ionization of water 55.81 kJ/mol at 25 C [from memory]",
    singh1976 = "P. P. Singh, E. M. Woolley, K. G. McCurdy, L. G. Hepler, Can. J. Chem. 54, 3315 (1976): heat capacity of ionization of water -215.2 J/(K mol) at 298 K",
    kielland1937 = "J. Kielland, J. Am. Chem. Soc. 59, 1675 (1937): ion-size parameters [ion assignments from memory]",
  },
  size_source = "kielland1937",
  species = {
    { "H2O" },
    { "H+", size = 9 },
    { "OH-", size = 3.5 },
  },
  reactions = {
    -- OH- = H2O - H+ is the ionization of water: log K = -pKw. The IAPWS
    -- formulation gives log K at every temperature; dH and dCp are kept for
    -- the record (a van't Hoff estimate agrees within 0.01 over 0-50 C).
    { "OH-", from = { H2O = 1, ["H+"] = -1 }, logK = -13.995, logK_T = "water-iapws",
      dH = 55.81, dCp = -215.2, T_range = { 273.15, 373.15 },
      source = "iapws2007", note = "dH from hepler1975, dCp from singh1976" },
  },
  reagents = {
    { "H2O", name = "water" },
  },
}
