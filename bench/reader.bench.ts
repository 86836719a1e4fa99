// Reader benchmarks, run on demand (not a test), loopback only, bounded runs:
//   flock /tmp/pullsheet-test.lock npx tsx bench/reader.bench.ts
// Starts the test-profile app with a published three-graph story, then its own
// nginx (Debian package) under .data/bench with two servers: the story's HTML as
// a static file, and the documented cache (deploy/nginx/pullsheet.conf's story
// location) in front of the app. Measures, in one run:
//   1. nginx static file (the yardstick)           requests/s
//   2. cached story page from Node alone            >= 10 % of 1
//   3. the same page through the nginx cache         >= 80 % of 1
//   4. uncached story page (a signed-in reader: never cached), p95 at 10 concurrent < 80 ms
//   5. first-load JS of the story page               < 120 KB gzip
// `reader.bench.ts uncached` runs row 4 alone (no nginx), e.g. under a CPU profile.
import { spawnSync } from 'node:child_process'
import { chmodSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import autocannon from 'autocannon'
import { ROOT } from '../scripts/lib/env'
import { firstLoad } from './first-load'
import { readerFixture } from './reader-fixture'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const WARMUP_SECONDS = 3
const CONNECTIONS = 50
const STATIC_PORT = 8461
const CACHE_PORT = 8462
const dir = join(ROOT, '.data', 'bench', 'nginx')

function nginxConfig(appPort: number): string {
  // The story location of deploy/nginx/pullsheet.conf, on plain http for loopback.
  const deploy = readFileSync(join(ROOT, 'deploy/nginx/pullsheet.conf'), 'utf8')
  const map = /map \$http_cookie[\s\S]*?\n\}/.exec(deploy)![0]
  const story = /( {4}location ~ \^\/\(stories[\s\S]*?\n {4}\})/.exec(deploy)![1]!
  return `
daemon off;
worker_processes auto;
pid ${dir}/nginx.pid;
error_log ${dir}/error.log warn;
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
  upstream pullsheet_app { server 127.0.0.1:${appPort}; keepalive 32; }
  proxy_cache_path ${dir}/cache levels=1:2 keys_zone=pullsheet_pages:50m max_size=1g inactive=1d use_temp_path=off;
  ${map}
  server {
    listen 127.0.0.1:${STATIC_PORT};
    root ${dir}/static;
    location / { default_type text/html; try_files /story.html =404; }
  }
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

async function rps(url: string, headers: Record<string, string> = {}) {
  const r = await autocannon({ url, connections: CONNECTIONS, duration: SECONDS, headers })
  if (r.non2xx || r.errors) throw new Error(`${url}: ${r.non2xx} non-2xx, ${r.errors} errors`)
  return { rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99 }
}

/** p95 latency with exactly `concurrency` requests in flight, each timed on its own. */
async function latency(url: string, headers: Record<string, string>, concurrency: number, seconds: number) {
  const times: number[] = []
  const until = Date.now() + seconds * 1000
  await Promise.all(Array.from({ length: concurrency }, async () => {
    while (Date.now() < until) {
      const t = performance.now()
      const res = await fetch(url, { headers })
      await res.arrayBuffer()
      if (res.status !== 200 || res.headers.get('x-page-cache')) throw new Error(`uncached request got ${res.status} ${res.headers.get('x-page-cache')}`)
      times.push(performance.now() - t)
    }
  }))
  times.sort((a, b) => a - b)
  const at = (q: number) => times[Math.min(times.length - 1, Math.ceil(q * times.length) - 1)]!
  return { n: times.length, p50: at(0.5), p95: at(0.95), max: times[times.length - 1]! }
}

async function uncachedRow(storyUrl: string, cookie: string) {
  // The server's first seconds of rendering are its JIT warming up; like rows 1 to 3
  // (whose first seconds are a small part of a far larger count) the row reports a
  // running server: the same load for WARMUP_SECONDS first, not counted.
  await latency(storyUrl, { cookie }, 10, WARMUP_SECONDS)
  const uncached = await latency(storyUrl, { cookie }, 10, SECONDS)
  console.log(`4. uncached, 3 graphs, 10 concurrent: p50 ${uncached.p50.toFixed(1)} ms, p95 ${uncached.p95.toFixed(1)} ms, max ${uncached.max.toFixed(1)} ms (n = ${uncached.n}; target p95 < 80 ms)`)
}

const fixture = await readerFixture()
if (process.argv[2] === 'uncached') {
  try {
    await uncachedRow(`${fixture.base}/stories/${fixture.slug}`, fixture.readerCookie)
  }
  finally {
    await fixture.stop()
  }
  process.exit(0)
}
let nginx: ReturnType<typeof import('node:child_process').spawn> | undefined
try {
  const storyUrl = `${fixture.base}/stories/${fixture.slug}`
  const html = await (await fetch(storyUrl)).text()
  mkdirSync(join(dir, 'static'), { recursive: true })
  // nginx's workers drop root for "nobody": they must reach the folders and write the cache.
  for (const up of [join(ROOT, '.data'), join(ROOT, '.data', 'bench'), dir, join(dir, 'static')]) chmodSync(up, 0o755)
  for (const sub of ['cache', 'tmp-body', 'tmp-proxy', 'tmp-fastcgi', 'tmp-uwsgi', 'tmp-scgi']) {
    mkdirSync(join(dir, sub), { recursive: true })
    chmodSync(join(dir, sub), 0o777)
  }
  writeFileSync(join(dir, 'static', 'story.html'), html)
  writeFileSync(join(dir, 'nginx.conf'), nginxConfig(Number(new URL(fixture.base).port)))
  const check = spawnSync('nginx', ['-t', '-p', dir, '-c', join(dir, 'nginx.conf')], { encoding: 'utf8' })
  if (check.status !== 0) throw new Error(`nginx -t: ${check.stderr}`)
  const { spawn } = await import('node:child_process')
  nginx = spawn('nginx', ['-p', dir, '-c', join(dir, 'nginx.conf')], { stdio: 'inherit' })
  await new Promise(r => setTimeout(r, 500))

  const edgeUrl = `http://127.0.0.1:${CACHE_PORT}/stories/${fixture.slug}`
  await fetch(edgeUrl)
  const edge = await fetch(edgeUrl)
  console.log(`nginx cache status on the second request: ${edge.headers.get('x-edge-cache')}; node page cache: ${(await fetch(storyUrl)).headers.get('x-page-cache')}`)

  console.log(`${os.cpus().length} cores, ${os.cpus()[0]?.model}; ${CONNECTIONS} connections, ${SECONDS} s each; page ${(Buffer.byteLength(html) / 1024).toFixed(1)} KB`)
  const stat = await rps(`http://127.0.0.1:${STATIC_PORT}/story`)
  console.log(`1. nginx static file:       ${stat.rps.toFixed(0)} req/s (p50 ${stat.p50} ms, p99 ${stat.p99} ms)`)
  const node = await rps(storyUrl)
  console.log(`2. Node, page cache:        ${node.rps.toFixed(0)} req/s = ${(100 * node.rps / stat.rps).toFixed(1)} % of static (target >= 10 %)`)
  const cached = await rps(edgeUrl)
  console.log(`3. nginx cache before Node: ${cached.rps.toFixed(0)} req/s = ${(100 * cached.rps / stat.rps).toFixed(1)} % of static (target >= 80 %)`)
  await uncachedRow(storyUrl, fixture.readerCookie)
  const js = await firstLoad(storyUrl)
  console.log(`5. first-load JS: ${js.files.length} files, ${(js.totalGzip / 1024).toFixed(1)} KB gzip (target < 120 KB)`)
}
finally {
  nginx?.kill('SIGQUIT')
  await fixture.stop()
}
