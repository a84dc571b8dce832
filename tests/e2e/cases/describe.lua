-- eq.describe reads the library as `equipoise species show` does.
local opts = params.bad and { temprature = 37 } or { temperature = 37 }
print(eq.describe("H2PO4-", opts))
print(eq.describe("calcite"))
