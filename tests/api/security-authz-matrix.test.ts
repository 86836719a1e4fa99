// Every API route, found from the route files, called by every kind of caller and
// checked against tests/api/authz-matrix.ts; the objects belong to the demo writer
// and a second writer calls them too (IDOR). Then CSRF on every state-changing route.
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb } from '../support/db'
import { makeJpeg, uploadPhoto, waitForPhoto } from '../support/photos'
import { createStory, storyBench, storyBody } from '../support/stories'
import { DEMO, createBenchTest, createSetup, expectOk, newWriter, pullFile, uploadFiles } from '../support/workspace'
import { AUTHZ_MATRIX, CALLERS, routeKey, type AuthzFixture, type Caller, type FreshObjects, type MatrixEntry } from './authz-matrix'

afterAll(closeTestDb)

const API_DIR = join(process.cwd(), 'server/api')

function routeFiles(dir = API_DIR): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? routeFiles(full) : name.endsWith('.ts') ? [relative(API_DIR, full)] : []
  })
}

const ROUTES = routeFiles().map(file => ({ file, key: routeKey(file) })).sort((a, b) => a.key.localeCompare(b.key))

let clients: Record<Caller, Client>
let fixture: AuthzFixture
let fresh: FreshObjects

async function arrange(): Promise<void> {
  const writer = await signedIn(DEMO.writer)
  const other = await newWriter()
  clients = {
    anonymous: new Client(),
    reader: await signedIn(DEMO.reader),
    otherWriter: other.client,
    writer,
    editor: await signedIn(DEMO.editor),
    admin: await signedIn(DEMO.admin),
  }
  const bench = await storyBench(writer)
  const bt = `/api/bench-tests/${bench.benchTestId}`
  const check = expectOk(await writer.post(`${bt}/setups/${bench.baselineId}/idle-checks`, { idleRpm: 780, vacuumInHg: 17 }), 201).idleCheck
  const pulls = expectOk(await writer.get(`${bt}/pulls`)).pulls
  const link = expectOk(await writer.post(`${bt}/operator-links`, { expiresInHours: 2 }), 201)
  const uploadToken: string = link.token
  let uploadSeed = 900
  async function newInboxFile(): Promise<number> {
    const name = `matrix-${uploadSeed}.csv`
    expectOk(await uploadFiles(uploadToken, [{ name, text: pullFile(name, bench.baselineId, { seed: uploadSeed++ }).text }]), 201)
    const files = expectOk(await writer.get(`${bt}/inbox`)).files as { id: number, fileName: string }[]
    return files.find(f => f.fileName === name)!.id
  }
  async function newPhoto(): Promise<number> {
    const res = await uploadPhoto(writer, bench.benchTestId, await makeJpeg(640, 480, (x, y) => [(x + uploadSeed) & 255, y & 255, 90]), `matrix-${uploadSeed++}.jpg`)
    return expectOk(res, 201).photo.id
  }
  async function deletedSetup(): Promise<number> {
    const setup = await createSetup(writer, bench.benchTestId, `Scrapped ${uploadSeed++}`)
    expectOk(await writer.delete(`${bt}/setups/${setup.id}`))
    return setup.id as number
  }
  const photoId = await newPhoto()
  const photo = await waitForPhoto(writer, bench.benchTestId, photoId)
  expect(photo.status).toBe('ready')
  expectOk(await writer.patch(`/api/photos/${photoId}`, { version: photo.version, altText: 'The test engine on the dyno (invented).' }))

  const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench), tags: ['matrix-tag'] })
  const withHero = expectOk(await writer.patch(`/api/stories/${story.id}`, { version: story.version, heroPhotoId: photoId })).story
  const note = expectOk(await writer.post(`/api/stories/${story.id}/notes`, { body: 'Check the baseline weather.' }), 201).note
  const preview = expectOk(await writer.post(`/api/stories/${story.id}/preview-links`, { label: 'Matrix' }), 201)
  const revisions = expectOk(await writer.get(`/api/stories/${story.id}/revisions`)).revisions
  const spare = expectOk(await clients.admin.post('/api/users', { email: `spare-${Date.now()}@test.example`, displayName: 'Spare reader', role: 'reader', password: 'a-long-test-password' }), 201).user

  fixture = {
    benchTestId: bench.benchTestId,
    setupId: bench.baselineId,
    otherSetupId: await deletedSetup(),
    pullId: pulls[0].id,
    checkId: check.id,
    operatorLinkId: link.link.id,
    uploadToken,
    inboxFileId: await newInboxFile(),
    photoId,
    photoWidth: photo.variants[0]!.width,
    storyId: story.id,
    storySlug: story.slug,
    storyVersion: withHero.version,
    noteId: note.id,
    previewLinkId: preview.link.id,
    previewToken: preview.token,
    revisionId: revisions[0].id,
    spareUserId: spare.id,
    publicTag: 'matrix-tag',
  }
  fresh = {
    async deletedBenchTestId() {
      const created = await createBenchTest(writer)
      expectOk(await writer.delete(`/api/bench-tests/${created.id}`))
      return created.id
    },
    deletedSetupId: deletedSetup,
    async idleCheckId() {
      return expectOk(await writer.post(`${bt}/setups/${bench.baselineId}/idle-checks`, { idleRpm: 790, vacuumInHg: 16.5 }), 201).idleCheck.id
    },
    inboxFileId: newInboxFile,
    photoId: newPhoto,
  }
}

