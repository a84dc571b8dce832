-- N additions of 1 umol NaOH to a phosphate buffer, each followed by an
-- equilibrium, through the command (tests/bench/lua_overhead.sh).
local n = tonumber(params.n or "20000")
local s = eq.solution{ water = "1 kg", activity = "davies" }
s:add("KH2PO4", "25 mmol"):add("Na2HPO4", "25 mmol")
s:equilibrate()
for _ = 1, n do
  s:add("NaOH", "1 umol")
  s:equilibrate()
end
