// Reader benchmarks, run on demand (not a test), loopback only, bounded runs:
//   flock /tmp/pullsheet-test.lock npx tsx bench/reader.bench.ts
// Starts the test-profile app with a published three-graph story, in two app servers on
// one database: one with a process per core (server/cluster.mjs; BENCH_PROCESSES to
// choose) and one with a single process, for the same-run comparison. Then its own
// nginx (Debian package) under .data/bench with two servers: the story page's bytes
// as a static file (the yardstick), and the shipped cache (deploy/nginx/pullsheet.conf's
// story location) in front of the first app server. Load comes from wrk (bench/wrk.ts),
// every request asking for Brotli as browsers do, so every row moves the same bytes.
// Measures, in one run (rows 1 to 3 take turns, two rounds):
//   1. nginx static file (the yardstick)                requests/s
//      1a. with worker_processes auto (one per core, 2 here), as Debian ships it
//      1b. with one worker: the same number of processes as one Node process
//   2. cached story page from Node alone                >= 0.85 of 1a (each app server)
//      2b. a bare Node server (bench/bare-node-server.mjs) sending the app's head and the
//          same bytes, with as many processes as each app server: Node's own ceiling here
//   3. the same page through the shipped nginx config   >= 0.95 of 1a
//      (rows 1a, 1b and 3 also print nginx's CPU per answer: its workers' user + system
//      time from /proc over the row's turns, which the machine's other load moves less)
//   4. uncached story page (a signed-in reader: never cached), p95 at 10 concurrent < 60 ms
//      (each app server, taking turns)
//   5. first-load JS of the story page                  < 120 KB gzip
//   6. the story page on the wire                       <= 40 KB
// `reader.bench.ts uncached` runs row 4 alone (no nginx), e.g. under a CPU profile.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { chmodSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { request } from 'node:http'
import os from 'node:os'
import { join } from 'node:path'
import { ROOT } from '../scripts/lib/env'
import { firstLoad } from './first-load'
import { processCpuMs } from './proc-cpu'
import { readerFixture } from './reader-fixture'
import { clean, wrk, type WrkResult } from './wrk'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const WARMUP_SECONDS = 3
const CONNECTIONS = 50
const STATIC_PORT = 8461
const CACHE_PORT = 8462
const STATIC_ONE_WORKER_PORT = 8463
const BARE_NODE_PORT = 8464 // and the next one: one bare server per app server
const dir = join(ROOT, '.data', 'bench', 'nginx')

/**
 * What both nginx instances share: the process settings, the static yardstick, the temp
 * paths. `pcre_jit on` is what docs/deploy/nginx.md has a deployment add to nginx.conf
 * (main context, where a conf.d file cannot set it); the yardstick runs no regular
 * expression, so it changes nothing there.
 */
function nginxHead(name: string, workers: 'auto' | 1, staticPort: number): string {
  return `
daemon off;
worker_processes ${workers};
pcre_jit on;
pid ${dir}/${name}.pid;
error_log ${dir}/${name}-error.log warn;
events { worker_connections 4096; }
http {
  access_log off;
  sendfile on;
  tcp_nopush on;
  keepalive_requests 100000;
  client_body_temp_path ${dir}/tmp-body;
  proxy_temp_path ${dir}/tmp-proxy;
  fastcgi_temp_path ${dir}/tmp-fastcgi;
  uwsgi_temp_path ${dir}/tmp-uwsgi;
  scgi_temp_path ${dir}/tmp-scgi;
  server {
    listen 127.0.0.1:${staticPort};
    root ${dir}/static;
    default_type text/html;
    location = /story { add_header Content-Encoding br; add_header Vary Accept-Encoding; try_files /story.html.br =404; }
  }`
}

/** The yardstick with one worker: a second nginx, serving the same file the same way. */
function oneWorkerConfig(): string {
  return `${nginxHead('nginx-one', 1, STATIC_ONE_WORKER_PORT)}
}
`
}

