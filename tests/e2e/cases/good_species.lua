return {
  sources = { me = "invented for this test" },
  species = { { "HQ", formula = "C3H6O3" }, { "Q-", formula = "C3H5O3-" } },
  acids = { { "HQ", "Q-", pKa = 3.86, source = "me" } },
}
