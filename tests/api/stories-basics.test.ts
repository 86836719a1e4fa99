// Stories: create, read, save with versions, autosave, revisions, IDOR.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { STORY_LIMITS } from '#shared/types/stories'
import type { Client } from '../support/http'
import { signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, type StoryBench } from '../support/stories'

afterAll(closeTestDb)

let writer: Client
let writerId: number
let other: Client
let editor: Client
let bench: StoryBench

beforeAll(async () => {
  const w = await newWriter()
  writer = w.client
  writerId = w.id
  other = (await newWriter()).client
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(writer)
})

describe('creating a story', () => {
  it('makes a draft on the writer\'s bench test with the writer as byline and a created revision', async () => {
    const story = await createStory(writer, bench.benchTestId, { headline: 'Cam swap on the test engine', tags: ['Camshaft', 'camshaft', 'V8'] })
    expect(story).toMatchObject({ state: 'draft', version: 1, benchTestId: bench.benchTestId, engineFamily: 'pushrod-v8', partType: 'exhaust', tags: ['camshaft', 'v8'], mayEdit: true, allowedActions: ['submit'] })
    expect(story.bylines).toEqual([{ userId: writerId, displayName: 'Test writer' }])
    expect(story.slug).toMatch(/^cam-swap-on-the-test-engine(-\d+)?$/)
    const revisions = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
    expect(revisions.map((r: any) => r.kind)).toEqual(['created'])
  })

  it('gives a second story with the same headline the next free slug', async () => {
    const a = await createStory(writer, bench.benchTestId, { headline: 'Same headline twice' })
    const b = await createStory(writer, bench.benchTestId, { headline: 'Same headline twice' })
    expect(b.slug).not.toBe(a.slug)
    expect(b.slug.startsWith(a.slug)).toBe(true)
  })

  it('refuses a bench test the writer cannot reach with 404', async () => {
    const res = await other.post('/api/stories', { benchTestId: bench.benchTestId, headline: 'Not mine' })
    expect(res.status).toBe(404)
  })

  it('refuses a writer taking themselves off the bylines, and bylines that are not writers', async () => {
    const reader = (await newWriter('reader')).id
    const res = await writer.post('/api/stories', { benchTestId: bench.benchTestId, headline: 'X', bylineIds: [reader] })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('bylineIds')
  })

  it('refuses readers (403) and signed-out callers (401)', async () => {
    const reader = await signedIn(DEMO.reader)
    expect((await reader.get('/api/stories')).status).toBe(403)
    expect((await reader.post('/api/stories', { benchTestId: bench.benchTestId, headline: 'X' })).status).toBe(403)
    const { Client } = await import('../support/http')
    expect((await new Client().get('/api/stories')).status).toBe(401)
  })
})

describe('another writer\'s story (IDOR)', () => {
  let storyId: number
  beforeAll(async () => {
    storyId = (await createStory(writer, bench.benchTestId, { body: storyBody(bench) })).id
  })

  it.each([
    ['GET', ''],
    ['PATCH', ''],
    ['GET', '/revisions'],
    ['GET', '/notes'],
    ['POST', '/notes'],
    ['GET', '/transitions'],
    ['POST', '/transitions'],
    ['POST', '/lock'],
    ['DELETE', '/lock'],
    ['GET', '/figures'],
    ['GET', '/number-check'],
    ['GET', '/preview-links'],
    ['POST', '/preview-links'],
  ])('%s /api/stories/:id%s is 404 for another writer', async (method, path) => {
    const json = method === 'PATCH' ? { version: 1, headline: 'Taken' } : method === 'POST' ? (path === '/notes' ? { body: 'hi' } : path === '/transitions' ? { action: 'submit', version: 1 } : {}) : undefined
    const res = await other.request(method, `/api/stories/${storyId}${path}`, json === undefined ? {} : { json })
    expect(res.status).toBe(404)
  })

  it('leaves the story out of the other writer\'s list and in the editor\'s', async () => {
    const mine = expectOk(await other.get('/api/stories')).stories.map((s: any) => s.id)
    expect(mine).not.toContain(storyId)
    const all = expectOk(await editor.get(`/api/stories?benchTestId=${bench.benchTestId}`)).stories.map((s: any) => s.id)
    expect(all).toContain(storyId)
    const headline = expectOk(await writer.get(`/api/stories/${storyId}`)).story.headline
    expect(headline).not.toBe('Taken')
  })
})

