// The workflow table enforced on the server: every role x state x action generated
// from shared/types/story-workflow.ts; allowed moves succeed with an audit row, a
// state revision and mail rows; all others are refused (403 role, 409 state).
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { STORY_STATE_IDS, STORY_TRANSITIONS, type StoryAction, type StoryState } from '#shared/types/story-workflow'
import { decideTransition } from '#shared/stories/workflow'
import type { Role } from '#shared/types/roles'
import { signedIn, type Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'
import { makeJpeg, photoTestTimeouts, uploadPhoto, waitForPhoto } from '../support/photos'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(1))

afterAll(closeTestDb)

let clients: Record<Exclude<Role, 'reader'>, Client>
let reader: Client
let writerEmail: string
let bench: StoryBench

beforeAll(async () => {
  const w = await newWriter()
  writerEmail = w.email
  clients = { writer: w.client, editor: await signedIn(DEMO.editor), admin: await signedIn(DEMO.admin) }
  reader = await signedIn(DEMO.reader)
  bench = await storyBench(w.client)
})

/** A story of the test writer put straight into a state (the arrangement, not the thing tested). */
async function storyIn(state: StoryState): Promise<number> {
  const story = await createStory(clients.writer, bench.benchTestId, { body: storyBody(bench) })
  await testDb()('stories').where('id', story.id).update({
    state,
    scheduled_at: state === 'scheduled' ? new Date(Date.now() + 86_400_000) : null,
    published_at: state === 'published' || state === 'withdrawn' ? new Date() : null,
  })
  return story.id
}

function bodyFor(action: StoryAction): Record<string, unknown> {
  const rule = STORY_TRANSITIONS.find(t => t.action === action)!
  return {
    ...(rule.note === 'required' ? { note: 'Needs a second look at the gains.' } : {}),
    ...(action === 'schedule' ? { scheduledAt: new Date(Date.now() + 3_600_000).toISOString() } : {}),
  }
}

const ROLES = ['writer', 'editor', 'admin'] as const
const cases = STORY_STATE_IDS.flatMap(state => STORY_TRANSITIONS.flatMap(rule => ROLES.map(role => ({ state, action: rule.action, role }))))

describe('every role x state x action from the shared table', () => {
  it.each(cases)('$role runs $action on a $state story', async ({ state, action, role }) => {
    const id = await storyIn(state)
    const client = clients[role]
    // Approval needs an editor to have opened the number check for this version.
    if ((action === 'approve' || action === 'publish_correction') && role !== 'writer') expectOk(await client.get(`/api/stories/${id}/number-check`))
    const before = await testDb()('story_transitions').where('story_id', id).count({ n: '*' }).first()
    const res = await transition(client, id, action, bodyFor(action))
    const decision = decideTransition(action, state, role, role === 'writer')
    const after = await testDb()('stories').where('id', id).first('state')
    const audit = await testDb()('story_transitions').where('story_id', id).orderBy('id')
    if (decision.ok) {
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      expect(res.body.story.state).toBe(decision.rule.to)
      expect(after.state).toBe(decision.rule.to)
      expect(audit).toHaveLength(Number(before!.n) + 1)
      expect(audit.at(-1)).toMatchObject({ action, from_state: state, to_state: decision.rule.to })
      const revision = await testDb()('story_revisions').where({ story_id: id, kind: 'state' }).orderBy('id', 'desc').first()
      expect(revision.state).toBe(decision.rule.to)
    }
    else {
      expect(res.status, JSON.stringify(res.body)).toBe(decision.status)
      expect(after.state).toBe(state)
      expect(audit).toHaveLength(Number(before!.n))
      if (decision.status === 409) expect(res.body.data.state).toBe(state)
    }
  })

  it.each(STORY_TRANSITIONS.map(t => t.action))('a reader may not run %s (403)', async (action) => {
    const id = await storyIn('draft')
    const res = await reader.post(`/api/stories/${id}/transitions`, { action, version: 1, ...bodyFor(action) })
    expect(res.status).toBe(403)
  })
})

