-- Memory stays flat over many solves in a stock Lua host: the module loaded
-- with require, 1 umol of NaOH or of HCl added in turn and the solution
-- equilibrated, N times, each result dropped at once; the resident set size
-- sampled at every tenth of the run. Usage: lua5.4 mem_flat.lua N [MAX_KIB]
-- (default 4096): after the first tenth (the warm-up) the resident set may
-- grow by at most MAX_KIB.
local eq = require "equipoise"
local n = tonumber(arg[1] or "1000000")
local bound = tonumber(arg[2] or "4096")

local function rss_kib()
  local f = io.open("/proc/self/statm")
  local text = f:read("a")
  f:close()
  local resident = tonumber(text:match("%d+%s+(%d+)"))
  return resident * 4    -- 4 KiB pages (x86-64, arm64 Debian)
end

local s = eq.solution{ water = "10 kg", activity = "davies" }
s:add("KH2PO4", "250 mmol"):add("Na2HPO4", "250 mmol")
local tenth = math.max(n // 10, 1)
local rss0, rss_max
for i = 1, n do
  s:add(i % 2 == 1 and "NaOH" or "HCl", "1 umol")
  local r = s:equilibrate()
  if i % tenth == 0 then
    local rss = rss_kib()
    rss0 = rss0 or rss
    rss_max = math.max(rss_max or rss, rss)
    print(string.format("Lua %8d solves: resident %d KiB, Lua heap %.0f KiB", i, rss,
                        collectgarbage("count")))
  end
end
local ok = rss_max - rss0 <= bound
print(string.format("%s stock Lua host: %d solves, resident set +%d KiB after the first tenth "
                    .. "(bound %d)", ok and "ok  " or "FAIL", n, rss_max - rss0, bound))
os.exit(ok and 0 or 1)
