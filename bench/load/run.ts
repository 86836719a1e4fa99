// Load benchmark, run on demand (not a test), loopback only, 60 s bounded:
//   flock /tmp/pullsheet-test.lock npx tsx bench/load/run.ts
// Starts the built server with the test services (bench/load/stack.ts), publishes one
// story and gives the demo writer drafts (synthetic pulls, invented data), then runs
// mixed traffic at once: readers on the story page, search and the data download,
// and writers autosaving their drafts with the version each save returned.
// Prints requests/s, p50/p95/p99, errors and the server's memory (VmRSS); figures go
// into docs/bench/load.md.
import { readFileSync } from 'node:fs'
import autocannon from 'autocannon'
import { signedIn } from '../../tests/support/http'
import { createStory, storyBench, storyBody, transition } from '../../tests/support/stories'
import { expectOk } from '../../tests/support/workspace'
import { withTestStack } from './stack'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 60)
const READER_CONNECTIONS = Number(process.env.BENCH_READERS ?? 40)
const WRITERS = Number(process.env.BENCH_WRITERS ?? 6)
/** Autosaves per second over all writers: far above typing pace, to load the write path. */
const AUTOSAVE_RATE = Number(process.env.BENCH_AUTOSAVE_RATE ?? 30)

interface Ctx { storyId?: number, version?: number }
interface RequestSpec {
  method?: string
  path: string
  headers?: Record<string, string>
  setupRequest?: (req: RequestSpec & { body?: string }, context: Ctx) => RequestSpec & { body?: string }
  onResponse?: (status: number, body: string, context: Ctx) => void
}
interface Instance { on: (event: 'response', fn: (client: unknown, status: number, bytes: number, ms: number) => void) => void }
interface Summary { requests: { average: number, total: number }, non2xx: number, errors: number, timeouts: number, statusCodeStats?: Record<string, { count: number }> }
type Start = (opts: Record<string, unknown>, done: (err: Error | null, result: Summary) => void) => Instance

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}

function rssMb(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find(l => l.startsWith('VmRSS:'))!
  return Number(line.replace(/\D+/g, '')) / 1024
}

function load(name: string, opts: Record<string, unknown>) {
  const latencies: number[] = []
  const statuses = new Map<number, number>()
  const done = new Promise<Summary>((resolve, reject) => {
    const instance = (autocannon as unknown as Start)({ duration: SECONDS, ...opts }, (err, result) => (err ? reject(err) : resolve(result)))
    instance.on('response', (_client, status, _bytes, ms) => {
      latencies.push(ms)
      statuses.set(status, (statuses.get(status) ?? 0) + 1)
    })
  })
  return done.then((summary) => {
    const sorted = latencies.sort((a, b) => a - b)
    return {
      name,
      requests: sorted.length,
      perSecond: sorted.length / SECONDS,
      p50: percentile(sorted, 50),
      p95: percentile(sorted, 95),
      p99: percentile(sorted, 99),
      non2xx: summary.non2xx,
      errors: summary.errors,
      timeouts: summary.timeouts,
      statuses: Object.fromEntries(statuses),
    }
  })
}

