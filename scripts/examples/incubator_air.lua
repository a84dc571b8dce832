-- A bicarbonate-buffered medium in and out of a CO2 incubator (scenario
-- invented for the demo).
--
-- A medium with 26 mM NaHCO3 and 110 mM NaCl sits at 37 C under 5 % CO2.
-- Left open on the bench it exchanges CO2 with room air (426.9 uatm, the
-- May 2024 Mauna Loa mean, NOAA/Scripps) and its pH climbs; this is the
-- end point of that drift, the full equilibrium with air.

local medium = eq.solution{ volume = "500 mL", temperature = 37, activity = "davies" }
medium:add("NaHCO3", "26 mM"):add("NaCl", "110 mM")

local incubator = medium:copy()
local taken = incubator:expose("CO2(g)", "0.05 atm")
local r = incubator:equilibrate()
print(string.format("in the incubator (5 %% CO2, 37 C): pH %.2f, %.2f mmol CO2 taken up",
                    r.pH, taken * 1e3))

local bench = incubator:copy()
bench:set_temperature(22)
local lost = bench:expose("CO2(g)", "426.9 uatm")
print(string.format("open on the bench (air, 22 C), at equilibrium: pH %.2f, %.2f mmol CO2 lost",
                    bench:equilibrate().pH, -lost * 1e3))
print(string.format("buffer capacity in the incubator: %.1f mM per pH unit",
                    incubator:buffer_capacity() * 1e3))

-- the carbonate forms against pH at 37 C and the medium's ionic strength
eq.distribution{ system = "NaHCO3", ionic_strength = r.ionic_strength, temperature = 37,
                 pH = { 4, 12 } }:plot(params.plot or "carbonate_distribution.svg")
