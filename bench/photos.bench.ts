// Photo benchmark (issue 5; not a timed test). Run under the test lock, it uses
// the test ports and a throwaway data folder:
//   flock /tmp/pullsheet-test.lock npx tsx bench/photos.bench.ts
// Targets: a 24 MP JPEG processed while the built server keeps answering page
// requests with p95 under 100 ms and no event-loop stall over 50 ms (measured
// inside the server with perf_hooks.monitorEventLoopDelay, GET /api/admin/runtime);
// the server's memory (RSS, which includes its worker threads) back under 300 MB
// after a batch of 10 such photos. Writes the figures to docs/bench/photos.md.
import { cpus, loadavg, totalmem } from 'node:os'
import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import knex, { type Knex } from 'knex'
import { Jimp } from 'jimp'
import { knexConfig } from '../server/db/knex-config'
import { startApp } from '../scripts/lib/app'
import { buildIfNeeded } from '../scripts/lib/build'
import { migrate, seed } from '../scripts/lib/database'
import { localEnv, ROOT, serverEnv } from '../scripts/lib/env'
import { killGroup } from '../scripts/lib/proc'
import { startServices } from '../scripts/lib/services'
import { Client } from '../tests/support/http'

const WIDTH = 6000
const HEIGHT = 4000
const BATCH = 10
const QUIET_LOAD = 1.5

const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? Number.NaN
const round = (n: number) => Math.round(n * 10) / 10

/** A 24 MP picture with gradients and grain: sizes and decodes like a camera file. */
async function cameraLikeJpeg(): Promise<Buffer> {
  const image = new Jimp({ width: WIDTH, height: HEIGHT })
  const d = image.bitmap.data
  let s = 7
  for (let y = 0; y < HEIGHT; y++) {
    for (let x = 0; x < WIDTH; x++) {
      s = (s * 1103515245 + 12345) & 0x7FFFFFFF
      const grain = (s >> 16) & 15
      const i = (y * WIDTH + x) * 4
      d[i] = ((x * 255) / WIDTH + grain) & 255
      d[i + 1] = ((y * 255) / HEIGHT + grain) & 255
      d[i + 2] = (((x + y) * 127) / (WIDTH + HEIGHT) + 64 + grain) & 255
      d[i + 3] = 255
    }
  }
  return image.getBuffer('image/jpeg', { quality: 88 })
}

/** The same pixels with a different comment segment: a different file (SHA-256), the same work. */
function variantOf(jpeg: Buffer, n: number): Buffer {
  const text = Buffer.from(`fictional batch photo ${n}`)
  const com = Buffer.concat([Buffer.from([0xFF, 0xFE, 0, text.length + 2]), text])
  return Buffer.concat([jpeg.subarray(0, 2), com, jpeg.subarray(2)])
}

function upload(client: Client, benchTestId: number, bytes: Buffer, name: string) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/jpeg' }), name)
  return client.request('POST', `/api/bench-tests/${benchTestId}/photos`, { body: form })
}

async function waitReady(client: Client, benchTestId: number, count: number, timeoutMs = 15 * 60_000): Promise<void> {
  const end = Date.now() + timeoutMs
  while (Date.now() < end) {
    const photos = (await client.get(`/api/bench-tests/${benchTestId}/photos`)).body.photos as { status: string, failureReason: string | null }[]
    const failed = photos.find(p => p.status === 'failed')
    if (failed) throw new Error(`a photo failed: ${failed.failureReason}`)
    if (photos.filter(p => p.status === 'ready').length >= count) return
    await sleep(250)
  }
  throw new Error('photos were not ready in time')
}

/** Page requests (the home page, server-rendered) two at a time until stopped; latencies in ms. */
function pageLoad(base: string) {
  const latencies: number[] = []
  let running = true
  const loop = async () => {
    while (running) {
      const t0 = performance.now()
      const res = await fetch(`${base}/`)
      await res.arrayBuffer()
      if (res.status !== 200) throw new Error(`page answered ${res.status}`)
      latencies.push(performance.now() - t0)
      await sleep(40)
    }
  }
  const loops = [loop(), loop()]
  return {
    async stop() {
      running = false
      await Promise.all(loops)
      const sorted = [...latencies].sort((a, b) => a - b)
      return { requests: sorted.length, p50: round(percentile(sorted, 50)), p95: round(percentile(sorted, 95)), max: round(sorted.at(-1) ?? Number.NaN) }
    },
  }
}