await withTestStack(async (vars, pid) => {
  process.env.TEST_BASE_URL = vars.TEST_BASE_URL
  const base = vars.TEST_BASE_URL!
  const editor = await signedIn('editor@example.com')
  const bench = await storyBench(editor)
  const published = await createStory(editor, bench.benchTestId, { body: storyBody(bench), deck: 'The published story the readers load.', tags: ['benchmark'] })
  expectOk(await transition(editor, published.id, 'submit'))
  expectOk(await editor.get(`/api/stories/${published.id}/number-check`))
  expectOk(await transition(editor, published.id, 'approve'))
  expectOk(await transition(editor, published.id, 'publish_now'))

  const writer = await signedIn('writer@example.com')
  const writerBench = await storyBench(writer)
  const drafts: { id: number, version: number }[] = []
  for (let i = 0; i < WRITERS; i++) {
    const story = await createStory(writer, writerBench.benchTestId, { body: storyBody(writerBench) })
    drafts.push({ id: story.id, version: story.version })
  }

  // Warm the page cache and the analysis cache the way the first reader would.
  for (const path of [`/stories/${published.slug}`, `/api/magazine/stories/${published.slug}/data.csv`]) await fetch(base + path)

  const free = drafts.map(d => ({ ...d }))
  const origin = new URL(base).origin
  const readers = load('readers', {
    url: base,
    connections: READER_CONNECTIONS,
    requests: [
      { path: `/stories/${published.slug}`, headers: { accept: 'text/html' } },
      { path: '/api/magazine/search?q=cam' },
      { path: `/api/magazine/stories/${published.slug}/data.csv` },
      { path: `/search?q=long-duration`, headers: { accept: 'text/html' } },
    ] satisfies RequestSpec[],
  })
  const writers = load('writers autosaving', {
    url: base,
    connections: WRITERS,
    overallRate: AUTOSAVE_RATE,
    requests: [{
      method: 'PATCH',
      path: '/api/stories/0',
      headers: { 'content-type': 'application/json', 'cookie': writer.cookie, origin },
      // autocannon resets a connection's context after each pass over `requests`,
      // so a draft and its version live in a pool: taken for a save, put back with the
      // version the save returned (or the current one a 409 names).
      setupRequest: (req, context) => {
        // An empty pool would mean a request was built twice; then a save may go stale (409, counted).
        const draft = free.shift() ?? { ...drafts[0]! }
        context.storyId = draft.id
        context.version = draft.version
        const text = `${storyBody(writerBench)}\n\nTyped at ${Date.now()}.`
        return { ...req, path: `/api/stories/${draft.id}`, body: JSON.stringify({ version: draft.version, autosave: true, body: text }) }
      },
      onResponse: (status, body, context) => {
        let version = context.version!
        try {
          const parsed = JSON.parse(body) as { story?: { version: number }, data?: { currentVersion?: number } }
          version = parsed.story?.version ?? parsed.data?.currentVersion ?? version
        }
        catch { /* keep the version it had */ }
        free.push({ id: context.storyId!, version })
      },
    }] satisfies RequestSpec[],
  })

  const memory: number[] = [rssMb(pid)]
  const sampler = setInterval(() => memory.push(rssMb(pid)), 1000)
  const results = await Promise.all([readers, writers])
  clearInterval(sampler)
  memory.push(rssMb(pid))

  const saved = await Promise.all(drafts.map(async d => expectOk(await writer.get(`/api/stories/${d.id}`)).story.version as number))
  const report = {
    seconds: SECONDS,
    readerConnections: READER_CONNECTIONS,
    writers: WRITERS,
    autosaveRate: AUTOSAVE_RATE,
    results,
    totalPerSecond: results.reduce((s, r) => s + r.perSecond, 0),
    memoryMb: { start: memory[0], peak: Math.max(...memory), end: memory.at(-1) },
    autosavesStored: saved.reduce((s, v, i) => s + v - drafts[i]!.version, 0),
  }
  console.log(JSON.stringify(report, null, 2))
  console.log('\n| traffic | requests | req/s | p50 ms | p95 ms | p99 ms | non-2xx | errors |\n| --- | --- | --- | --- | --- | --- | --- | --- |')
  for (const r of results) console.log(`| ${r.name} | ${r.requests} | ${r.perSecond.toFixed(0)} | ${r.p50} | ${r.p95} | ${r.p99} | ${r.non2xx} | ${r.errors + r.timeouts} |`)
  console.log(`\nserver RSS: ${report.memoryMb.start!.toFixed(0)} MB at start, ${report.memoryMb.peak.toFixed(0)} MB peak, ${report.memoryMb.end!.toFixed(0)} MB at the end; autosaves stored: ${report.autosavesStored}`)
})