function nginxConfig(appPort: number): string {
  // The story location of deploy/nginx/pullsheet.conf, on plain http for loopback.
  const deploy = readFileSync(join(ROOT, 'deploy/nginx/pullsheet.conf'), 'utf8')
  const maps = [/map \$http_cookie[\s\S]*?\n\}/, /map \$http_accept_encoding[\s\S]*?\n\}/].map(m => m.exec(deploy)![0]).join('\n')
  const story = /( {4}location ~ \^\/\(stories[\s\S]*?\n {4}\})/.exec(deploy)![1]!
  return `${nginxHead('nginx', 'auto', STATIC_PORT)}
  upstream pullsheet_app { server 127.0.0.1:${appPort}; keepalive 32; }
  proxy_cache_path ${dir}/cache levels=1:2 keys_zone=pullsheet_pages:50m max_size=1g inactive=1d use_temp_path=off;
  ${maps}
  server {
    listen 127.0.0.1:${CACHE_PORT};
    proxy_http_version 1.1;
    proxy_set_header Connection "";
    proxy_set_header Host $host;
${story}
  }
}
`
}

const BROTLI = { 'accept-encoding': 'gzip, deflate, br' }

/** A row's result, with the CPU its server spent per answer when the row has a meter. */
type Row = WrkResult & { cpuMicros?: number }

/**
 * The URLs in turn, twice, half the time each, so a change in the machine's other load
 * during the run moves them all alike; requests/s over both halves, latency of the second.
 * `cpu[i]`, when given, reads the CPU milliseconds of URL i's server so far: the row then
 * also reports microseconds of CPU per answer, which the machine's other load moves far
 * less than requests/s.
 */
async function alternating(urls: string[], connections: number, headers: Record<string, string>, cpu: ((() => number) | undefined)[] = []): Promise<Row[]> {
  const halves: WrkResult[][] = urls.map(() => [])
  const cpuMs = urls.map(() => 0)
  for (let round = 0; round < 2; round++) {
    for (const [i, url] of urls.entries()) {
      const before = cpu[i]?.() ?? 0
      halves[i]!.push(clean(url, await wrk(url, { connections, seconds: SECONDS / 2, headers })))
      cpuMs[i]! += (cpu[i]?.() ?? 0) - before
    }
  }
  return halves.map(([a, b], i) => ({
    ...b!,
    requests: a!.requests + b!.requests,
    perSecond: (a!.requests + b!.requests) / (a!.requests / a!.perSecond + b!.requests / b!.perSecond),
    cpuMicros: cpu[i] ? cpuMs[i]! * 1000 / (a!.requests + b!.requests) : undefined,
  }))
}

async function checkUncached(url: string, cookie: string) {
  const probe = await fetch(url, { headers: { cookie, ...BROTLI } })
  if (probe.status !== 200 || probe.headers.get('x-page-cache') || !/private/.test(probe.headers.get('cache-control') ?? '')) throw new Error(`the signed-in page must be private and uncached: ${probe.status} ${probe.headers.get('x-page-cache')} ${probe.headers.get('cache-control')}`)
}

/** Row 4 on each app server (taking turns when there are two). */
async function uncachedRows(servers: { base: string, processes: number }[], cookie: string) {
  const urls = servers.map(s => `${s.base}/stories/${fixture.slug}`)
  const headers = { cookie, ...BROTLI }
  for (const url of urls) await checkUncached(url, cookie)
  // The server's first seconds of rendering are its JIT warming up; like rows 1 to 3
  // (whose first seconds are a small part of a far larger count) the row reports a
  // running server: the same load for WARMUP_SECONDS first, not counted.
  for (const url of urls) await wrk(url, { connections: 10, seconds: WARMUP_SECONDS, headers })
  const results = await alternating(urls, 10, headers)
  for (const [i, u] of results.entries()) {
    console.log(`4. uncached, 3 graphs, 10 concurrent, ${servers[i]!.processes} process(es): p50 ${u.p50.toFixed(1)} ms, p95 ${u.p95.toFixed(1)} ms, p99 ${u.p99.toFixed(1)} ms (n = ${u.requests}, ${u.perSecond.toFixed(0)} req/s; target p95 < 60 ms)`)
  }
}

/** The bytes of one answer, on a connection of its own. */
function wireBytes(url: string, encoding: string): Promise<number> {
  return new Promise((resolve, reject) => {
    request(url, { agent: false, headers: { 'accept-encoding': encoding } }, (res) => {
      let n = 0
      res.on('data', (chunk: Buffer) => { n += chunk.byteLength })
      res.on('end', () => resolve(n))
    }).on('error', reject).end()
  })
}

