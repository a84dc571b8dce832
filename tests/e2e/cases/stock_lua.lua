-- loaded by a stock lua5.4 with package.cpath pointing at the build
local eq = require "equipoise"
local eq2 = require "equipoise"
assert(eq == eq2)
local s = eq.solution{ activity = "ideal" }
s:add("HCl", "1 mmol")
local r = s:equilibrate()
assert(math.abs(r.pH - 3) < 1e-4)
print("stock lua ok " .. eq.version)