describe('saving', () => {
  it('saves with the version read and writes a revision', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const saved = expectOk(await writer.patch(`/api/stories/${story.id}`, { version: 1, deck: 'Deck one', body: storyBody(bench) })).story
    expect(saved).toMatchObject({ version: 2, deck: 'Deck one' })
    const revisions = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
    expect(revisions.map((r: any) => [r.kind, r.storyVersion])).toEqual([['save', 2], ['created', 1]])
  })

  it('answers a stale save with 409 and the current story, and loses nothing', async () => {
    const story = await createStory(writer, bench.benchTestId)
    expectOk(await editor.patch(`/api/stories/${story.id}`, { version: 1, deck: 'The editor\'s deck' }))
    const stale = await writer.patch(`/api/stories/${story.id}`, { version: 1, deck: 'The writer\'s deck', body: 'Writer text' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.currentVersion).toBe(2)
    expect(stale.body.data.current).toMatchObject({ id: story.id, version: 2, deck: 'The editor\'s deck' })
    // Nothing of the refused save was stored; the writer's retry on the new version keeps both.
    const now = expectOk(await writer.get(`/api/stories/${story.id}`)).story
    expect(now.body).toBe('')
    const retried = expectOk(await writer.patch(`/api/stories/${story.id}`, { version: 2, body: 'Writer text' })).story
    expect(retried).toMatchObject({ version: 3, deck: 'The editor\'s deck', body: 'Writer text' })
  })

  it('coalesces autosaves by one person into one revision, and an explicit save adds one', async () => {
    const story = await createStory(writer, bench.benchTestId)
    let version = 1
    for (const text of ['T', 'Th', 'The', 'The cam']) {
      version = expectOk(await writer.patch(`/api/stories/${story.id}`, { version, body: text, autosave: true })).story.version
    }
    expect(version).toBe(5)
    let revisions = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
    expect(revisions.map((r: any) => r.kind)).toEqual(['autosave', 'created'])
    const autosave = expectOk(await writer.get(`/api/stories/${story.id}/revisions/${revisions[0].id}`)).revision
    expect(autosave.content.body).toBe('The cam')
    expect(autosave.storyVersion).toBe(5)
    version = expectOk(await writer.patch(`/api/stories/${story.id}`, { version, body: 'The cam works.' })).story.version
    version = expectOk(await writer.patch(`/api/stories/${story.id}`, { version, body: 'The cam works well.', autosave: true })).story.version
    revisions = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
    expect(revisions.map((r: any) => r.kind)).toEqual(['autosave', 'save', 'autosave', 'created'])
  })

  it('keeps the newest 50 revisions plus every state revision', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    let version = 1
    for (let i = 0; i < 55; i++) version = expectOk(await writer.patch(`/api/stories/${story.id}`, { version, deck: `Deck ${i}` })).story.version
    const sub = expectOk(await writer.post(`/api/stories/${story.id}/transitions`, { action: 'submit', version }))
    version = sub.story.version
    const rows = await testDb()('story_revisions').where('story_id', story.id).select('kind')
    expect(rows.filter((r: any) => r.kind === 'state')).toHaveLength(1)
    expect(rows.filter((r: any) => r.kind !== 'state')).toHaveLength(STORY_LIMITS.keptRevisions)
    // The created revision was the oldest and has gone; the last save is there.
    expect(rows.some((r: any) => r.kind === 'created')).toBe(false)
  })

  it('refuses unsafe markup in the body with 400 and stores nothing', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const res = await writer.patch(`/api/stories/${story.id}`, { version: 1, body: 'Hi <img src=x onerror=alert(1)> [x](javascript:alert(2))' })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toEqual(['body', 'body'])
    expect(expectOk(await writer.get(`/api/stories/${story.id}`)).story.version).toBe(1)
  })

  it('refuses a hero photo of another bench test', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const res = await writer.patch(`/api/stories/${story.id}`, { version: 1, heroPhotoId: 999999 })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('heroPhotoId')
  })

  it('refuses a slug another story has with 409', async () => {
    const a = await createStory(writer, bench.benchTestId)
    const b = await createStory(writer, bench.benchTestId)
    const res = await writer.patch(`/api/stories/${b.id}`, { version: 1, slug: a.slug })
    expect(res.status).toBe(409)
    expect(res.body.data.issues[0].path).toBe('slug')
  })
})

