// One app server on two processes of one host (PULLSHEET_PROCESSES=2, server/cluster.mjs):
// each process keeps its own page cache, and an edit made through one process is in the
// very next answer of both, without waiting for the stories poll (set to ten minutes
// here): the process that made the change has the other drop its copy before it answers
// (server/utils/sibling-processes.ts).
import type { ChildProcess } from 'node:child_process'
import { request } from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { Client, DEMO_PASSWORD, testServerExtra } from '../support/http'
import { closeTestDb } from '../support/db'
import { createStory, publishStory, storyBench, storyBody, transition } from '../support/stories'
import { DEMO, expectOk } from '../support/workspace'

const env = localEnv('test')
const port = env.app.port + 8 // +1, +2, +5, +6 and +7 are other tests' servers
const base = `http://127.0.0.1:${port}`
let app: ChildProcess | undefined

beforeAll(async () => {
  app = await startApp(env, { ...testServerExtra(), PULLSHEET_PROCESSES: '2', PAGE_CACHE_POLL_MS: '600000' }, port)
}, 90_000)

afterAll(async () => {
  if (app) await killGroup(app)
  await closeTestDb()
})

/** An anonymous reader on a new connection each time, so the cluster hands it to the processes in turn. */
function page(path: string): Promise<{ status: number, cache: string | undefined, html: string }> {
  return new Promise((resolve, reject) => {
    request(`${base}${path}`, { agent: false, headers: { accept: 'text/html' } }, (res) => {
      let html = ''
      res.setEncoding('utf8')
      res.on('data', (chunk: string) => { html += chunk })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, cache: res.headers['x-page-cache'] as string | undefined, html }))
    }).on('error', reject).end()
  })
}

describe('one app server on two processes', () => {
  it('keeps a page cache per process, and an edit is in both processes\' next answers', async () => {
    const editor = new Client(base)
    expectOk(await editor.post('/api/auth/login', { email: DEMO.editor, password: DEMO_PASSWORD }))
    const bench = await storyBench(editor)
    const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench), deck: 'The deck both processes keep.' })
    await publishStory(editor, story.id)
    const path = `/stories/${story.slug}`

    // Each process renders the page once and keeps it: two misses, then only hits.
    const before: Awaited<ReturnType<typeof page>>[] = []
    while (before.filter(p => p.cache === 'miss').length < 2 && before.length < 40) before.push(await page(path))
    expect(before.filter(p => p.cache === 'miss')).toHaveLength(2)
    for (const p of before) expect(p.html).toContain('The deck both processes keep.')
    const kept = await Promise.all([page(path), page(path), page(path), page(path)])
    expect(kept.map(p => p.cache)).toEqual(['hit', 'hit', 'hit', 'hit'])

    const current = expectOk(await editor.get(`/api/stories/${story.id}`)).story
    expectOk(await editor.patch(`/api/stories/${story.id}`, { version: current.version, deck: 'The deck after the edit.' }))
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'publish_correction', { note: 'The deck was reworded.' }))
    const after: Awaited<ReturnType<typeof page>>[] = []
    for (let i = 0; i < 8; i++) after.push(await page(path))
    for (const p of after) {
      expect(p.status).toBe(200)
      expect(p.html).toContain('The deck after the edit.')
      expect(p.html).not.toContain('The deck both processes keep.')
    }
    // Both processes rendered the new edition once each.
    expect(after.filter(p => p.cache === 'miss')).toHaveLength(2)
  }, 120_000)
})
