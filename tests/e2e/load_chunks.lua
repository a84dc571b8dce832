-- In the sandbox, try to load every mutated bytecode chunk beside this file
-- (chunks.lua, made by gen_chunks.lua) in each mode load accepts: all must be
-- refused; none may run, and the process must not crash.
local chunks = require "chunks"
local tried, refused, loaded = 0, 0, 0
for _, chunk in ipairs(chunks) do
  for _, mode in ipairs({ false, "t", "b", "bt" }) do
    tried = tried + 1
    local ok, f = pcall(load, chunk, "=chunk", mode or nil)
    if ok and f then loaded = loaded + 1 else refused = refused + 1 end
  end
end
print(string.format("tried %d, refused %d, loaded %d", tried, refused, loaded))