interface Scenario {
  mode: string
  uploadMs: number
  processMs: number
  idle: Awaited<ReturnType<ReturnType<typeof pageLoad>['stop']>>
  idleStallMs: number
  busy: Awaited<ReturnType<ReturnType<typeof pageLoad>['stop']>>
  busyStall: { maxDelayMs: number, p99DelayMs: number }
  batchMs: number
  batchPages: Awaited<ReturnType<ReturnType<typeof pageLoad>['stop']>>
  batchStallMs: number
  rssBefore: number
  rssPeak: number
  rssAfter: number
}

/** One server with the given photo worker mode: a single photo under page load, then a batch of ten. */
async function scenario(mode: 'process' | 'thread', photo: Buffer, db: Knex): Promise<Scenario> {
  const app = await startApp(benchEnv, { PHOTO_WORKERS: '1', PHOTO_WORKER_MODE: mode })
  try {
    const base = benchEnv.app.baseUrl
    const admin = new Client(base)
    const writer = new Client(base)
    await admin.post('/api/auth/login', { email: 'admin@example.com', password: 'pullsheet-demo' })
    await writer.post('/api/auth/login', { email: 'writer@example.com', password: 'pullsheet-demo' })
    const runtime = async () => (await admin.get('/api/admin/runtime')).body
    const writerId = (await writer.get('/api/auth/me')).body.user.id
    const [benchTestId] = await db('bench_tests').insert({ slug: `photo-bench-${mode}-${Date.now()}`, title: `Photo benchmark, ${mode} (fictional)`, engine_family: 'pushrod-v8', part_type: 'camshaft', owner_id: writerId, notes: '' })
    const bench = Number(benchTestId)

    for (let i = 0; i < 20; i++) await (await fetch(`${base}/`)).arrayBuffer() // warm the renderer
    await admin.post('/api/admin/runtime/reset')
    const idleLoad = pageLoad(base)
    await sleep(5000)
    const idle = await idleLoad.stop()
    const idleRuntime = await runtime()

    // One 24 MP photo, with page requests all along.
    await admin.post('/api/admin/runtime/reset')
    const load = pageLoad(base)
    const t0 = performance.now()
    const first = await upload(writer, bench, photo, `bench-${mode}-24mp.jpg`)
    if (first.status !== 201) throw new Error(`upload answered ${first.status}: ${JSON.stringify(first.body)}`)
    const uploadMs = performance.now() - t0
    await waitReady(writer, bench, 1)
    const processMs = performance.now() - t0
    const busy = await load.stop()
    const during = await runtime()

    // A batch of ten, two uploads at a time; memory sampled while it runs.
    let rssPeak = 0
    let sampling = true
    const sampler = (async () => {
      while (sampling) {
        rssPeak = Math.max(rssPeak, (await runtime()).memory.rssMb)
        await sleep(500)
      }
    })()
    await admin.post('/api/admin/runtime/reset')
    const batchLoad = pageLoad(base)
    const b0 = performance.now()
    for (let i = 0; i < BATCH; i += 2) {
      await Promise.all([i, i + 1].map(n => upload(writer, bench, variantOf(photo, n), `batch-${mode}-${n}.jpg`)))
    }
    await waitReady(writer, bench, 1 + BATCH)
    const batchMs = performance.now() - b0
    const batchPages = await batchLoad.stop()
    const batchRuntime = await runtime()
    sampling = false
    await sampler
    await sleep(5000)
    const after = await runtime()
    return {
      mode, uploadMs, processMs, idle, idleStallMs: idleRuntime.eventLoop.maxDelayMs, busy, busyStall: during.eventLoop,
      batchMs, batchPages, batchStallMs: batchRuntime.eventLoop.maxDelayMs,
      rssBefore: idleRuntime.memory.rssMb, rssPeak: round(rssPeak), rssAfter: after.memory.rssMb,
    }
  }
  finally {
    await killGroup(app)
  }
}

