-- IUPAC charge notation: ASCII after a caret, Unicode folded to it.
local s = eq.solution{ water = "1 kg", temperature = 25 }
s:add("Na2HPO4", "10 mmol")
local r = s:equilibrate()
local ascii = r:molality("HPO4^2-")
assert(ascii > 0, "HPO4^2- present")
assert(r:molality("HPO₄²⁻") == ascii, "Unicode name folds to the ASCII one")
assert(r:molality("H₂PO₄⁻") == r:molality("H2PO4-"), "single charge in Unicode")
assert(r:molality("Na⁺") == r:molality("Na+"), "Na+ in Unicode")
-- a column asked for in Unicode is named in ASCII in Lua, CSV and JSON
local c = s:titrate{ with = "HCl", step = "2 mmol", to = "4 mmol", species = { "HPO₄²⁻" } }
assert(c.columns[6] == "HPO4^2-", "column name in ASCII")
assert(math.abs(c[1]["HPO4^2-"] - ascii) <= 1e-9 * ascii, "row key in ASCII")
assert(c:csv():match("^[^\n]*") == "amount,volume,total_volume,pH,slope,HPO4^2-", "CSV header")
assert(c:json():find('"HPO4^2-"', 1, true), "JSON column")
print("ok notation")
r:molality("HPO4-2")   -- sign-first: an error that suggests the IUPAC spelling
