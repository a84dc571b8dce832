local s = eq.solution{ species = { (params.dir or ".") .. "/bad_species.lua" } }
