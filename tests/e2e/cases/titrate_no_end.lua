local s = eq.solution{}
s:add("HCl", "1 mmol")
s:titrate{ with = "NaOH", step = "0.1 mmol" }
