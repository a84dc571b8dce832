local s = eq.solution{ volume = "100 mL", temperature = 25 }
s:add("KH2PO4", "0.34 g"):add("Na2HPO4", "0.355 g")
print("pH", s:equilibrate().pH)
local naoh = eq.solution{ volume = "1 L" }
naoh:add("NaOH", "0.1 mol")
local curve = s:titrate{ with = naoh, step = "0.5 mL", until_pH = 8 }
print("0.1 M NaOH to pH 8:", curve[#curve].volume * 1e3, "mL")
print("capacity", s:buffer_capacity(), "mol/(L pH)")