function send(client: Client, method: string, path: string, entry: MatrixEntry, origin?: string | null) {
  const body = entry.body?.(fixture)
  return client.request(method, path, { json: method === 'GET' || method === 'DELETE' ? undefined : body ?? {}, origin })
}

describe('authorisation matrix', () => {
  beforeAll(arrange, 180_000)

  it('has an entry for every route file and no entry without one', () => {
    expect(ROUTES.length).toBeGreaterThan(50)
    const keys = new Set(ROUTES.map(r => r.key))
    expect(ROUTES.filter(r => !AUTHZ_MATRIX[r.key]).map(r => r.file)).toEqual([])
    expect(Object.keys(AUTHZ_MATRIX).filter(k => !keys.has(k))).toEqual([])
  })

  it('answers every caller of every route as the matrix says', async () => {
    const ordered = [...ROUTES].sort((a, b) => Number(AUTHZ_MATRIX[a.key]?.last ?? false) - Number(AUTHZ_MATRIX[b.key]?.last ?? false))
    const mismatches: string[] = []
    for (const { key } of ordered) {
      const entry = AUTHZ_MATRIX[key]
      if (!entry) continue
      const method = key.split(' ')[0]!
      // Denied callers first, so the allowed ones find the objects untouched.
      const callers = [...CALLERS].sort((a, b) => Number(entry.expect[a] === 'ok') - Number(entry.expect[b] === 'ok'))
      for (const caller of callers) {
        const wanted = entry.expect[caller]
        const path = wanted === 'ok' && entry.freshPath ? await entry.freshPath(fresh, fixture) : entry.path(fixture)
        const res = await send(clients[caller], method, path, entry)
        const passed = wanted === 'ok' ? ![401, 403, 404].includes(res.status) && res.status < 500 : res.status === wanted
        if (!passed) mismatches.push(`${key} as ${caller}: wanted ${wanted}, got ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`)
      }
    }
    expect(mismatches).toEqual([])
  }, 240_000)
})

describe('CSRF on every state-changing route', () => {
  const changing = ROUTES.filter(r => !r.key.startsWith('GET '))

  it('refuses a foreign Origin and a session cookie without an Origin, before doing anything', async () => {
    const admin = await signedIn(DEMO.admin)
    const failures: string[] = []
    const before = expectOk(await admin.get('/api/auth/me')).user
    for (const { key } of changing) {
      const entry = AUTHZ_MATRIX[key]!
      const method = key.split(' ')[0]!
      const path = entry.path(fixture)
      const foreign = await send(admin, method, path, entry, 'http://attacker.example')
      if (foreign.status !== 403) failures.push(`${key} with a foreign Origin: ${foreign.status}`)
      const bare = await send(admin, method, path, entry, null)
      if (bare.status !== 403) failures.push(`${key} with a cookie and no Origin: ${bare.status}`)
    }
    expect(failures).toEqual([])
    // The refused logout did not end the session.
    expect(expectOk(await admin.get('/api/auth/me')).user).toEqual(before)
  }, 120_000)

  it('a foreign Origin is refused even without a session (the login form cannot be driven from elsewhere)', async () => {
    const res = await new Client().post('/api/auth/login', { email: DEMO.writer, password: 'pullsheet-demo' }, { origin: 'http://attacker.example' })
    expect(res.status).toBe(403)
  })
})