describe('revisions', () => {
  it('compares two revisions line by line and restores one as a new version', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: 'line one\nline two' })
    const v2 = expectOk(await writer.patch(`/api/stories/${story.id}`, { version: 1, body: 'line one\nline 2\nline three', headline: 'New headline' })).story
    const [newest, created] = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
    const cmp = expectOk(await writer.get(`/api/stories/${story.id}/revisions/compare?from=${created.id}&to=${newest.id}`))
    expect(cmp.changedFields).toEqual(['headline', 'body'])
    expect(cmp.bodyDiff).toEqual([
      { kind: 'same', text: 'line one' },
      { kind: 'removed', text: 'line two' },
      { kind: 'added', text: 'line 2' },
      { kind: 'added', text: 'line three' },
    ])
    const stale = await writer.post(`/api/stories/${story.id}/revisions/${created.id}/restore`, { version: 1 })
    expect(stale.status).toBe(409)
    const restored = expectOk(await writer.post(`/api/stories/${story.id}/revisions/${created.id}/restore`, { version: v2.version })).story
    expect(restored).toMatchObject({ version: 3, body: 'line one\nline two', headline: story.headline })
    const kinds = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions.map((r: any) => r.kind)
    expect(kinds).toEqual(['restore', 'save', 'created'])
  })

  it('finds a revision only under its own story', async () => {
    const a = await createStory(writer, bench.benchTestId)
    const b = await createStory(writer, bench.benchTestId)
    const [revA] = expectOk(await writer.get(`/api/stories/${a.id}/revisions`)).revisions
    expect((await writer.get(`/api/stories/${b.id}/revisions/${revA.id}`)).status).toBe(404)
  })
})

describe('the soft lock', () => {
  it('tells the second person who is editing since when, and a heartbeat keeps it', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const first = expectOk(await writer.post(`/api/stories/${story.id}/lock`, {}))
    expect(first.heldByMe).toBe(true)
    expect(first.lock.displayName).toBe('Test writer')
    const second = expectOk(await editor.post(`/api/stories/${story.id}/lock`, {}))
    expect(second.heldByMe).toBe(false)
    expect(second.lock).toMatchObject({ userId: first.lock.userId, since: first.lock.since })
    const beat = expectOk(await writer.post(`/api/stories/${story.id}/lock`, {}))
    expect(beat.lock.since).toBe(first.lock.since)
    expect(beat.lock.heartbeatAt >= first.lock.heartbeatAt).toBe(true)
    // The lock does not block a save by someone else.
    expectOk(await editor.patch(`/api/stories/${story.id}`, { version: 1, deck: 'Editor fix' }))
    expect(expectOk(await editor.get(`/api/stories/${story.id}`)).story.lock.userId).toBe(first.lock.userId)
  })

  it('passes to the next person when it expires, or on take-over, and is released by its holder only', async () => {
    const story = await createStory(writer, bench.benchTestId)
    expectOk(await writer.post(`/api/stories/${story.id}/lock`, {}))
    await testDb()('story_locks').where('story_id', story.id).update({ expires_at: testDb().raw('NOW(3) - INTERVAL 1 SECOND') })
    expect(expectOk(await editor.get(`/api/stories/${story.id}`)).story.lock).toBeNull()
    expect(expectOk(await editor.post(`/api/stories/${story.id}/lock`, {})).heldByMe).toBe(true)
    expect(expectOk(await writer.post(`/api/stories/${story.id}/lock`, { takeOver: true })).heldByMe).toBe(true)
    expect(expectOk(await editor.delete(`/api/stories/${story.id}/lock`)).lock.userId).toBe(writerId)
    expect(expectOk(await writer.delete(`/api/stories/${story.id}/lock`)).lock).toBeNull()
  })
})
