// Scheduled publishing with two app servers on one database: each story goes live
// exactly once, with one audit row and one e-mail, whichever server claims the job.
import type { ChildProcess } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { Client, signedIn, spareAppPort, testServerExtra } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'
import { sleep, until } from '../support/wait'

const SECOND_PORT = spareAppPort(1)
let second: ChildProcess | undefined
let writer: { client: Client, email: string }
let editorA: Client
let editorB: Client
let bench: StoryBench

beforeAll(async () => {
  const extra = testServerExtra()
  second = await startApp(localEnv('test'), extra, SECOND_PORT)
  writer = await newWriter()
  editorA = await signedIn(DEMO.editor)
  editorB = new Client(`http://127.0.0.1:${SECOND_PORT}`)
  expectOk(await editorB.post('/api/auth/login', { email: DEMO.editor, password: 'pullsheet-demo' }))
  bench = await storyBench(writer.client)
})

afterAll(async () => {
  if (second) await killGroup(second)
  await closeTestDb()
})

async function approvedStory(): Promise<{ id: number, headline: string }> {
  const story = await createStory(writer.client, bench.benchTestId, { body: storyBody(bench) })
  await testDb()('stories').where('id', story.id).update({ state: 'approved' })
  return story
}

describe('scheduled publishing', () => {
  it('publishes each of several stories due at the same moment exactly once, with two servers racing', async () => {
    const stories = await Promise.all(Array.from({ length: 6 }, approvedStory))
    const at = new Date(Date.now() + 3000).toISOString()
    for (const [i, s] of stories.entries()) {
      // Scheduled through both servers; the job rows are the same either way.
      expectOk(await transition(i % 2 ? editorB : editorA, s.id, 'schedule', { scheduledAt: at }))
    }
    // A job queued twice for one story (a retried request, a replayed row) must still publish once.
    const [dup] = await testDb()('jobs').where('kind', 'publish-story').whereRaw('JSON_VALUE(payload, \'$.storyId\') = ?', [stories[0]!.id]).select('kind', 'payload', 'run_at', 'max_attempts')
    await testDb()('jobs').insert([dup, dup])

    const ids = stories.map(s => s.id)
    await until('all six published', async () => {
      const rows = await testDb()('stories').whereIn('id', ids).where('state', 'published').count({ n: '*' }).first()
      return Number(rows!.n) === ids.length
    }, 20_000)
    await sleep(1500) // time for a late duplicate to show itself

    for (const s of stories) {
      const audit = await testDb()('story_transitions').where({ story_id: s.id, to_state: 'published' })
      expect(audit, `story ${s.id}`).toHaveLength(1)
      expect(audit[0]).toMatchObject({ action: 'scheduled_publish', from_state: 'scheduled', user_id: null })
      const mails = await testDb()('mail_outbox').where({ subject: `Story published: ${s.headline}`, to_address: writer.email })
      expect(mails, `story ${s.id}`).toHaveLength(1)
      const row = await testDb()('stories').where('id', s.id).first('published_at', 'scheduled_at')
      expect(row.scheduled_at).toBeNull()
      expect(new Date(row.published_at).getTime()).toBeGreaterThanOrEqual(new Date(at).getTime())
      const jobs = await testDb()('jobs').where('kind', 'publish-story').whereRaw('JSON_VALUE(payload, \'$.storyId\') = ?', [s.id]).pluck('status')
      expect(jobs.every((status: string) => status === 'done'), `jobs of story ${s.id}: ${jobs}`).toBe(true)
    }
    const published = expectOk(await writer.client.get(`/api/stories/${ids[0]}/transitions`)).transitions.at(-1)
    expect(published).toMatchObject({ action: 'scheduled_publish', by: null, toState: 'published' })
  })

  it('skips a story taken off the schedule, and publishes a rescheduled one at its new time only', async () => {
    const off = await approvedStory()
    const moved = await approvedStory()
    const soon = new Date(Date.now() + 2000).toISOString()
    expectOk(await transition(editorA, off.id, 'schedule', { scheduledAt: soon }))
    expectOk(await transition(editorA, off.id, 'unschedule'))
    expectOk(await transition(editorA, moved.id, 'schedule', { scheduledAt: soon }))
    expectOk(await transition(editorA, moved.id, 'unschedule'))
    const later = new Date(Date.now() + 5000).toISOString()
    expectOk(await transition(editorB, moved.id, 'schedule', { scheduledAt: later }))

    // The first time passes: both old jobs run and find nothing to publish.
    await until('the early jobs done', async () => {
      const statuses = await testDb()('jobs').where('kind', 'publish-story').whereRaw('JSON_VALUE(payload, \'$.scheduledAt\') = ?', [soon]).pluck('status')
      return statuses.length === 2 && statuses.every((s: string) => s === 'done')
    }, 15_000)
    expect((await testDb()('stories').where('id', off.id).first('state')).state).toBe('approved')
    expect((await testDb()('stories').where('id', moved.id).first('state')).state).toBe('scheduled')

    await until('the moved story published', async () => (await testDb()('stories').where('id', moved.id).first('state')).state === 'published', 15_000)
    const row = await testDb()('stories').where('id', moved.id).first('published_at')
    expect(new Date(row.published_at).getTime()).toBeGreaterThanOrEqual(new Date(later).getTime())
    expect(await testDb()('story_transitions').where({ story_id: moved.id, to_state: 'published' })).toHaveLength(1)
    expect(await testDb()('story_transitions').where({ story_id: off.id, to_state: 'published' })).toHaveLength(0)
  })

  it('publishes an overdue story (its time passed while no server took the job) on the next round', async () => {
    const story = await approvedStory()
    const past = new Date(Date.now() - 3_600_000)
    // As left by servers that were down at the time: scheduled, its job long due.
    await testDb()('stories').where('id', story.id).update({ state: 'scheduled', scheduled_at: past })
    await testDb()('jobs').insert({ kind: 'publish-story', payload: JSON.stringify({ storyId: story.id, scheduledAt: past.toISOString() }), run_at: past })
    await until('the overdue story published', async () => (await testDb()('stories').where('id', story.id).first('state')).state === 'published', 10_000)
    expect(await testDb()('story_transitions').where({ story_id: story.id, to_state: 'published' })).toHaveLength(1)
  })
})
