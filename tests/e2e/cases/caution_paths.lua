-- Each way a hazardous reagent can enter a run (--param path=...): the run
-- must show its caution once, in text and in JSON. Scenario invented.
local path = params.path or "add"
local s = eq.solution{ volume = "100 mL" }
s:add("KH2PO4", "5 mmol")
if path == "add" then
  s:add("NaOH", "1 mmol"):add("sodium hydroxide", "1 mmol")   -- an alias: one reagent
elseif path == "adjust" then
  s:adjust_pH(7.2, "NaOH")
elseif path == "titrate" then
  s:titrate{ with = "NaOH", step = "0.5 mmol", to = "2 mmol" }
elseif path == "budget" then
  s:load_budget{ window = 0.1, acid = "HCl", base = "NaOH" }
elseif path == "recipe" then
  eq.recipe{ pH = 7.5, total = "50 mM", volume = "100 mL", using = { "HEPES", "NaOH" },
             quiet = true }
elseif path == "pour" or path == "mix" then
  local stock = eq.solution{ volume = "100 mL" }
  stock:add("NaOH", "10 mmol")
  if path == "pour" then s:pour(stock, "1 mL")
  else s = eq.mix{ { s, "50 mL" }, { stock, "1 mL" } } end
end
print(string.format("%s: pH %.2f", path, s:equilibrate().pH))
