-- Benchmark through Lua: successive solves of the phosphate buffer (Davies),
-- each after adding 1 umol NaOH; n from --param n=N (bench_phosphate runs
-- it with n and with 0 and takes the difference: start-up subtracted).
local n = math.tointeger(tonumber(params.n or "20000"))
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KH2PO4", "25 mmol"):add("Na2HPO4", "25 mmol")
s:equilibrate()
for _ = 1, n do
  s:add("NaOH", "1 umol")
  s:equilibrate()
end
