-- Water, the hydrogen ion and the hydroxide ion.
return {
  system = "water",
  about = "The solvent and its ionization.",
  sources = {
    iapws2007 = "International Association for the Properties of Water and Steam, 'Release on the Ionization Constant of H2O', IAPWS R11-07 (2007), after A. V. Bandura, S. N. Lvov, 'The ionization constant of water over wide ranges of temperature and density', J. Phys. Chem. Ref. Data 35, 15-30 (2006): pKw 13.995 at 25 C and 0.1 MPa; the engine evaluates this formulation at every temperature. Recorded beside it: dH 55.81 kJ/mol from G. Olofsson, L. G. Hepler, 'Thermodynamics of ionization of water over wide ranges of temperature and pressure', J. Solution Chem. 4, 127-143 (1975) [from memory], and dCp -215.2 J/(K mol) at 298 K from P. P. Singh, E. M. Woolley, K. G. McCurdy, L. G. Hepler, 'Heat capacities of aqueous electrolytes: eight 1:1 electrolytes and ΔCp° for ionization of water at 298 K', Can. J. Chem. 54, 3315-3318 (1976) [title from memory]",
    kielland1937 = "J. Kielland, 'Individual activity coefficients of ions in aqueous solutions', J. Am. Chem. Soc. 59, 1675-1678 (1937): ion-size parameters [title and ion assignments from memory]",
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
      source = "iapws2007" },
  },
  reagents = {
    { "H2O", name = "water" },
  },
}
