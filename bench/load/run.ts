// Load benchmark, run on demand (not a test), loopback only, 60 s bounded:
//   flock /tmp/pullsheet-test.lock npx tsx bench/load/run.ts
// Starts the built server with the test services (bench/load/stack.ts), publishes one
// story and gives the demo writer drafts (synthetic pulls, invented data), then runs
// mixed traffic at once: readers on the story page, search and the data download,
// and writers autosaving their drafts with the version each save returned.
// Prints requests/s, p50/p95/p99, errors and the server's memory (VmRSS); figures go
// into docs/bench/load.md.
import { readFileSync } from 'node:fs'
import { signedIn } from '../../tests/support/http'
import { createStory, storyBench, storyBody, transition } from '../../tests/support/stories'
import { expectOk } from '../../tests/support/workspace'
import { wrk } from '../wrk'
import { withTestStack } from './stack'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 60)
const READER_CONNECTIONS = Number(process.env.BENCH_READERS ?? 40)
const WRITERS = Number(process.env.BENCH_WRITERS ?? 6)
/** Autosaves per second over all writers: far above typing pace, to load the write path. */
const AUTOSAVE_RATE = Number(process.env.BENCH_AUTOSAVE_RATE ?? 30)

const lua = (s: string) => JSON.stringify(s) // a JSON string literal is a valid Lua one for our text

function rssMb(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find(l => l.startsWith('VmRSS:'))!
  return Number(line.replace(/\D+/g, '')) / 1024
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

  const origin = new URL(base).origin
  // Readers go round four addresses, as browsers do (Brotli accepted).
  const readerPaths = [
    [`/stories/${published.slug}`, 'text/html'],
    ['/api/magazine/search?q=cam', 'application/json'],
    [`/api/magazine/stories/${published.slug}/data.csv`, 'text/csv'],
    ['/search?q=long-duration', 'text/html'],
  ]
  const readers = wrk(base, {
    connections: READER_CONNECTIONS,
    seconds: SECONDS,
    headers: { 'accept-encoding': 'gzip, deflate, br' },
    lua: `
local paths = { ${readerPaths.map(([path, accept]) => `{ ${lua(path!)}, ${lua(accept!)} }`).join(', ')} }
local n = 0
request = function()
  n = n + 1
  local p = paths[(n % #paths) + 1]
  return wrk.format("GET", p[1], { accept = p[2] })
end`,
  }).then(r => ({ name: 'readers', ...r }))
  // Each writer thread owns one draft and saves it with the version its last save returned
  // (or the current one a 409 names); delay() paces all of them to AUTOSAVE_RATE.
  const writers = wrk(base, {
    connections: WRITERS,
    threads: WRITERS,
    seconds: SECONDS,
    luaSetup: `
local drafts = { ${drafts.map(d => `{ ${d.id}, ${d.version} }`).join(', ')} }
local next_draft = 0
setup = function(thread)
  next_draft = next_draft + 1
  thread:set("draft_id", drafts[next_draft][1])
  thread:set("draft_version", drafts[next_draft][2])
end`,
    lua: `
local text = ${lua(JSON.stringify(storyBody(writerBench)).slice(1, -1))}
request = function()
  local body = '{"version":' .. draft_version .. ',"autosave":true,"body":"' .. text .. '\\\\n\\\\nTyped at ' .. os.time() .. '."}'
  return wrk.format("PATCH", "/api/stories/" .. draft_id, { ["content-type"] = "application/json", cookie = ${lua(writer.cookie)}, origin = ${lua(origin)} }, body)
end
response = function(status, headers, body)
  -- The first refusal each writer meets is printed: a count of non-2xx alone says nothing.
  if status >= 300 and not told then told = true; io.stderr:write('writer answer ' .. status .. ': ' .. body:sub(1, 300) .. '\\n') end
  local v = body:match('"currentVersion":(%d+)') or body:match('"version":(%d+)')
  if v then draft_version = tonumber(v) end
end
delay = function() return ${Math.round(1000 * WRITERS / AUTOSAVE_RATE)} end`,
  }).then(r => ({ name: 'writers autosaving', ...r }))

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
  console.log('\n| traffic | requests | req/s | p50 ms | p95 ms | p99 ms | non-2xx | socket errors |\n| --- | --- | --- | --- | --- | --- | --- | --- |')
  for (const r of results) console.log(`| ${r.name} | ${r.requests} | ${r.perSecond.toFixed(0)} | ${r.p50.toFixed(1)} | ${r.p95.toFixed(1)} | ${r.p99.toFixed(1)} | ${r.badStatus} | ${r.socketErrors} |`)
  console.log(`\nserver RSS: ${report.memoryMb.start!.toFixed(0)} MB at start, ${report.memoryMb.peak.toFixed(0)} MB peak, ${report.memoryMb.end!.toFixed(0)} MB at the end; autosaves stored: ${report.autosavesStored}`)
})
