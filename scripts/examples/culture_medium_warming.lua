-- A HEPES-buffered saline for cells, made at the bench and used at 37 C
-- (scenario invented for the demo).
--
-- The bench makes 500 mL of 25 mM HEPES saline and sets its pH to 7.40 at
-- 22 C. In the incubator at 37 C the pH is lower; the script says by how
-- much, and what to aim for at 22 C so that it reads 7.40 at 37 C.

local function saline(T)
  local s = eq.solution{ volume = "500 mL", temperature = T, activity = "davies" }
  s:add("HEPES", "25 mM"):add("NaCl", "137 mM"):add("KCl", "2.7 mM")
  return s
end

local s = saline(22)
local mol = s:adjust_pH(7.40, "NaOH")
print(string.format("NaOH to reach pH 7.40 at 22 C: %.2f mmol (%.2f mL of 1 M)", mol * 1e3, mol * 1e3))
s:set_temperature(37)
local warm = s:equilibrate()
print(string.format("the same solution at 37 C: pH %.3f (shift %+.3f)", warm.pH, warm.pH - 7.40))

-- made to read 7.40 at 37 C instead
local t = saline(37)
local mol37 = t:adjust_pH(7.40, "NaOH")
t:set_temperature(22)
print(string.format("to read 7.40 at 37 C: %.2f mmol NaOH; at 22 C it then reads %.3f",
                    mol37 * 1e3, t:equilibrate().pH))
local beta = t:set_temperature(37):buffer_capacity()
print(string.format("buffer capacity at 37 C: %.2f mM per pH unit", beta * 1e3))

-- pH of the bench-made saline (7.40 at 22 C) from the cold room to the incubator
s:temperature_sweep{ from = 4, to = 40 }:plot(params.plot or "saline_temperature.svg")
