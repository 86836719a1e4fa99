// Thirty script-injection payloads in every text field a page renders (names,
// titles, labels, file names, headline, deck, body, notes, photo caption/credit/alt),
// then the pages that show them, opened in Chromium: no dialog opens, the marker the
// payloads set stays unset, and the short fields show their text literally.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { openBrowser, signInThroughPage, type BrowserSession } from '../support/browser'
import { DEMO_PASSWORD, signedIn, uniqueEmail } from '../support/http'
import { closeTestDb } from '../support/db'
import { makeJpeg, uploadPhoto, waitForPhoto } from '../support/photos'
import { publishStory, storyBench } from '../support/stories'
import { DEMO, createBenchTest, createSetup, expectOk, importFiles, pullFile } from '../support/workspace'

afterAll(closeTestDb)

const M = 'window.__xss=1'
export const XSS_PAYLOADS = [
  `<script>${M}</script>`,
  `<img src=x onerror="${M}">`,
  `<svg onload="${M}">`,
  `<svg><script>${M}</script></svg>`,
  `"><script>${M}</script>`,
  `'><img src=x onerror=${M}>`,
  `<iframe src="javascript:${M}"></iframe>`,
  `<a href="javascript:${M}">link</a>`,
  `<body onload="${M}">`,
  `<details open ontoggle="${M}">`,
  `<input autofocus onfocus="${M}">`,
  `<video><source onerror="${M}"></video>`,
  `<audio src=x onerror="${M}">`,
  `<math><mtext><img src=x onerror="${M}"></mtext></math>`,
  `<object data="javascript:${M}"></object>`,
  `<embed src="javascript:${M}">`,
  `<marquee onstart="${M}">`,
  `<div style="background:url(javascript:${M})">`,
  `{{constructor.constructor('${M}')()}}`,
  `\${${M}}`,
  `<scr<script>ipt>${M}</scr</script>ipt>`,
  `<ScRiPt>${M}</sCrIpT>`,
  `<img src="x" onerror="&#119;indow.__xss=1">`,
  `<form><button formaction="javascript:${M}">go</button></form>`,
  `<meta http-equiv="refresh" content="0;url=javascript:${M}">`,
  `<link rel=import href="data:text/html,<script>${M}</script>">`,
  `<base href="javascript:${M}//">`,
  `<textarea></textarea><img src=x onerror="${M}">`,
  `</title><script>${M}</script>`,
  `javascript:${M}`,
  `<noscript><p title="</noscript><img src=x onerror=${M}>">`,
  `[click](javascript:${M})`,
]

interface Arranged { slug: string, benchTestId: number, storyIds: number[], draftId: number }
let arranged: Arranged

async function arrange(): Promise<Arranged> {
  const admin = await signedIn(DEMO.admin)
  const editor = await signedIn(DEMO.editor)
  const writer = await signedIn(DEMO.writer)
  const everything = XSS_PAYLOADS.join('\n\n')

  // Names of users: the admin's user list shows them all.
  for (const p of XSS_PAYLOADS) expectOk(await admin.post('/api/users', { email: uniqueEmail('xss'), displayName: p.slice(0, 80), role: 'reader', password: 'a-long-test-password' }), 201)

  // Bench test titles in the writer's list; setup labels, pull file names, notes, photo text in one bench test.
  for (const p of XSS_PAYLOADS.slice(0, 10)) await createBenchTest(writer, p)
  const bt = await createBenchTest(writer, XSS_PAYLOADS[1]!)
  const detail = expectOk(await writer.get(`/api/bench-tests/${bt.id}`)).benchTest
  expectOk(await writer.patch(`/api/bench-tests/${bt.id}`, { version: detail.version, notes: everything, shop: XSS_PAYLOADS[2] }))
  const setups: { id: number }[] = []
  for (const p of XSS_PAYLOADS) setups.push(await createSetup(writer, bt.id, p.slice(0, 100), { description: p }))
  const files = XSS_PAYLOADS.slice(0, 12).map((p, i) => pullFile(`${p.replace(/[/\\]/g, '_')}.csv`, setups[i]!.id, { seed: 8100 + i }))
  const imported = await importFiles(writer, bt.id, files)
  expect(imported.status, JSON.stringify(imported.body).slice(0, 300)).toBe(201)
  const photo = expectOk(await uploadPhoto(writer, bt.id, await makeJpeg(400, 300), `${XSS_PAYLOADS[1]}.jpg`), 201).photo
  const ready = await waitForPhoto(writer, bt.id, photo.id)
  expectOk(await writer.patch(`/api/photos/${photo.id}`, { version: ready.version, caption: everything.slice(0, 1000), credit: XSS_PAYLOADS[5]!.slice(0, 100), altText: XSS_PAYLOADS[1] }))

  // The body's own check refuses the worst markup (script, svg, on...=); what it lets
  // through must still not run. Each payload is tried as a draft of its own (the
  // writer's list shows their headlines); the accepted ones make up the published body.
  const storyIds: number[] = []
  const accepted: string[] = []
  for (const p of XSS_PAYLOADS) {
    const draft = await writer.post('/api/stories', { benchTestId: bt.id, headline: p.slice(0, 120), deck: p, body: `Draft.\n\n${p}` })
    if (draft.status === 201) accepted.push(p)
    else expect(draft.status, JSON.stringify(draft.body).slice(0, 200)).toBe(400)
    storyIds.push(expectOk(draft.status === 201 ? draft : await writer.post('/api/stories', { benchTestId: bt.id, headline: p.slice(0, 120), deck: p }), 201).story.id)
  }
  expect(accepted.length).toBeGreaterThan(0)

  // A published story: headline, deck, body (the accepted payloads), the photo as hero, a note.
  const bench = await storyBench(editor)
  const heroBench = bench.benchTestId
  const heroPhoto = expectOk(await uploadPhoto(editor, heroBench, await makeJpeg(400, 300, (x, y) => [y & 255, x & 255, 10]), 'hero.jpg'), 201).photo
  const heroReady = await waitForPhoto(editor, heroBench, heroPhoto.id)
  expectOk(await editor.patch(`/api/photos/${heroPhoto.id}`, { version: heroReady.version, caption: XSS_PAYLOADS[0], credit: XSS_PAYLOADS[3], altText: XSS_PAYLOADS[6] }))
  const story = expectOk(await editor.post('/api/stories', {
    benchTestId: heroBench,
    headline: `Headline ${XSS_PAYLOADS[0]}`.slice(0, 120),
    deck: XSS_PAYLOADS[4],
    body: `The cam story.\n\n${accepted.join('\n\n')}\n\n::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="power"}\n::\n`,
    tags: ['xss-check'],
  }), 201).story
  const withHero = expectOk(await editor.patch(`/api/stories/${story.id}`, { version: story.version, heroPhotoId: heroPhoto.id })).story
  expect(withHero.heroPhotoId).toBe(heroPhoto.id)
  expectOk(await editor.post(`/api/stories/${story.id}/notes`, { body: everything.slice(0, 1900) }), 201)
  await publishStory(editor, story.id)

  return { slug: story.slug, benchTestId: bt.id, storyIds, draftId: storyIds[0]! }
}

