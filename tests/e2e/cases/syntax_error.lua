local s = eq.solution{
print("never")
