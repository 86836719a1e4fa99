// The smaller holes of issue 14: pages behind dead links answer with the API's status,
// the auth module's own session routes are gone, the editing lock goes only to
// someone who may edit, and operator upload links take pull files only.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BASE_URL, Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, createBenchTest, expectOk, newWriter, pullCsv, uploadFiles } from '../support/workspace'
import { createStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'

afterAll(closeTestDb)

let writer: Client
let editor: Client
let bench: StoryBench

beforeAll(async () => {
  writer = (await newWriter()).client
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(writer)
})

/** A page as a browser asks for it, without following redirects. */
async function page(path: string, cookie = '') {
  const res = await fetch(BASE_URL + path, { headers: { accept: 'text/html', ...(cookie ? { cookie } : {}) }, redirect: 'manual' })
  return { status: res.status, text: await res.text(), setCookie: res.headers.getSetCookie() }
}

describe('pages behind dead links', () => {
  it('a revoked preview link\'s page answers 410, an unknown one 404, a live one 200', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    const created = expectOk(await writer.post(`/api/stories/${story.id}/preview-links`, {}), 201)
    expect((await page(`/preview/${created.token}`)).status).toBe(200)
    expectOk(await writer.post(`/api/stories/${story.id}/preview-links/${created.link.id}/revoke`))
    const revoked = await page(`/preview/${created.token}`)
    expect(revoked.status).toBe(410)
    expect(revoked.text).toContain('This preview link no longer works')
    expect((await page('/preview/this-token-does-not-exist-anywhere-at-all')).status).toBe(404)
  })

  it('an unknown operator upload link\'s page answers 404, a revoked one 410', async () => {
    expect((await page(`/upload/${'u'.repeat(43)}`)).status).toBe(404)
    const bt = (await createBenchTest(writer)).id
    const { token, link } = expectOk(await writer.post(`/api/bench-tests/${bt}/operator-links`, { expiresInHours: 2, maxFiles: 3 }), 201)
    expect((await page(`/upload/${token}`)).status).toBe(200)
    expectOk(await writer.post(`/api/bench-tests/${bt}/operator-links/${link.id}/revoke`))
    expect((await page(`/upload/${token}`)).status).toBe(410)
  })
})

describe('the auth module\'s own session routes', () => {
  it('give an anonymous visitor no session cookie', async () => {
    const res = await fetch(`${BASE_URL}/api/_auth/session`)
    expect(res.status).toBe(404)
    expect(res.headers.getSetCookie().join(';')).not.toMatch(/pullsheet-session=/)
  })

  it('cannot pretend to end a session: DELETE is not a route, the session stays until sign-out', async () => {
    const { client: reader, email } = await newWriter('reader')
    const res = await fetch(`${BASE_URL}/api/_auth/session`, { method: 'DELETE', headers: { cookie: reader.cookie, origin: new URL(BASE_URL).origin } })
    expect(res.status).toBe(404)
    expect(res.headers.getSetCookie().join(';')).not.toMatch(/pullsheet-session=/)
    expect(expectOk(await reader.get('/api/auth/me')).user.email).toBe(email)
    expectOk(await reader.post('/api/auth/logout'))
    const after = new Client()
    after.cookie = reader.cookie
    expect(expectOk(await after.get('/api/auth/me')).user).toBeNull()
  })
})

describe('the editing lock', () => {
  it('a byline writer cannot take over the lock of a published story; the editor keeps it', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    expectOk(await transition(writer, story.id, 'submit'))
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'approve'))
    expectOk(await transition(editor, story.id, 'publish_now'))

    expect(expectOk(await editor.post(`/api/stories/${story.id}/lock`, {})).heldByMe).toBe(true)
    const takeOver = await writer.post(`/api/stories/${story.id}/lock`, { takeOver: true })
    expect(takeOver.status).toBe(409)
    // An open editor's heartbeat from the writer takes nothing either.
    const beat = expectOk(await writer.post(`/api/stories/${story.id}/lock`, {}))
    expect(beat).toMatchObject({ heldByMe: false, lock: { displayName: expect.any(String) } })
    const row = await testDb()('story_locks').where({ story_id: story.id }).first('user_id')
    const editorId = expectOk(await editor.get('/api/auth/me')).user.id
    expect(row.user_id).toBe(editorId)
  })

  it('a byline writer still takes over the lock of their own draft', async () => {
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })
    expect(expectOk(await editor.post(`/api/stories/${story.id}/lock`, {})).heldByMe).toBe(true)
    expect(expectOk(await writer.post(`/api/stories/${story.id}/lock`, { takeOver: true })).heldByMe).toBe(true)
  })
})

describe('operator upload links take pull files only', () => {
  it('a JPEG named .csv is refused from its bytes (415) and not counted against the link', async () => {
    const bt = (await createBenchTest(writer)).id
    const { token, link } = expectOk(await writer.post(`/api/bench-tests/${bt}/operator-links`, { expiresInHours: 2, maxFiles: 2 }), 201)
    const jpeg = new Uint8Array([0xFF, 0xD8, 0xFF, 0xE0, 0x00, 0x10, 0x4A, 0x46, 0x49, 0x46, 0x00, 0x01, ...Array(2000).fill(0x41)])
    const res = await uploadFiles(token, [{ name: 'pull-7.csv', text: jpeg }])
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/^pull-7\.csv is a JPEG image, not a pull file/)
    expect((await testDb()('operator_links').where({ id: link.id }).first('files_received')).files_received).toBe(0)
    expect(Number((await testDb()('inbox_files').where({ operator_link_id: link.id }).count({ n: '*' }).first())?.n)).toBe(0)
    expect(expectOk(await new Client().get(`/api/upload/${token}`)).filesLeft).toBe(2)
    expect((await uploadFiles(token, [{ name: 'pull.csv', text: pullCsv({ seed: 5 }).csv }])).status).toBe(201)
  })
})
