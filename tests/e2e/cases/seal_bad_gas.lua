local s = eq.solution{}
s:seal{ headspace = "5 mL", gases = { ["C02(g)"] = "1 atm" } }
