-- A Tris assay buffer made at room temperature, then used cold and warm.
--
-- Scenario (invented): a kinetics bench makes a Tris buffer (50 mM base, 25 mM
-- hydrochloride, 100 mM NaCl; pH about 8.5) at 25 C
-- and runs the same assay at 4 C (cold room) and 37 C (incubator). The
-- script follows one preparation through both temperatures and compares
-- the activity models, with each model's range warnings.

local models = { "dh-extended", "davies", "bdot", "sit" }
local temps = { 25, 4, 37 }

print(string.format("%-12s %8s %8s %8s   (pH at each temperature)", "model", "25 C", "4 C", "37 C"))
for _, m in ipairs(models) do
  local s = eq.solution{ volume = "1 L", temperature = 25, activity = m }
  s:add("Tris", "6.057 g")          -- 50 mmol Tris base
  s:add("TrisHCl", "3.940 g")       -- 25 mmol Tris hydrochloride
  s:add("NaCl", "100 mmol")
  local row = string.format("%-12s", m)
  local warnings = {}
  for _, t in ipairs(temps) do
    s:set_temperature(t)
    local r = s:equilibrate()
    row = row .. string.format(" %8.3f", r.pH)
    for _, w in ipairs(r.warnings) do warnings[w] = true end
  end
  print(row)
  for w in pairs(warnings) do print("    note: " .. w) end
end

-- pH against temperature under each model, 4 to 37 C
local lines = {}
for _, m in ipairs(models) do
  local s = eq.solution{ volume = "1 L", temperature = 25, activity = m }
  s:add("Tris", "6.057 g"):add("TrisHCl", "3.940 g"):add("NaCl", "100 mmol")
  local sweep = s:temperature_sweep{ from = 4, to = 37 }
  local T, pH = {}, {}
  for i, row in ipairs(sweep) do T[i], pH[i] = row.temperature, row.pH end
  lines[#lines + 1] = { x = T, y = pH, label = m }
end
eq.plot{ file = params.plot or "tris_temperature.svg", title = "Tris buffer against temperature",
         x = { label = "temperature", unit = "\u{B0}C" }, y = "pH", lines = lines }

print()
print("Tris loses about 0.03 pH per degree warming: adjust the pH at the")
print("temperature of use, and confirm it there with a calibrated meter.")
