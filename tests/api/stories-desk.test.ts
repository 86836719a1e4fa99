// Notes, preview links, figures and the number check over HTTP.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { reportRound } from '#shared/dyno'
import { inlineFigureValue } from '#shared/stories/figure-values'
import { agrees, figureCandidates } from '#shared/utils/number-check'
import { Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'
import { makeJpeg, photoTestTimeouts, uploadPhoto, waitForPhoto } from '../support/photos'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(2))

afterAll(closeTestDb)

let writer: Client
let writerEmail: string
let editor: Client
let bench: StoryBench

beforeAll(async () => {
  const w = await newWriter()
  writer = w.client
  writerEmail = w.email
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(writer)
})

describe('notes', () => {
  it('threads replies under the first note, resolves and reopens threads, and mails the other side', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    const first = expectOk(await editor.post(`/api/stories/${story.id}/notes`, { body: 'Where does the 31 hp come from?', anchor: 'gained' }), 201).note
    expect(first).toMatchObject({ parentId: null, anchor: 'gained', resolved: false, author: { role: 'editor' } })
    const reply = expectOk(await writer.post(`/api/stories/${story.id}/notes`, { body: 'Peak to peak, see the table.', parentId: first.id }), 201).note
    // A reply to a reply joins the thread of its first note.
    const deeper = expectOk(await editor.post(`/api/stories/${story.id}/notes`, { body: 'Thanks.', parentId: reply.id }), 201).note
    expect([reply.parentId, deeper.parentId]).toEqual([first.id, first.id])

    let list = expectOk(await writer.get(`/api/stories/${story.id}/notes`))
    expect(list.threads).toHaveLength(1)
    expect(list.threads[0].replies.map((n: any) => n.body)).toEqual(['Peak to peak, see the table.', 'Thanks.'])
    expect(list.openThreads).toBe(1)

    const resolved = expectOk(await writer.patch(`/api/stories/${story.id}/notes/${reply.id}`, { resolved: true })).note
    expect(resolved).toMatchObject({ id: first.id, resolved: true, resolvedBy: { displayName: 'Test writer' } })
    list = expectOk(await editor.get(`/api/stories/${story.id}/notes`))
    expect(list.openThreads).toBe(0)
    // Answering a resolved thread opens it again.
    expectOk(await writer.post(`/api/stories/${story.id}/notes`, { body: 'One more thing.', parentId: first.id }), 201)
    expect(expectOk(await editor.get(`/api/stories/${story.id}/notes`)).openThreads).toBe(1)

    const toWriter = await testDb()('mail_outbox').where('subject', `New note on: ${story.headline}`).pluck('to_address')
    expect(toWriter).toContain(writerEmail)
    expect(toWriter).toContain(DEMO.editor)
  })

  it('lets only the author change a note\'s text, and keeps note text as plain text', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const payload = '<img src=x onerror="alert(1)"> **not bold**'
    const note = expectOk(await editor.post(`/api/stories/${story.id}/notes`, { body: payload }), 201).note
    expect(note.body).toBe(payload)
    expect((await writer.patch(`/api/stories/${story.id}/notes/${note.id}`, { body: 'rewritten' })).status).toBe(403)
    const edited = expectOk(await editor.patch(`/api/stories/${story.id}/notes/${note.id}`, { body: 'Clearer question.' })).note
    expect(edited.body).toBe('Clearer question.')
    expect(edited.editedAt).not.toBeNull()
    const mail = await testDb()('mail_outbox').where('subject', `New note on: ${story.headline}`).first('body_html')
    expect(mail.body_html).not.toContain('<img')
    expect(mail.body_html).toContain('&lt;img')
  })

  it('finds a note only under its own story and refuses a parent of another story', async () => {
    const a = await createStory(writer, bench.benchTestId)
    const b = await createStory(writer, bench.benchTestId)
    const note = expectOk(await writer.post(`/api/stories/${a.id}/notes`, { body: 'On A' }), 201).note
    expect((await writer.patch(`/api/stories/${b.id}/notes/${note.id}`, { resolved: true })).status).toBe(404)
    const res = await writer.post(`/api/stories/${b.id}/notes`, { body: 'Reply', parentId: note.id })
    expect(res.status).toBe(400)
  })
})

