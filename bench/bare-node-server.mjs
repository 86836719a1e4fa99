// The Node yardstick of bench/reader.bench.ts (row 2b): a bare node:http server that
// answers every request with one prepared head and the cached story's bytes, nothing
// else, in BARE_PROCESSES processes (node:cluster) on BARE_PORT. It shows what Node's own
// HTTP layer costs on this machine, so the app's hit (row 2) can be judged against
// Node as well as against nginx: the gap between 2 and 2b is the app's, the gap
// between 2b and 1a is Node's.
import cluster from 'node:cluster'
import { readFileSync } from 'node:fs'
import http from 'node:http'

const processes = Number(process.env.BARE_PROCESSES ?? 1)
if (cluster.isPrimary && processes > 1) {
  for (let i = 0; i < processes; i++) cluster.fork()
}
else {
  const body = readFileSync(process.env.BARE_BODY)
  const head = { ...JSON.parse(readFileSync(process.env.BARE_HEAD, 'utf8')), 'content-length': String(body.byteLength) }
  http.createServer((req, res) => {
    res.writeHead(200, head)
    res.end(req.method === 'HEAD' ? undefined : body)
  }).listen(Number(process.env.BARE_PORT), '127.0.0.1')
}
