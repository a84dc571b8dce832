-- HCl 10 mmol/kg with the out-of-tree Guentelberg model: the result must
-- follow its equation, pH = -log10(m) + A sqrt(I)/(1 + sqrt(I)), I = m.
local s = eq.solution{ activity = params.model or "guntelberg" }
s:add("HCl", "10 mmol")
local r = s:equilibrate()
local A = 0.5108     -- at 25 C (R. G. Bates, Determination of pH, 1973) [from memory]
local expect = 2 + A * 0.1 / 1.1
print(string.format("pH %.4f expected %.4f", r.pH, expect))
assert(math.abs(r.pH - expect) < 2e-4)
print("outside plugin ok")
