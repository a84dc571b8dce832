-- A misspelt option once designed this recipe at 25 C with no salt.
print("before the error")
local r = eq.recipe{ buffer = "phosphate", pH = 7.4, total = "50 mM",
                     temprature = 4, ionic_strength = "0.15 M" }
