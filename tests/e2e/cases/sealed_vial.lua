-- A sealed vial: 10 mL of 20 mM bicarbonate under 5 mL of air, then
-- acidified through the septum; the CO2 goes into the headspace.
local s = eq.solution{ volume = "10 mL", temperature = 25 }
s:add("NaHCO3", "20 mM")
s:seal{ headspace = "5 mL", gases = { ["CO2(g)"] = "426.9 uatm", ["O2(g)"] = "0.2095 atm", ["N2(g)"] = "0.7808 atm" } }
print(s:equilibrate())
s:add("HCl", "0.3 mmol")
local r = s:equilibrate()
print(r)
local p, mol = r:gas("CO2(g)")
print(string.format("ok sealed: pCO2 %.3f atm, %.3g mol in the gas, total %.3f atm", p, mol, r.headspace.pressure))
