-- Buffer exchange for a protein prep (scenario invented for the demo).
--
-- A purification team holds an enzyme in 20 mM Tris/HCl pH 8 and moves it
-- into 25 mM phosphate pH 7.0 by two rounds of dilute-and-concentrate in a
-- spin column. Each round: take 0.5 mL of sample, add 4.5 mL of exchange
-- buffer (a ten-fold dilution), spin back to 0.5 mL (the small molecules
-- leave with the filtrate at the concentrations they have). The question:
-- what pH and how much Tris is left after each round?

local T = 4   -- cold room
local sample = eq.solution{ volume = "0.5 mL", temperature = T, activity = "davies" }
sample:add("Tris", "20 mM"):add("NaCl", "150 mM")
sample:adjust_pH(8.0, "HCl")

local exchange = eq.solution{ volume = "1 L", temperature = T, activity = "davies" }
exchange:add("NaH2PO4", "10 mM"):add("Na2HPO4", "15 mM")
print(string.format("exchange buffer at %d C: pH %.3f", T, exchange:equilibrate().pH))

local function show(label, s)
  local r = s:equilibrate()
  print(string.format("%-28s pH %.3f  Tris %.3f mM  phosphate %.2f mM  I %.3f mol/kg", label,
                      r.pH, 1e3 * (r:molarity("Tris") + r:molarity("TrisH+")),
                      1e3 * (r:molarity("H2PO4-") + r:molarity("HPO4^2-")), r.ionic_strength))
end

local rounds, pHs, tris = {}, {}, {}
local function track(round, s)
  local r = s:equilibrate()
  rounds[#rounds + 1] = round
  pHs[#pHs + 1] = r.pH
  tris[#tris + 1] = 1e3 * (r:molarity("Tris") + r:molarity("TrisH+"))
end

show("start", sample)
track(0, sample)
for round = 1, 2 do
  local mixed = eq.mix{ { sample, "0.5 mL" }, { exchange, "4.5 mL" } }
  -- spinning down keeps the concentrations and removes volume: the retained
  -- 0.5 mL has the composition of the mixture
  sample = eq.mix{ { mixed, "0.5 mL" } }
  show("after round " .. round, sample)
  track(round, sample)
end

eq.plot{ file = params.plot or "exchange_rounds.svg", title = "Buffer exchange at 4 \u{B0}C",
         x = { label = "round" }, y = { label = "pH" },
         lines = { { x = rounds, y = pHs, label = "pH", points = true } },
         hlines = { { y = exchange:equilibrate().pH, label = "exchange buffer" } } }
