local s = eq.solution{ activity = { "davies", kappa = 2 } }
