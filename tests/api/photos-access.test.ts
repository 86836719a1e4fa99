import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import type { Photo } from '#shared/types/photos'
import { closeTestDb, testDb } from '../support/db'
import { Client, signedIn, uniqueEmail } from '../support/http'
import { bucketKeys, createBenchTest, fetchImage, makeJpeg, photoTestTimeouts, uploadPhoto, userId, waitForPhoto } from '../support/photos'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(1))

// Photos are reached through their bench test: writers their own, editors and
// admins all. Anyone else learns nothing (404). No photo is public until stories
// exist (issue 6), so an anonymous reader gets 404 for every photo.
let owner: Client
let intruder: Client
let editor: Client
let photo: Photo

async function newWriter(): Promise<Client> {
  const admin = await signedIn('admin@example.com')
  const email = uniqueEmail('writer')
  const res = await admin.post('/api/users', { email, displayName: 'Second writer', role: 'writer', password: 'a-long-test-password' })
  expect(res.status).toBe(201)
  return signedIn(email, 'a-long-test-password')
}

beforeAll(async () => {
  owner = await signedIn('writer@example.com')
  intruder = await newWriter()
  editor = await signedIn('editor@example.com')
  const bench = await createBenchTest(await userId(owner), 'Private bench test')
  const res = await uploadPhoto(owner, bench, await makeJpeg(900, 600), 'private.jpg')
  photo = await waitForPhoto(owner, bench, res.body.photo.id)
  expect(photo.status).toBe('ready')
})
afterAll(closeTestDb)

describe('another writer', () => {
  it('cannot list, edit, retry or delete the photos, and gets 404 as if they did not exist', async () => {
    expect((await intruder.get(`/api/bench-tests/${photo.benchTestId}/photos`)).status).toBe(404)
    expect((await intruder.patch(`/api/photos/${photo.id}`, { version: photo.version, caption: 'mine now' })).status).toBe(404)
    expect((await intruder.post(`/api/photos/${photo.id}/retry`)).status).toBe(404)
    expect((await intruder.delete(`/api/photos/${photo.id}`)).status).toBe(404)
    const row = await testDb()('photos').where({ id: photo.id }).first()
    expect(row).toMatchObject({ caption: '', version: photo.version })
  })

  it('cannot read the image bytes, neither a web size nor the original', async () => {
    expect((await fetchImage(intruder, photo.variants[0]!.url)).status).toBe(404)
    expect((await fetchImage(intruder, photo.originalUrl)).status).toBe(404)
  })

  it('cannot upload into it, and nothing is stored', async () => {
    const res = await uploadPhoto(intruder, photo.benchTestId, await makeJpeg(64, 64), 'sneak.jpg')
    expect(res.status).toBe(404)
    expect(await testDb()('photos').where({ bench_test_id: photo.benchTestId }).count({ n: '*' }).first()).toMatchObject({ n: 1 })
    expect((await bucketKeys(`photos/${photo.benchTestId}/`)).filter(k => k.endsWith('/original'))).toHaveLength(1)
  })
})

describe('the desk', () => {
  it('an editor sees and edits any writer\'s photos', async () => {
    expect((await fetchImage(editor, photo.variants[0]!.url)).status).toBe(200)
    const res = await editor.patch(`/api/photos/${photo.id}`, { version: photo.version, credit: 'Fictional Dyno Works' })
    expect(res.status).toBe(200)
    expect(res.body.photo.credit).toBe('Fictional Dyno Works')
  })
})

describe('readers and strangers', () => {
  it('an anonymous visitor gets 404 for an unpublished photo, web size and original alike', async () => {
    const anonymous = new Client()
    for (const url of [...photo.variants.map(v => v.url), photo.originalUrl]) {
      const res = await fetchImage(anonymous, url)
      expect(res.status).toBe(404)
      expect(res.headers.get('content-type')).not.toMatch(/^image\//)
    }
    expect((await anonymous.get(`/api/bench-tests/${photo.benchTestId}/photos`)).status).toBe(401)
  })

  it('a signed-in reader gets 404 for the image and 403 for the desk API', async () => {
    const reader = await signedIn('reader@example.com')
    expect((await fetchImage(reader, photo.variants[0]!.url)).status).toBe(404)
    expect((await reader.get(`/api/bench-tests/${photo.benchTestId}/photos`)).status).toBe(403)
  })

  it('a photo that does not exist answers the same 404', async () => {
    const res = await fetchImage(owner, '/photos/999999999/480')
    expect(res.status).toBe(404)
    expect((await fetchImage(owner, `/photos/${photo.id}/123`)).status).toBe(404) // no such size
  })
})

describe('request forgery', () => {
  it('refuses an upload with the session cookie but another site\'s Origin', async () => {
    const form = new FormData()
    form.append('file', new Blob([new Uint8Array(await makeJpeg(32, 32))], { type: 'image/jpeg' }), 'x.jpg')
    const res = await owner.request('POST', `/api/bench-tests/${photo.benchTestId}/photos`, { body: form, origin: 'https://elsewhere.example' })
    expect(res.status).toBe(403)
  })
})
