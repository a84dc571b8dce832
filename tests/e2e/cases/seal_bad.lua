local s = eq.solution{}
s:seal{ headspce = "5 mL" }
