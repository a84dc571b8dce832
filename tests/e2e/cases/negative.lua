local s = eq.solution{}
print("before the error")
s:add("KCl", "-5 mmol")
