local s = eq.solution{ temprature = 37 }
