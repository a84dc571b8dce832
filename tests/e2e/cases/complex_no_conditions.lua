-- species file: a metal complex whose log K does not say its conditions
-- (invented constant; the check is under test, not the value)
return {
  sources = { s = "invented for this test" },
  species = { { "CaOHq+", formula = "CaOH+" } },
  reactions = {
    { "CaOHq+", from = { ["Ca^2+"] = 1, ["OH-"] = 1 }, logK = 1.3, source = "s" },
  },
}
