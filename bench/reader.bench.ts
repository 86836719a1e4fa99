// Reader benchmarks, run on demand (not a test), loopback only, bounded runs:
//   flock /tmp/pullsheet-test.lock npx tsx bench/reader.bench.ts
// Starts the test-profile app with a published three-graph story, then its own
// nginx (Debian package) under .data/bench with two servers: the story page's bytes
// as a static file (the yardstick), and the shipped cache (deploy/nginx/pullsheet.conf's
// story location) in front of the app. Load comes from wrk (bench/wrk.ts), every
// request asking for Brotli as browsers do, so every row moves the same bytes.
// Measures, in one run:
//   1. nginx static file (the yardstick)                requests/s
//      1a. with worker_processes auto (one per core, 2 here), as Debian ships it
//      1b. with one worker: the same number of processes as the one Node process
//   2. cached story page from Node alone                >= 0.85 of row 1 (both ratios printed)
//   3. the same page through the shipped nginx config   >= 0.95 of row 1
//   4. uncached story page (a signed-in reader: never cached), p95 at 10 concurrent < 60 ms
//   5. first-load JS of the story page                  < 120 KB gzip
//   6. the story page on the wire                       <= 40 KB
// `reader.bench.ts uncached` runs row 4 alone (no nginx), e.g. under a CPU profile.
import { spawnSync } from 'node:child_process'
import { chmodSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import os from 'node:os'
import { join } from 'node:path'
import { ROOT } from '../scripts/lib/env'
import { firstLoad } from './first-load'
import { readerFixture } from './reader-fixture'
import { clean, wrk, type WrkResult } from './wrk'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const WARMUP_SECONDS = 3
const CONNECTIONS = 50
const STATIC_PORT = 8461
const CACHE_PORT = 8462
const STATIC_ONE_WORKER_PORT = 8463
const dir = join(ROOT, '.data', 'bench', 'nginx')

/** The yardstick with one worker: a second nginx, serving the same file the same way. */
function oneWorkerConfig(): string {
  return `
daemon off;
worker_processes 1;
pid ${dir}/nginx-one.pid;
error_log ${dir}/error-one.log warn;
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
    listen 127.0.0.1:${STATIC_ONE_WORKER_PORT};
    root ${dir}/static;
    default_type text/html;
    location = /story { add_header Content-Encoding br; add_header Vary Accept-Encoding; try_files /story.html.br =404; }
  }
}
`
}

function nginxConfig(appPort: number): string {
  // The story location of deploy/nginx/pullsheet.conf, on plain http for loopback.
  const deploy = readFileSync(join(ROOT, 'deploy/nginx/pullsheet.conf'), 'utf8')
  const maps = [/map \$http_cookie[\s\S]*?\n\}/, /map \$http_accept_encoding[\s\S]*?\n\}/].map(m => m.exec(deploy)![0]).join('\n')
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
  ${maps}
  server {
    listen 127.0.0.1:${STATIC_PORT};
    root ${dir}/static;
    default_type text/html;
    location = /story { add_header Content-Encoding br; add_header Vary Accept-Encoding; try_files /story.html.br =404; }
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

const BROTLI = { 'accept-encoding': 'gzip, deflate, br' }

async function rps(url: string) {
  return clean(url, await wrk(url, { connections: CONNECTIONS, seconds: SECONDS, headers: BROTLI }))
}

/** Each of two URLs in turn, twice, half the time each; requests/s over both halves, latency of the second. */
async function alternating(first: string, second: string): Promise<[WrkResult, WrkResult]> {
  const halves: [WrkResult[], WrkResult[]] = [[], []]
  for (let round = 0; round < 2; round++) {
    halves[0].push(clean(first, await wrk(first, { connections: CONNECTIONS, seconds: SECONDS / 2, headers: BROTLI })))
    halves[1].push(clean(second, await wrk(second, { connections: CONNECTIONS, seconds: SECONDS / 2, headers: BROTLI })))
  }
  const both = ([a, b]: WrkResult[]): WrkResult => ({ ...b!, requests: a!.requests + b!.requests, perSecond: (a!.requests + b!.requests) / (a!.requests / a!.perSecond + b!.requests / b!.perSecond) })
  return [both(halves[0]), both(halves[1])]
}

async function uncachedRow(storyUrl: string, cookie: string) {
  // The server's first seconds of rendering are its JIT warming up; like rows 1 to 3
  // (whose first seconds are a small part of a far larger count) the row reports a
  // running server: the same load for WARMUP_SECONDS first, not counted.
  const probe = await fetch(storyUrl, { headers: { cookie, ...BROTLI } })
  if (probe.status !== 200 || probe.headers.get('x-page-cache') || !/private/.test(probe.headers.get('cache-control') ?? '')) throw new Error(`the signed-in page must be private and uncached: ${probe.status} ${probe.headers.get('x-page-cache')} ${probe.headers.get('cache-control')}`)
  await wrk(storyUrl, { connections: 10, seconds: WARMUP_SECONDS, headers: { cookie, ...BROTLI } })
  const u = clean('uncached', await wrk(storyUrl, { connections: 10, seconds: SECONDS, headers: { cookie, ...BROTLI } }))
  console.log(`4. uncached, 3 graphs, 10 concurrent: p50 ${u.p50.toFixed(1)} ms, p95 ${u.p95.toFixed(1)} ms, p99 ${u.p99.toFixed(1)} ms (n = ${u.requests}, ${u.perSecond.toFixed(0)} req/s; target p95 < 60 ms)`)
}

async function wireBytes(url: string, encoding: string): Promise<number> {
  const { request } = await import('node:http')
  return new Promise((resolve, reject) => {
    request(url, { headers: { 'accept-encoding': encoding } }, (res) => {
      let n = 0
      res.on('data', (chunk: Buffer) => { n += chunk.byteLength })
      res.on('end', () => resolve(n))
    }).on('error', reject).end()
  })
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
let nginxOne: ReturnType<typeof import('node:child_process').spawn> | undefined
try {
  const storyUrl = `${fixture.base}/stories/${fixture.slug}`
  const brotli = await new Promise<Buffer>((resolve, reject) => {
    import('node:http').then(({ request }) => request(storyUrl, { headers: BROTLI }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => (res.headers['content-encoding'] === 'br' ? resolve(Buffer.concat(chunks)) : reject(new Error('the cached page came back without Brotli'))))
    }).on('error', reject).end(), reject)
  })
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
  const { spawn } = await import('node:child_process')
  nginx = spawn('nginx', ['-p', dir, '-c', join(dir, 'nginx.conf')], { stdio: 'inherit' })
  nginxOne = spawn('nginx', ['-p', dir, '-c', join(dir, 'nginx-one.conf')], { stdio: 'inherit' })
  await new Promise(r => setTimeout(r, 500))

  const edgeUrl = `http://127.0.0.1:${CACHE_PORT}/stories/${fixture.slug}`
  await fetch(edgeUrl, { headers: BROTLI })
  const edge = await fetch(edgeUrl, { headers: BROTLI })
  console.log(`nginx cache status on the second request: ${edge.headers.get('x-edge-cache')}; node page cache: ${(await fetch(storyUrl, { headers: BROTLI })).headers.get('x-page-cache')}`)
  const wire = { br: await wireBytes(storyUrl, 'br'), gzip: await wireBytes(storyUrl, 'gzip'), none: await wireBytes(storyUrl, 'identity') }

  console.log(`${os.cpus().length} cores, ${os.cpus()[0]?.model}; load average ${os.loadavg().map(l => l.toFixed(1)).join(' ')}; wrk ${CONNECTIONS} connections, 2 threads, ${SECONDS} s each, Brotli bytes (${(brotli.byteLength / 1024).toFixed(1)} KB) on every row`)
  const stat = await rps(`http://127.0.0.1:${STATIC_PORT}/story`)
  // Node and its one-worker yardstick take turns (two halves each), so a change in the
  // machine's other load during the run moves both alike.
  const [statOne, node] = await alternating(`http://127.0.0.1:${STATIC_ONE_WORKER_PORT}/story`, storyUrl)
  const fmt = (r: { perSecond: number, p50: number, p99: number, bytesPerRequest: number }) => `(p50 ${r.p50.toFixed(2)} ms, p99 ${r.p99.toFixed(2)} ms, ${(r.bytesPerRequest / 1024).toFixed(1)} KB/answer)`
  const rate = (r: { perSecond: number }) => `${r.perSecond.toFixed(0).padStart(6)} req/s`
  console.log(`1a. nginx static, ${os.cpus().length} workers:  ${rate(stat)} ${fmt(stat)}`)
  console.log(`1b. nginx static, 1 worker:   ${rate(statOne)} ${fmt(statOne)}`)
  console.log(`2.  Node page cache, 1 process: ${rate(node)} = ${(node.perSecond / statOne.perSecond).toFixed(2)} of 1b (same process count), ${(node.perSecond / stat.perSecond).toFixed(2)} of 1a (target >= 0.85) ${fmt(node)}`)
  const cached = await rps(edgeUrl)
  console.log(`3.  shipped nginx before Node: ${rate(cached)} = ${(cached.perSecond / stat.perSecond).toFixed(2)} of 1a (target >= 0.95) ${fmt(cached)}`)
  await uncachedRow(storyUrl, fixture.readerCookie)
  const js = await firstLoad(storyUrl)
  console.log(`5. first-load JS: ${js.files.length} files, ${(js.totalGzip / 1024).toFixed(1)} KB gzip (target < 120 KB)`)
  console.log(`6. story page on the wire: ${(wire.br / 1024).toFixed(1)} KB Brotli, ${(wire.gzip / 1024).toFixed(1)} KB gzip, ${(wire.none / 1024).toFixed(1)} KB uncompressed (target <= 40 KB)`)
}
finally {
  nginx?.kill('SIGQUIT')
  nginxOne?.kill('SIGQUIT')
  await fixture.stop()
}