async function watch(session: BrowserSession) {
  const dialogs: string[] = []
  session.page.on('dialog', async (d) => {
    dialogs.push(d.message())
    await d.dismiss()
  })
  return dialogs
}

async function visit(page: Page, path: string): Promise<string> {
  await page.goto(path, { waitUntil: 'networkidle' })
  await page.waitForTimeout(300)
  expect(await page.evaluate(() => (window as unknown as { __xss?: number }).__xss), path).toBeUndefined()
  return page.locator('body').innerText()
}

describe('XSS payloads in rendered text', () => {
  beforeAll(async () => {
    arranged = await arrange()
  }, 240_000)

  it('has at least thirty payloads', () => {
    expect(new Set(XSS_PAYLOADS).size).toBeGreaterThanOrEqual(30)
  })

  it('the reader pages run none of them and show the headline as text', async () => {
    const session = await openBrowser()
    try {
      const dialogs = await watch(session)
      await visit(session.page, '/')
      const story = await visit(session.page, `/stories/${arranged.slug}`)
      expect(story).toContain(`Headline ${XSS_PAYLOADS[0]}`)
      expect(story).toContain(XSS_PAYLOADS[4])
      await visit(session.page, '/tags/xss-check')
      await visit(session.page, '/search?q=cam')
      expect(dialogs).toEqual([])
    }
    finally { await session.close() }
  }, 120_000)

  it('the workspace, desk and admin pages run none of them and show names literally', async () => {
    const session = await openBrowser()
    try {
      const dialogs = await watch(session)
      await signInThroughPage(session.page, DEMO.writer, DEMO_PASSWORD)
      const list = await visit(session.page, '/bench-tests')
      for (const p of XSS_PAYLOADS.slice(0, 10)) expect(list).toContain(p)
      const bench = await visit(session.page, `/bench-tests/${arranged.benchTestId}`)
      expect(bench).toContain(XSS_PAYLOADS[1])
      for (const sub of ['setups', 'pulls', 'photos', 'analysis']) await visit(session.page, `/bench-tests/${arranged.benchTestId}/${sub}`)
      const mine = await visit(session.page, '/my-stories')
      expect(mine).toContain(XSS_PAYLOADS[0])
      await visit(session.page, `/stories/${arranged.draftId}/edit`)
      await visit(session.page, `/desk/${arranged.draftId}`)
      expect(dialogs).toEqual([])
    }
    finally { await session.close() }

    const admin = await openBrowser()
    try {
      const dialogs = await watch(admin)
      await signInThroughPage(admin.page, DEMO.admin, DEMO_PASSWORD)
      const users = await visit(admin.page, '/admin/users')
      for (const p of XSS_PAYLOADS.slice(0, 5)) expect(users).toContain(p.slice(0, 80))
      await visit(admin.page, '/desk')
      expect(dialogs).toEqual([])
    }
    finally { await admin.close() }
  }, 180_000)
})
