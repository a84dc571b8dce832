local s = eq.solution{ volume = "2 kg" }