describe('preview links', () => {
  it('shows the story as readers will see it, noindex, with only its photos, until revoked', async () => {
    const upload = expectOk(await uploadPhoto(writer, bench.benchTestId, await makeJpeg(900, 600)), 201)
    const used = await waitForPhoto(writer, bench.benchTestId, upload.photo.id)
    const upload2 = expectOk(await uploadPhoto(writer, bench.benchTestId, await makeJpeg(700, 500)), 201)
    const unused = await waitForPhoto(writer, bench.benchTestId, upload2.photo.id)
    const story = await createStory(writer, bench.benchTestId, { body: `${storyBody(bench)}\n\n::photo{id=${used.id}}\n::` })

    const created = expectOk(await writer.post(`/api/stories/${story.id}/preview-links`, { label: 'For the shop' }), 201)
    expect(created.url).toMatch(/\/preview\/[\w-]{40,}$/)
    expect(created.link.state).toBe('active')
    const stored = await testDb()('story_preview_tokens').where('id', created.link.id).first('token_hash')
    expect(stored.token_hash).not.toContain(created.token)

    const anon = new Client()
    const view = await anon.get(`/api/preview/${created.token}`)
    expect(view.status).toBe(200)
    expect(view.headers.get('x-robots-tag')).toMatch(/noindex/)
    expect(view.body).toMatchObject({ preview: true, story: { id: story.id, headline: story.headline, state: 'draft' } })
    expect(view.body.figures.analysis.setups).toHaveLength(2)
    expect(view.body.figures.photos.map((p: any) => p.id)).toEqual([used.id])
    expect(JSON.stringify(view.body)).not.toContain(`/photos/${unused.id}/`)
    expect(JSON.stringify(view.body)).not.toContain('original')

    const photo = view.body.figures.photos[0]
    if (photo.variants.length) {
      const img = await fetch(anon.base + photo.variants[0].url)
      expect(img.status).toBe(200)
      expect(img.headers.get('content-type')).toBe('image/jpeg')
    }
    const other = await fetch(`${anon.base}/api/preview/${created.token}/photos/${unused.id}/480`)
    expect(other.status).toBe(404)

    expectOk(await writer.post(`/api/stories/${story.id}/preview-links/${created.link.id}/revoke`))
    expect((await anon.get(`/api/preview/${created.token}`)).status).toBe(410)
    expect((await anon.get('/api/preview/this-token-does-not-exist-anywhere-at-all')).status).toBe(404)
  })

  it('dies when the story is published, and none can be made for a published story', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    const { token } = expectOk(await writer.post(`/api/stories/${story.id}/preview-links`, {}), 201)
    expect((await new Client().get(`/api/preview/${token}`)).status).toBe(200)
    expectOk(await transition(writer, story.id, 'submit'))
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'approve'))
    expectOk(await transition(editor, story.id, 'publish_now'))
    expect((await new Client().get(`/api/preview/${token}`)).status).toBe(410)
    expect((await editor.post(`/api/stories/${story.id}/preview-links`, {})).status).toBe(409)
    const links = expectOk(await writer.get(`/api/stories/${story.id}/preview-links`)).links
    expect(links[0].state).toBe('revoked')
  })
})

describe('figures and the number check', () => {
  it('gives the analysis, every pair\'s gains and the body\'s figure problems', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: `${storyBody(bench)}\n::cam-card{setup=999999}\n::` })
    const figures = expectOk(await writer.get(`/api/stories/${story.id}/figures`))
    expect(figures.analysis.units.power).toBe('hp')
    expect(figures.comparisons.map((c: any) => [c.setupId, c.vsSetupId]).sort()).toEqual([[bench.baselineId, bench.camId], [bench.camId, bench.baselineId]].sort())
    expect(figures.setups.map((s: any) => s.id)).toEqual([bench.baselineId, bench.camId])
    expect(figures.problems).toEqual([{ line: 8, figure: '::cam-card{setup=999999}', message: 'Setup 999999 is not a setup of this bench test.' }])
  })

  it('passes the figures the data gives and flags a wrong one with the nearest', async () => {
    const story = await createStory(writer, bench.benchTestId)
    const figures = expectOk(await writer.get(`/api/stories/${story.id}/figures`))
    const value = (of: any, setup: number, vs?: number) => inlineFigureValue(figures, { of, setup, ...(vs ? { vs } : {}) })
    const peak = value('peak-power', bench.baselineId)
    const gain = value('peak-power-gain', bench.camId)
    const gainRaw = figures.comparisons.find((c: any) => c.setupId === bench.camId && c.vsSetupId === bench.baselineId).gains.peakPower
    // A number no figure of the data agrees with, a few hp above the real gain.
    const hp = figureCandidates({ analysis: figures.analysis, comparisons: figures.comparisons }).filter(c => c.unit === 'hp')
    let wrong = reportRound(gainRaw, 0) + 3
    while (hp.some(c => agrees(c.value, { value: wrong, decimals: 0, unit: 'hp' }))) wrong++
    const body = [
      `The baseline made ${peak.text} and the cam added ${gain.text} peak to peak.`,
      `A careless line says the cam added ${wrong} hp.`,
      'Idle vacuum fell from 17.5 inHg to 14.0 inHg.',
    ].join('\n')
    expectOk(await writer.patch(`/api/stories/${story.id}`, { version: 1, body }))
    const check = expectOk(await writer.get(`/api/stories/${story.id}/number-check`))
    expect(check.storyVersion).toBe(2)
    expect(check.seenRecorded).toBe(false)
    expect(check.findings.map((f: any) => [f.text, Boolean(f.matched)])).toEqual([
      [peak.text, true],
      [gain.text, true],
      [`${wrong} hp`, false],
      ['17.5 inHg', true],
      ['14.0 inHg', true],
    ])
    expect(check.flagged).toBe(1)
    const flagged = check.findings[2]
    expect(flagged.line).toBe(2)
    expect(flagged.nearest[0].label).toBe('Peak-to-peak power gain, Long-duration cam vs Baseline')
    expect(flagged.message).toContain(`Text says ${wrong} hp; the data gives`)
  })
})
