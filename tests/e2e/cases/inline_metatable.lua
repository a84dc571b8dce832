-- An inline species table whose metamethods raise: the loader reads the
-- table raw, so they never run and nothing is left behind (constants
-- invented for the test).
local function strict(t)
  return setmetatable(t, { __index = function(_, k) error("metamethod ran for " .. tostring(k)) end,
                           __len = function() error("__len ran") end })
end
eq.load_species(strict{
  sources = strict{ demo = "invented for this test" },
  species = strict{ strict{ "HW", formula = "C2H4O2" }, strict{ "W-", formula = "C2H3O2-" } },
  acids = strict{ strict{ "HW", "W-", pKa = 5.0, source = "demo" } },
})
local s = eq.solution{ activity = "ideal" }
s:add("HW", "10 mmol")
print(string.format("inline metatable ok, pH %.3f", s:equilibrate().pH))
