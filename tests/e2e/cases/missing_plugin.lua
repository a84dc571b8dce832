local s = eq.solution{ activity = "no-such-model" }
