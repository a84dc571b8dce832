local s = eq.solution{}
s:expose("CO2(g)", "5 mL")
