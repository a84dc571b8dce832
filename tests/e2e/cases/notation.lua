-- IUPAC charge notation: ASCII after a caret, Unicode folded to it.
local s = eq.solution{ water = "1 kg", temperature = 25 }
s:add("Na2HPO4", "10 mmol")
local r = s:equilibrate()
local ascii = r:molality("HPO4^2-")
assert(ascii > 0, "HPO4^2- present")
assert(r:molality("HPO₄²⁻") == ascii, "Unicode name folds to the ASCII one")
assert(r:molality("H₂PO₄⁻") == r:molality("H2PO4-"), "single charge in Unicode")
assert(r:molality("Na⁺") == r:molality("Na+"), "Na+ in Unicode")
print("ok notation")
r:molality("HPO4-2")   -- sign-first: an error that suggests the IUPAC spelling
