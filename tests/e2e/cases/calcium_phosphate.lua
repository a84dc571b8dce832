-- 10 mM CaCl2 + 10 mM Na2HPO4: supersaturated in brushite and hydroxyapatite
-- (such mixtures precipitate calcium phosphate; common practice). The run
-- must warn of both, in text and in JSON; nothing precipitates by default.
local s = eq.solution{ volume = "1 L", temperature = 25 }
s:add("CaCl2", "10 mM"):add("Na2HPO4", "10 mM")
local r = s:equilibrate()
print(string.format("SI brushite %.2f, hydroxyapatite %.2f, solid %g", r:saturation("brushite"),
                    r:saturation("hydroxyapatite"), r:solid("brushite")))