// The app as README recommends running it (one process per core), and one process
// beside it on the same database for the same-run comparison (BENCH_PROCESSES=1: one only).
const processes = Number(process.env.BENCH_PROCESSES ?? os.availableParallelism())
const fixture = await readerFixture({ processes, otherProcesses: processes > 1 ? 1 : undefined })
const servers = [{ base: fixture.base, processes: fixture.processes }, ...(fixture.other ? [fixture.other] : [])]
if (process.argv[2] === 'uncached') {
  try {
    await uncachedRows(servers, fixture.readerCookie)
  }
  finally {
    await fixture.stop()
  }
  process.exit(0)
}
/** The app's cached answer of a page in Brotli, head and bytes, on a connection of its own. */
function cachedAnswer(url: string): Promise<{ headers: Record<string, unknown>, body: Buffer }> {
  return new Promise((resolve, reject) => {
    request(url, { agent: false, headers: BROTLI }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', () => (res.headers['content-encoding'] === 'br'
        ? resolve({ headers: res.headers, body: Buffer.concat(chunks) })
        : reject(new Error('the cached page came back without Brotli'))))
    }).on('error', reject).end()
  })
}

/** Row 2b's servers: the app's cached answer served by bare Node, one server per app server. */
async function startBareNode(answer: { headers: Record<string, unknown>, body: Buffer }, processes: number[]): Promise<ChildProcess[]> {
  const skip = new Set(['date', 'connection', 'keep-alive', 'transfer-encoding', 'content-length'])
  const head = Object.fromEntries(Object.entries(answer.headers).filter(([name]) => !skip.has(name)))
  writeFileSync(join(dir, 'bare-head.json'), JSON.stringify(head))
  writeFileSync(join(dir, 'bare-body.br'), answer.body)
  const children = processes.map((n, i) => spawn(process.execPath, [join(ROOT, 'bench', 'bare-node-server.mjs')], {
    stdio: 'inherit',
    env: { ...process.env, BARE_PROCESSES: String(n), BARE_PORT: String(BARE_NODE_PORT + i), BARE_HEAD: join(dir, 'bare-head.json'), BARE_BODY: join(dir, 'bare-body.br') },
  }))
  await new Promise(r => setTimeout(r, 1000))
  return children
}

