-- Benchmark through Lua: a 1000-point titration, timed with os.clock.
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KH2PO4", "25 mmol"):add("Na2HPO4", "25 mmol")
local naoh = eq.solution{ water = "1 kg", activity = "davies" }
naoh:add("NaOH", "0.1 mol")
local best = math.huge
local n
for _ = 1, 5 do
  local t0 = os.clock()
  local c = s:titrate{ with = naoh, step = "0.1 mL", to = "100 mL", max_dpH = 10 }
  local rows = 0
  for _, row in ipairs(c) do rows = rows + (row.pH > 0 and 1 or 0) end
  best = math.min(best, os.clock() - t0)
  n = #c
end
print(string.format("1000-point titration through Lua (rows read back): %d points, %.2f ms", n, best * 1e3))
