-- A script that removes its own print still gets the recipe procedure printed.
print = nil
local r = eq.recipe{ buffer = "phosphate", pH = 7.2, total = "50 mM" }
