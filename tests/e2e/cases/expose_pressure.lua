-- Henry's law at a partial pressure beyond its low-pressure range, and a
-- constant beyond the temperatures its source states: both warned of.
local s = eq.solution{ water = "1 kg" }
s:add("NaHCO3", "10 mmol")
s:expose("CO2(g)", "5 atm")
local t = eq.solution{ water = "1 kg", temperature = 99 }
t:add("NaHCO3", "10 mmol")
t:expose("CO2(g)", "426.9 uatm")
print("ok expose warnings")
