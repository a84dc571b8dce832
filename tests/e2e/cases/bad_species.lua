return {
  sources = { me = "invented for this test" },
  species = { { "HX", formula = "HBr" }, { "X-", formula = "Br-" } },
  acids = {
    { "HX", "X-", pKa = 12, source = "me" },
    { "HX", "X-", pKa = "nine", source = "me" },
  },
  reactions = {
    { "Y-", from = { ["X-"] = 1 }, logK = 1, source = "me" },
  },
}
