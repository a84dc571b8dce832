-- "NaCl\0KCl" once added NaCl.
local s = eq.solution{ volume = "100 ml" }
s:add("NaCl\0KCl", "1 mmol")
