-- A user's species file written with the sign-first charge.
return {
  system = "old notation",
  sources = { me = "invented for a test" },
  size_source = "me",
  species = {
    { "X-2", formula = "SO4^2-", size = 4 },
    { "Y^2-", formula = "SeO4-2", size = 4 },
  },
}
