// A second app server on the same database and storage: a session works on both,
// each e-mail goes out once, a cached story page is fresh on both after an edit; and
// a server killed (SIGKILL) in the middle of an import leaves no partial batch.
// Scheduled publishing across two servers is stories-zz-scheduling.test.ts; a photo
// job on a killed server is photos-crash.test.ts.
import type { ChildProcess } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { Client, signedIn, spareAppPort, uniqueEmail, testServerExtra } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { caughtMail } from '../support/mail'
import { createStory, publishStory, storyBench, storyBody, transition } from '../support/stories'
import { DEMO, createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile } from '../support/workspace'

const SECOND_PORT = spareAppPort(2)
const SECOND = `http://127.0.0.1:${SECOND_PORT}`
let second: ChildProcess | undefined

beforeAll(async () => {
  second = await startApp(localEnv('test'), testServerExtra(), SECOND_PORT)
}, 60_000)

afterAll(async () => {
  if (second) await killGroup(second)
  await closeTestDb()
})

async function pageHtml(base: string, path: string): Promise<string> {
  const res = await fetch(base + path, { headers: { accept: 'text/html' } })
  expect(res.status).toBe(200)
  return res.text()
}

describe('two app servers', () => {
  it('a session from one server works on the other, and signing out on one ends it on both', async () => {
    const a = await signedIn(DEMO.reader)
    const b = new Client(SECOND)
    b.cookie = a.cookie
    expect(expectOk(await b.get('/api/auth/me')).user.email).toBe(DEMO.reader)
    expectOk(await b.patch('/api/preferences', {}))
    expectOk(await b.post('/api/auth/logout'))
    expect(expectOk(await a.get('/api/auth/me')).user).toBeNull()
  })

  it('each e-mail is sent once although both servers run the mail loop', async () => {
    const admin = await signedIn(DEMO.admin)
    const emails = Array.from({ length: 6 }, () => uniqueEmail('twice'))
    for (const email of emails) expectOk(await admin.post('/api/users', { email, displayName: 'Two-server reader', role: 'reader', password: 'a-long-test-password' }), 201)
    await Promise.all(emails.map((email, i) => new Client(i % 2 ? SECOND : undefined).post('/api/auth/password-reset', { email })))
    await expect.poll(() => emails.every(e => caughtMail().some(m => m.to.includes(e))), { timeout: 30_000 }).toBe(true)
    await new Promise(r => setTimeout(r, 2000))
    for (const email of emails) expect(caughtMail().filter(m => m.to.includes(email)), email).toHaveLength(1)
    const rows = await testDb()('mail_outbox').whereIn('to_address', emails)
    expect(rows.map(r => r.status)).toEqual(emails.map(() => 'sent'))
  }, 60_000)

  it('a cached story page is refreshed on both servers after an edit', async () => {
    const editor = await signedIn(DEMO.editor)
    const bench = await storyBench(editor)
    const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench), deck: 'First deck, cached on both servers.' })
    await publishStory(editor, story.id)
    const path = `/stories/${story.slug}`
    for (const base of [new Client().base, SECOND]) {
      expect(await pageHtml(base, path)).toContain('First deck, cached on both servers.')
      expect(await pageHtml(base, path)).toContain('First deck, cached on both servers.')
    }
    const current = expectOk(await editor.get(`/api/stories/${story.id}`)).story
    expectOk(await editor.patch(`/api/stories/${story.id}`, { version: current.version, deck: 'Second deck after the edit.' }))
    // Readers see the published edition only: the edit reaches them as a correction.
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'publish_correction', { note: 'The deck was reworded.' }))
    for (const base of [new Client().base, SECOND]) {
      await expect.poll(async () => (await pageHtml(base, path)).includes('Second deck after the edit.'), { timeout: 15_000 }).toBe(true)
    }
  }, 90_000)

  it('a published story is the same bytes and ETag from both servers, although one had built its figures from the live workspace', async () => {
    const editor = await signedIn(DEMO.editor)
    const bench = await storyBench(editor)
    const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench) })
    // The desk's figures on this server are built from the live data, with the same content hash as the edition.
    expectOk(await editor.get(`/api/stories/${story.id}/figures`))
    await publishStory(editor, story.id)
    for (const path of [`/api/magazine/stories/${story.slug}`, `/api/magazine/stories/${story.slug}/analysis`, `/stories/${story.slug}`]) {
      const [first, other] = await Promise.all([new Client().base, SECOND].map(base => fetch(base + path)))
      expect(first!.status, path).toBe(200)
      const [a, b] = await Promise.all([first!.text(), other!.text()])
      // Where they part, not two whole answers of 100 KB.
      const at = [...a].findIndex((ch, i) => ch !== b[i])
      expect(at === -1 && a.length === b.length ? 'same' : `${a.length} vs ${b.length} bytes, first difference at ${at}: ${a.slice(at - 80, at + 80)} | ${b.slice(at - 80, at + 80)}`, path).toBe('same')
      expect(first!.headers.get('etag'), path).toBe(other!.headers.get('etag'))
    }
  }, 90_000)
})

describe('an app server killed in the middle of an import', () => {
  it('leaves no partial batch, and the main server imports the same batch whole', async () => {
    const victimPort = spareAppPort(3)
    const victim = await startApp(localEnv('test'), testServerExtra(), victimPort)
    const { client, email } = await newWriter()
    const bt = await createBenchTest(client)
    const setup = await createSetup(client, bt.id, 'Baseline')
    const onVictim = new Client(`http://127.0.0.1:${victimPort}`)
    expectOk(await onVictim.post('/api/auth/login', { email, password: 'a-long-test-password' }))
    const files = Array.from({ length: 20 }, (_, i) => pullFile(`killed-${i}.csv`, setup.id, { seed: 6100 + i, stepRpm: 10 }))
    const inFlight = importFiles(onVictim, bt.id, files).catch((e: Error) => ({ status: 0, body: e.message }))
    // Kill once the request is in (the server is busy parsing and writing).
    await new Promise(r => setTimeout(r, 150))
    victim.kill('SIGKILL')
    const answer = await inFlight
    await killGroup(victim)
    const n = Number((await testDb()('pulls').where({ bench_test_id: bt.id }).count({ n: '*' }).first())!.n)
    if (answer.status === 201) expect(n).toBe(files.length)
    else expect(n).toBe(0)
    // The main server is untouched and takes the batch.
    if (n === 0) expectOk(await importFiles(client, bt.id, files), 201)
    expect(expectOk(await client.get(`/api/bench-tests/${bt.id}/pulls`)).pulls).toHaveLength(files.length)
  }, 90_000)
})