const env = localEnv('test')
rmSync(env.dataDir, { recursive: true, force: true })
const benchEnv = localEnv('test')
const settings = serverEnv(benchEnv)
await buildIfNeeded()
const services = await startServices(benchEnv)
const db = knex(knexConfig(settings.DATABASE_URL!))
try {
  await migrate(settings.DATABASE_URL!)
  await seed(settings.DATABASE_URL!)
  console.log(`making a ${WIDTH} x ${HEIGHT} JPEG...`)
  const photo = await cameraLikeJpeg()
  console.log(`photo: ${(photo.length / 1024 / 1024).toFixed(1)} MB`)
  // Latency figures mean little while other work fills both cores: wait (up to 15 minutes) for a quiet machine.
  for (const end = Date.now() + 15 * 60_000; loadavg()[0]! > QUIET_LOAD && Date.now() < end;) {
    console.log(`waiting for a quiet machine (load average ${loadavg()[0]!.toFixed(2)})...`)
    await sleep(20_000)
  }
  const loadBefore = loadavg()[0]!
  const child = await scenario('process', photo, db)
  console.log(child)
  const thread = await scenario('thread', photo, db)
  console.log(thread)
  const loadAfter = loadavg()[0]!

  const verdict = (ok: boolean) => (ok ? 'met' : 'NOT met')
  const row = (label: string, value: (s: Scenario) => string, target = '—') => `| ${label} | ${value(child)} | ${value(thread)} | ${target} |`
  const lines = [
    '# Photo benchmark',
    '',
    `Measured by \`bench/photos.bench.ts\` on ${new Date().toISOString().slice(0, 10)}: ${cpus().length} cores, ${Math.round(totalmem() / 1024 ** 3)} GB, Node ${process.version}, the built server (\`.output\`) with one photo worker at a time (\`PHOTO_WORKERS=1\`), real MariaDB and s3rver on the same machine. Photo: ${WIDTH} x ${HEIGHT} px (24 MP), ${(photo.length / 1024 / 1024).toFixed(1)} MB JPEG, synthetic (gradients and grain). Page load: two clients requesting the server-rendered home page back to back (40 ms pause). Event-loop stalls are measured inside the server (perf_hooks.monitorEventLoopDelay, 10 ms resolution, \`GET /api/admin/runtime\`).`,
    '',
    `Load average (1 min) when the run started / ended: ${loadBefore.toFixed(2)} / ${loadAfter.toFixed(2)} (the benchmark itself adds about 1.5: a worker at full tilt, s3rver, MariaDB, its own clients). Other engineers' builds and tests share this machine; a run with a high starting load is not representative.`,
    '',
    'Two worker modes, the same worker file: a short-lived child process per photo (the default) and a worker thread per photo (`PHOTO_WORKER_MODE=thread`).',
    '',
    '## One 24 MP photo while pages are served',
    '',
    '| figure | child process (default) | worker thread | target |',
    '| --- | --- | --- | --- |',
    row('upload answered (pending photo)', s => `${Math.round(s.uploadMs)} ms`, 'at once'),
    row('upload to all four web sizes ready', s => `${(s.processMs / 1000).toFixed(1)} s`),
    row('page requests served meanwhile', s => String(s.busy.requests)),
    row('page latency p50 / p95 / max', s => `${s.busy.p50} / ${s.busy.p95} / ${s.busy.max} ms`, `p95 < 100 ms: ${verdict(child.busy.p95 < 100)} (default)`),
    row('same, server idle (5 s before)', s => `${s.idle.p50} / ${s.idle.p95} / ${s.idle.max} ms`),
    row('longest event-loop stall in the server', s => `${s.busyStall.maxDelayMs} ms (p99 ${s.busyStall.p99DelayMs} ms)`, `< 50 ms: ${verdict(child.busyStall.maxDelayMs < 50)} (default)`),
    row('same, server idle (5 s before)', s => `${s.idleStallMs} ms`),
    '',
    `## A batch of ${BATCH} such photos`,
    '',
    '| figure | child process (default) | worker thread | target |',
    '| --- | --- | --- | --- |',
    row(`${BATCH} photos uploaded (two at a time) to all ready`, s => `${(s.batchMs / 1000).toFixed(1)} s (${(s.batchMs / 1000 / BATCH).toFixed(1)} s a photo)`),
    row('page latency p50 / p95 / max meanwhile', s => `${s.batchPages.p50} / ${s.batchPages.p95} / ${s.batchPages.max} ms`),
    row('longest event-loop stall meanwhile', s => `${s.batchStallMs} ms`),
    row('server RSS before / peak while sizing / 5 s after', s => `${s.rssBefore} / ${s.rssPeak} / ${s.rssAfter} MB`, `after < 300 MB: ${verdict(child.rssAfter < 300)} (default)`),
    '',
    'RSS is the server process (a worker thread\'s memory counts in it, a child process\'s does not: a',
    'child peaks at about 900 MB for a 24 MP photo and gives all of it back when it exits). A thread\'s',
    'allocations stay in the process\'s malloc arenas after the thread ends, so the server keeps them.',
    '',
  ]
  mkdirSync(join(ROOT, 'docs', 'bench'), { recursive: true })
  writeFileSync(join(ROOT, 'docs', 'bench', 'photos.md'), lines.join('\n'))
  console.log(lines.join('\n'))
}
finally {
  await db.destroy()
  await services.stop()
}
