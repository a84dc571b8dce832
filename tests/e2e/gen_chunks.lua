-- Write params.n mutated Lua 5.4 bytecode chunks into params.dir (run with
-- --trusted: it needs string.dump and io.open): chunkNNN.luac, one each,
-- and chunks.lua, a Lua text file returning all of them as strings. The
-- mutations are random but fixed by the seed, so every run sees the same.
local n, dir = assert(tonumber(params.n)), assert(params.dir)
local source = [[
local t = {}
for i = 1, 10 do t[i] = i * i end
local s = 0
for _, v in ipairs(t) do s = s + v end
local function f(a, b, ...) return a and b or select("#", ...) end
return s, string.format("%d", s), f(1, 2, 3), { x = s, [1] = "y" }
]]
local base = string.dump(assert(load(source, "=fuzz")))
math.randomseed(20240611)
local all = {}
for k = 1, n do
  local b = { base:byte(1, -1) }
  for _ = 1, math.random(1, 8) do
    -- mostly past the header (32 bytes), where the loader trusts the code
    local i = math.random() < 0.9 and math.random(33, #b) or math.random(5, 32)
    b[i] = math.random(0, 255)
  end
  local chunk = string.char(table.unpack(b))
  all[k] = chunk
  local f = assert(io.open(string.format("%s/chunk%03d.luac", dir, k), "wb"))
  f:write(chunk)
  f:close()
end
local f = assert(io.open(dir .. "/chunks.lua", "wb"))
f:write("return {\n")
for k = 1, n do f:write(string.format("%q,\n", all[k])) end
f:write("}\n")
f:close()
print(n .. " chunks")
