// Issue 19 item 4: two app servers sharing one page cache in Redis (PAGE_CACHE=redis).
// A page one server rendered is a hit on the other, and an edit made through one
// server reaches both servers' very next answers: the shared copy is dropped once,
// for everyone, without waiting for the servers' polling (set to ten minutes here).
import type { ChildProcess } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv, redisUrl } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { startRedis } from '../../scripts/lib/redis'
import { Client, DEMO_PASSWORD, testServerExtra } from '../support/http'
import { closeTestDb } from '../support/db'
import { createStory, publishStory, storyBench, storyBody, transition } from '../support/stories'
import { DEMO, expectOk } from '../support/workspace'

const env = localEnv('test')
const ports = [env.app.port + 5, env.app.port + 6]
const bases = ports.map(port => `http://127.0.0.1:${port}`)
const started: ChildProcess[] = []

beforeAll(async () => {
  const redis = await startRedis(env)
  if (redis) started.push(redis)
  const extra = { ...testServerExtra(), PAGE_CACHE: 'redis', REDIS_URL: redisUrl(env), PAGE_CACHE_POLL_MS: '600000' }
  for (const port of ports) started.push(await startApp(env, extra, port))
}, 90_000)

afterAll(async () => {
  for (const child of started.reverse()) await killGroup(child)
  await closeTestDb()
})

async function page(base: string, path: string) {
  const res = await fetch(base + path, { headers: { 'accept': 'text/html', 'accept-encoding': 'br' } })
  return { status: res.status, cache: res.headers.get('x-page-cache'), encoding: res.headers.get('content-encoding'), html: await res.text() }
}

describe('two app servers sharing the page cache in Redis', () => {
  it('share each page, and an edit on one is in both servers\' next answers', async () => {
    const editor = new Client(bases[0])
    expectOk(await editor.post('/api/auth/login', { email: DEMO.editor, password: DEMO_PASSWORD }))
    const bench = await storyBench(editor)
    const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench), deck: 'The deck both servers keep.' })
    await publishStory(editor, story.id)
    const path = `/stories/${story.slug}`

    const first = await page(bases[0]!, path)
    expect(first.status).toBe(200)
    expect(first.cache).toBe('miss')
    expect(first.encoding).toBe('br')
    expect(first.html).toContain('The deck both servers keep.')
    // Rendered once on the first server, kept once, served by the second.
    const other = await page(bases[1]!, path)
    expect(other.cache).toBe('hit')
    expect(other.html).toBe(first.html)

    const current = expectOk(await editor.get(`/api/stories/${story.id}`)).story
    expectOk(await editor.patch(`/api/stories/${story.id}`, { version: current.version, deck: 'The deck after the edit.' }))
    // Readers see the published edition only: the edit reaches them as a correction.
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'publish_correction', { note: 'The deck was reworded.' }))
    for (const base of [bases[1]!, bases[0]!]) {
      const next = await page(base, path)
      expect(next.status, base).toBe(200)
      expect(next.html, base).toContain('The deck after the edit.')
      expect(next.html, base).not.toContain('The deck both servers keep.')
    }
    expect((await page(bases[1]!, path)).cache).toBe('hit')
  }, 120_000)
})
