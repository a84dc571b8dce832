-- Titration of an acid sample of unknown strength (scenario invented).
--
-- A quality lab receives a vinegar-like process sample. 10 mL is diluted
-- to 50 mL and titrated with 0.1 M NaOH; the equivalence point gives the
-- acid content. The "unknown" here is made up as 0.85 mmol acetic acid so
-- that the answer can be checked; the curve goes to curve.csv.

local sample = eq.solution{ volume = "50 mL", activity = "davies" }
sample:add("CH3COOH", params.acid or "0.85 mmol")

local naoh = eq.solution{ volume = "1 L", activity = "davies" }
naoh:add("NaOH", "0.1 mol")

local curve = sample:titrate{ with = naoh, step = "0.25 mL", to = "15 mL", species = { "CH3COO-" } }
print(string.format("%d points", #curve))
local e = curve.equivalence_points[1]
local acid_mmol = e.volume * 0.1 * 1e3          -- L x 0.1 mol/L of stock, in mmol
print(string.format("equivalence at %.3f mL, pH %.2f", e.volume * 1e3, e.pH))
print(string.format("acid in the sample: %.4f mmol, %.1f mM in the 10 mL taken", acid_mmol,
                    acid_mmol / 10 * 1e3))
curve:write_csv(params.csv or "curve.csv")
-- half-way to equivalence the pH is near the apparent pKa
for i, row in ipairs(curve) do
  if row.volume >= e.volume / 2 then
    print(string.format("half-equivalence (%.3f mL): pH %.3f", row.volume * 1e3, row.pH))
    break
  end
end
-- the curve as a figure, its equivalence point marked
curve:plot(params.plot or "titration.svg")
