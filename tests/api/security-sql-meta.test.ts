// Strings that mean something to SQL, LIKE or a shell go in as text and come back as
// the same text, and as search terms they match only themselves.
import { afterAll, describe, expect, it } from 'vitest'
import { signedIn, uniqueEmail } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { makeJpeg, uploadPhoto } from '../support/photos'
import { createStory } from '../support/stories'
import { DEMO, createBenchTest, createSetup, expectOk, newWriter } from '../support/workspace'

afterAll(closeTestDb)

export const SQL_META = [
  `' OR 1=1 --`,
  `"; DROP TABLE users; --`,
  `back\\slash \\' \\" \\\\`,
  `100%_done % _ %%`,
  'back`ticks` `users`',
  `Ünïcødé — 測試 ✓ 🏁 Ω≈ç√`,
  `'); DELETE FROM stories; /*`,
  `$1 :name ? ?? @var`,
]

describe('SQL-meta strings', () => {
  it('are stored and shown verbatim in every text field', async () => {
    const { client: writer } = await newWriter()
    const admin = await signedIn(DEMO.admin)
    const usersBefore = await testDb()('users').count({ n: '*' }).first()
    for (const [i, s] of SQL_META.entries()) {
      const bt = await createBenchTest(writer, `Title ${s}`)
      expect(bt.title).toBe(`Title ${s}`)
      const patched = expectOk(await writer.patch(`/api/bench-tests/${bt.id}`, { version: bt.version, notes: `Notes ${s}`, shop: `Shop ${s}` })).benchTest
      const detail = expectOk(await writer.get(`/api/bench-tests/${bt.id}`)).benchTest
      expect([patched.notes, detail.notes, detail.shop, detail.title]).toEqual([`Notes ${s}`, `Notes ${s}`, `Shop ${s}`, `Title ${s}`])

      const setup = await createSetup(writer, bt.id, `Label ${s}`, { description: `Description ${s}` })
      const setups = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups`)).setups
      const shown = setups.find((x: any) => x.id === setup.id)
      expect([shown.label, shown.description]).toEqual([`Label ${s}`, `Description ${s}`])

      const story = await createStory(writer, bt.id, { headline: `Headline ${s}`, deck: `Deck ${s}`, body: `Body ${s}\n\nSecond paragraph ${s}` })
      const read = expectOk(await writer.get(`/api/stories/${story.id}`)).story
      expect([read.headline, read.deck, read.body]).toEqual([`Headline ${s}`, `Deck ${s}`, `Body ${s}\n\nSecond paragraph ${s}`])
      expectOk(await writer.post(`/api/stories/${story.id}/notes`, { body: `Note ${s}` }), 201)
      const threads = expectOk(await writer.get(`/api/stories/${story.id}/notes`)).threads
      expect(threads.map((t: any) => t.body)).toContain(`Note ${s}`)

      const photo = expectOk(await uploadPhoto(writer, bt.id, await makeJpeg(320, 240, (x, y) => [x & 255, (y + i) & 255, 40]), `photo-${i}.jpg`), 201).photo
      const meta = expectOk(await writer.patch(`/api/photos/${photo.id}`, { version: photo.version, caption: `Caption ${s}`, credit: `Credit ${s}`, altText: `Alt ${s}` })).photo
      expect([meta.caption, meta.credit, meta.altText]).toEqual([`Caption ${s}`, `Credit ${s}`, `Alt ${s}`])

      const user = expectOk(await admin.post('/api/users', { email: uniqueEmail('meta'), displayName: `Name ${s}`, role: 'reader', password: 'a-long-test-password' }), 201).user
      const listed = expectOk(await admin.get('/api/users')).users.find((u: any) => u.id === user.id)
      expect(listed.displayName).toBe(`Name ${s}`)
    }
    const usersAfter = await testDb()('users').count({ n: '*' }).first()
    expect(Number(usersAfter!.n)).toBe(Number(usersBefore!.n) + SQL_META.length)
  }, 120_000)

  it('as query parameters they match only themselves (LIKE wildcards escaped) and never fail', async () => {
    const { client: writer } = await newWriter()
    const plain = await createBenchTest(writer, 'Plain title without marks')
    const marked = await createBenchTest(writer, 'Marked 100%_done title')
    const list = async (q: string) => expectOk(await writer.get(`/api/bench-tests?q=${encodeURIComponent(q)}`)).benchTests.map((b: any) => b.id)
    const found = await list('%_')
    expect(found).toContain(marked.id)
    expect(found).not.toContain(plain.id)
    expect(await list('_')).not.toContain(plain.id)
    expect(await list('%')).not.toContain(plain.id)
    for (const s of SQL_META) {
      expect(await list(s)).not.toContain(plain.id)
      for (const path of ['/api/stories?q=', '/api/magazine/search?q=']) {
        const res = await writer.get(path + encodeURIComponent(s))
        expect(res.status, `${path}${s}`).toBe(200)
      }
    }
    const search = expectOk(await writer.get(`/api/magazine/search?q=${encodeURIComponent(SQL_META[0]!)}`))
    expect(search.q).toBe(SQL_META[0])
  })
})