let nginx: ChildProcess | undefined
let nginxOne: ChildProcess | undefined
let bare: ChildProcess[] = []
try {
  const storyUrl = `${fixture.base}/stories/${fixture.slug}`
  // The first answer fills the page cache; the second is a hit, whose head row 2b copies.
  await cachedAnswer(storyUrl)
  const answer = await cachedAnswer(storyUrl)
  const brotli = answer.body
  mkdirSync(join(dir, 'static'), { recursive: true })
  // nginx's workers drop root for "nobody": they must reach the folders and write the cache.
  for (const up of [join(ROOT, '.data'), join(ROOT, '.data', 'bench'), dir, join(dir, 'static')]) chmodSync(up, 0o755)
  for (const sub of ['cache', 'tmp-body', 'tmp-proxy', 'tmp-fastcgi', 'tmp-uwsgi', 'tmp-scgi']) {
    mkdirSync(join(dir, sub), { recursive: true })
    chmodSync(join(dir, sub), 0o777)
  }
  writeFileSync(join(dir, 'static', 'story.html.br'), brotli)
  writeFileSync(join(dir, 'nginx.conf'), nginxConfig(Number(new URL(fixture.base).port)))
  writeFileSync(join(dir, 'nginx-one.conf'), oneWorkerConfig())
  for (const conf of ['nginx.conf', 'nginx-one.conf']) {
    const check = spawnSync('nginx', ['-t', '-p', dir, '-c', join(dir, conf)], { encoding: 'utf8' })
    if (check.status !== 0) throw new Error(`nginx -t (${conf}): ${check.stderr}`)
  }
  nginx = spawn('nginx', ['-p', dir, '-c', join(dir, 'nginx.conf')], { stdio: 'inherit' })
  nginxOne = spawn('nginx', ['-p', dir, '-c', join(dir, 'nginx-one.conf')], { stdio: 'inherit' })
  await new Promise(r => setTimeout(r, 500))

  const edgeUrl = `http://127.0.0.1:${CACHE_PORT}/stories/${fixture.slug}`
  await fetch(edgeUrl, { headers: BROTLI })
  const edge = await fetch(edgeUrl, { headers: BROTLI })
  const nodeUrls = servers.map(s => `${s.base}/stories/${fixture.slug}`)
  for (const url of nodeUrls) {
    // Every process of a server fills its own page cache on its first request: new
    // connections, which the cluster hands to its processes in turn (fetch would keep one).
    for (let i = 0; i < 8; i++) await wireBytes(url, 'br')
  }
  console.log(`nginx cache status on the second request: ${edge.headers.get('x-edge-cache')}; node page cache: ${(await fetch(storyUrl, { headers: BROTLI })).headers.get('x-page-cache')}`)
  const wire = { br: await wireBytes(storyUrl, 'br'), gzip: await wireBytes(storyUrl, 'gzip'), none: await wireBytes(storyUrl, 'identity') }
  bare = await startBareNode(answer, servers.map(s => s.processes))

  console.log(`${os.cpus().length} cores, ${os.cpus()[0]?.model}; load average ${os.loadavg().map(l => l.toFixed(1)).join(' ')}; wrk ${CONNECTIONS} connections, 2 threads, 2 x ${SECONDS / 2} s each in turns, Brotli bytes (${(brotli.byteLength / 1024).toFixed(1)} KB) on every row`)
  // Every row of the cached page takes its turn in each of two rounds.
  const staticUrl = `http://127.0.0.1:${STATIC_PORT}/story`
  const staticOneUrl = `http://127.0.0.1:${STATIC_ONE_WORKER_PORT}/story`
  const bareUrls = servers.map((_, i) => `http://127.0.0.1:${BARE_NODE_PORT + i}/stories/${fixture.slug}`)
  // nginx's rows also count its workers' CPU per answer (rows 1a and 3 share the workers,
  // but take their turns apart).
  const nginxCpu = (master: number | undefined) => () => processCpuMs({ parent: master! })
  const [stat, statOne, cached, ...rest] = await alternating([staticUrl, staticOneUrl, edgeUrl, ...nodeUrls, ...bareUrls], CONNECTIONS, BROTLI, [nginxCpu(nginx.pid), nginxCpu(nginxOne.pid), nginxCpu(nginx.pid)])
  const nodes = rest.slice(0, servers.length)
  const bares = rest.slice(servers.length)
  const fmt = (r: Row) => `(p50 ${r.p50.toFixed(2)} ms, p99 ${r.p99.toFixed(2)} ms, ${(r.bytesPerRequest / 1024).toFixed(1)} KB/answer${r.cpuMicros === undefined ? '' : `, nginx CPU ${r.cpuMicros.toFixed(1)} µs/answer`})`
  const rate = (r: { perSecond: number }) => `${r.perSecond.toFixed(0).padStart(6)} req/s`
  console.log(`1a. nginx static, ${os.cpus().length} workers:  ${rate(stat!)} ${fmt(stat!)}`)
  console.log(`1b. nginx static, 1 worker:   ${rate(statOne!)} ${fmt(statOne!)}`)
  for (const [i, node] of nodes.entries()) {
    console.log(`2.  Node page cache, ${servers[i]!.processes} process(es): ${rate(node)} = ${(node.perSecond / stat!.perSecond).toFixed(2)} of 1a (target >= 0.85), ${(node.perSecond / statOne!.perSecond).toFixed(2)} of 1b ${fmt(node)}`)
  }
  for (const [i, b] of bares.entries()) {
    console.log(`2b. bare Node, same head and bytes, ${servers[i]!.processes} process(es): ${rate(b)} = ${(b.perSecond / stat!.perSecond).toFixed(2)} of 1a; the app's hit is ${(nodes[i]!.perSecond / b.perSecond).toFixed(2)} of it ${fmt(b)}`)
  }
  console.log(`3.  shipped nginx before Node (${fixture.processes} process(es)): ${rate(cached!)} = ${(cached!.perSecond / stat!.perSecond).toFixed(2)} of 1a (target >= 0.95) ${fmt(cached!)}; its CPU per answer is ${(cached!.cpuMicros! / stat!.cpuMicros!).toFixed(2)} of 1a's`)
  await uncachedRows(servers, fixture.readerCookie)
  console.log(`load average after the run ${os.loadavg().map(l => l.toFixed(1)).join(' ')}`)
  const js = await firstLoad(storyUrl)
  console.log(`5. first-load JS: ${js.files.length} files, ${(js.totalGzip / 1024).toFixed(1)} KB gzip (target < 120 KB)`)
  console.log(`6. story page on the wire: ${(wire.br / 1024).toFixed(1)} KB Brotli, ${(wire.gzip / 1024).toFixed(1)} KB gzip, ${(wire.none / 1024).toFixed(1)} KB uncompressed (target <= 40 KB)`)
}
finally {
  nginx?.kill('SIGQUIT')
  nginxOne?.kill('SIGQUIT')
  for (const child of bare) child.kill('SIGTERM')
  await fixture.stop()
}
