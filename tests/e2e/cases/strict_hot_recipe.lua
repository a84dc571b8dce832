-- 500 C once gave "mass of water ... must be positive".
local r = eq.recipe{ buffer = "phosphate", pH = 7.4, total = "50 mM", temperature = 500 }
