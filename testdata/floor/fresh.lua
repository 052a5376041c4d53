-- wrk script: every request asks for a figure the server has not drawn
-- yet (a caption of its own), so no cache can answer it:
--   wrk -s testdata/floor/fresh.lua -H 'Accept-Encoding: gzip' "http://127.0.0.1:8080/figure.svg?$Q"
local n = 0
setup = function(thread)
  thread:set("id", tostring(math.random(1e9)))
end
request = function()
  n = n + 1
  return wrk.format("GET", wrk.path .. "&fig.caption=run+" .. id .. "-" .. n)
end
