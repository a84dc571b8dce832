local s = eq.solution{}
local r = s:equilibrate()
print(r.pH + nil)