describe('the checks of a move', () => {
  it('refuses a stale version with 409 and the current story', async () => {
    const id = await storyIn('draft')
    expectOk(await clients.writer.patch(`/api/stories/${id}`, { version: 1, deck: 'Changed' }))
    const res = await clients.writer.post(`/api/stories/${id}/transitions`, { action: 'submit', version: 1 })
    expect(res.status).toBe(409)
    expect(res.body.data).toMatchObject({ currentVersion: 2, current: { id, state: 'draft' } })
  })

  it('asks for a note when the table says so (400)', async () => {
    const id = await storyIn('in_review')
    const res = await transition(clients.editor, id, 'request_changes')
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('note')
  })

  it('refuses approval until an editor has opened the number check for this version (422)', async () => {
    const id = await storyIn('in_review')
    const refused = await transition(clients.editor, id, 'approve')
    expect(refused.status).toBe(422)
    expect(refused.body.data.guard).toBe('number-check-seen')
    // The writer looking at the check does not count.
    expectOk(await clients.writer.get(`/api/stories/${id}/number-check`))
    expect((await transition(clients.editor, id, 'approve')).status).toBe(422)
    const check = expectOk(await clients.editor.get(`/api/stories/${id}/number-check`))
    expect(check.seenRecorded).toBe(true)
    expect((await transition(clients.editor, id, 'approve')).status).toBe(200)
  })

  it('asks again after the text changed since the check was seen', async () => {
    const id = await storyIn('in_review')
    expectOk(await clients.editor.get(`/api/stories/${id}/number-check`))
    const story = expectOk(await clients.editor.get(`/api/stories/${id}`)).story
    expectOk(await clients.editor.patch(`/api/stories/${id}`, { version: story.version, deck: 'Tightened deck' }))
    const res = await transition(clients.editor, id, 'approve')
    expect(res.status).toBe(422)
    expect(res.body.data.guard).toBe('number-check-seen')
  })

  it('refuses a schedule without a time (400) or in the past (422)', async () => {
    const id = await storyIn('approved')
    expect((await transition(clients.editor, id, 'schedule')).status).toBe(400)
    const past = await transition(clients.editor, id, 'schedule', { scheduledAt: new Date(Date.now() - 60_000).toISOString() })
    expect(past.status).toBe(422)
    expect(past.body.data.guard).toBe('scheduled-time-future')
  })

  it('refuses to send a story whose figures name setups that do not exist (422, with the problems)', async () => {
    const story = await createStory(clients.writer, bench.benchTestId, { body: 'Text\n\n::pull-graph{setups="999999"}\n::' })
    const res = await transition(clients.writer, story.id, 'submit')
    expect(res.status).toBe(422)
    expect(res.body.data.guard).toBe('figures-valid')
    expect(res.body.data.figures[0]).toMatchObject({ line: 3, message: 'Setup 999999 is not a setup of this bench test.' })
  })

  it('refuses to send a story with an empty body (422)', async () => {
    const story = await createStory(clients.writer, bench.benchTestId)
    const res = await transition(clients.writer, story.id, 'submit')
    expect(res.status).toBe(422)
    expect(res.body.data.guard).toBe('has-content')
  })

  it('refuses to send a story whose photos lack alt text, and sends it once they have it', async () => {
    const upload = expectOk(await uploadPhoto(clients.writer, bench.benchTestId, await makeJpeg(640, 480)), 201)
    const photo = await waitForPhoto(clients.writer, bench.benchTestId, upload.photo.id)
    const story = await createStory(clients.writer, bench.benchTestId, { body: `${storyBody(bench)}\n\n::photo{id=${photo.id}}\n::` })
    const res = await transition(clients.writer, story.id, 'submit')
    expect(res.status).toBe(422)
    expect(res.body.data).toMatchObject({ guard: 'photos-alt-text', photos: [{ id: photo.id }] })
    expectOk(await clients.writer.patch(`/api/photos/${photo.id}`, { version: photo.version, altText: 'The cam on the bench, lobes up.' }))
    expect((await transition(clients.writer, story.id, 'submit')).status).toBe(200)
  })

  it('stops a writer editing once the story is with the desk (409) while editors still may', async () => {
    const id = await storyIn('draft')
    const sent = expectOk(await transition(clients.writer, id, 'submit')).story
    expect(sent.mayEdit).toBe(false)
    const res = await clients.writer.patch(`/api/stories/${id}`, { version: sent.version, deck: 'Late change' })
    expect(res.status).toBe(409)
    expectOk(await clients.editor.patch(`/api/stories/${id}`, { version: sent.version, deck: 'Desk change' }))
  })
})

describe('mail and audit of a move', () => {
  it('sends a submission to the editors and an approval to the writers, never to the mover', async () => {
    const id = await storyIn('draft')
    const { headline } = expectOk(await clients.writer.get(`/api/stories/${id}`)).story
    const subject = (s: string) => `${s}: ${headline}`
    expectOk(await transition(clients.writer, id, 'submit', { note: 'Ready for a read.' }))
    const sent = await testDb()('mail_outbox').where('subject', subject('Story sent for review')).select('to_address', 'body_text')
    expect(sent.map((m: any) => m.to_address)).toContain(DEMO.editor)
    expect(sent.map((m: any) => m.to_address)).not.toContain(writerEmail)
    expect(sent[0].body_text).toContain('Note: Ready for a read.')

    expectOk(await clients.editor.get(`/api/stories/${id}/number-check`))
    expectOk(await transition(clients.editor, id, 'approve'))
    const approved = await testDb()('mail_outbox').where('subject', subject('Story approved')).pluck('to_address')
    expect(approved).toEqual([writerEmail])

    const audit = expectOk(await clients.writer.get(`/api/stories/${id}/transitions`)).transitions
    expect(audit.map((t: any) => [t.action, t.fromState, t.toState, t.by?.displayName])).toEqual([
      ['submit', 'draft', 'in_review', 'Test writer'],
      ['approve', 'in_review', 'approved', 'Edda Marsh'],
    ])
    expect(audit[0].note).toBe('Ready for a read.')
  })

  it('puts the story in the desk queue with its age and who sent it, and in the writer\'s list by state', async () => {
    const id = await storyIn('draft')
    expectOk(await transition(clients.writer, id, 'submit'))
    const queue = expectOk(await clients.editor.get('/api/desk/queue'))
    const item = queue.items.find((i: any) => i.story.id === id)
    expect(item).toMatchObject({ submittedBy: { displayName: 'Test writer' }, openThreads: 0 })
    expect(item.ageSeconds).toBeGreaterThanOrEqual(0)
    expect((await clients.writer.get('/api/desk/queue')).status).toBe(403)
    const mine = expectOk(await clients.writer.get('/api/my/stories?state=in_review'))
    expect(mine.stories.map((s: any) => s.id)).toContain(id)
    expect(mine.counts.in_review).toBeGreaterThanOrEqual(1)
  })
})
