-- Uses a reagent that only a user's species file defines.
local s = eq.solution{}
s:add("ZqCl", "1 mmol")
print("should not get here")
