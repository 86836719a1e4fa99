// A reader on a story with photos: the hero and the gallery carry every web size in
// srcset (each answering as an image), sizes, lazy loading below the hero, the alt
// text, caption and credit, in the server's HTML and after hydration. The lightbox
// opens on a click or Enter, shows the photo large, steps with the arrow keys, closes
// on Escape or its button and gives focus back; axe-core finds nothing serious with it
// open. A body that places its own ::gallery gets that instead of the reader's gallery.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PHOTO_WIDTHS, type Photo } from '#shared/types/photos'
import { seriousViolations } from '../support/axe'
import { gotoReady, openBrowser, type BrowserSession } from '../support/browser'
import { closeTestDb } from '../support/db'
import { signedIn, type Client } from '../support/http'
import { makeJpeg, uploadPhoto, waitForPhoto, type Paint } from '../support/photos'
import { createStory, publishStory, storyBench, storyBody, type StoryBench } from '../support/stories'
import { DEMO, expectOk } from '../support/workspace'

// Widths that are none of the standard sizes, so each photo also gets its own width.
const HERO = { width: 1800, height: 1200, caption: 'The test engine on the stand before the first pull', credit: 'Fenwick Dray', altText: 'A V8 bolted to the dyno stand, water lines attached' }
const SHOTS = [
  { width: 1200, height: 800, caption: 'Degreeing the cam at the crank snout', credit: 'Odile Marrow', altText: 'A degree wheel on the crankshaft nose with a pointer wire' },
  { width: 1000, height: 750, caption: 'Lifters primed and ready', credit: 'Fenwick Dray', altText: 'Sixteen hydraulic lifters lined up on a shop rag' },
  { width: 1100, height: 700, caption: 'Valve springs checked for installed height', credit: 'Tamsin Oakhurst', altText: 'A height micrometer under a valve spring retainer' },
]

interface ReadyPhoto { photo: Photo, caption: string, credit: string, altText: string }
interface ImgAttrs { src: string, srcset: string, sizes: string, loading: string, alt: string, caption: string }

let bench: StoryBench
let hero: ReadyPhoto
let shots: ReadyPhoto[] = []
let slug = ''
let ownGallerySlug = ''

/** The sizes the photo jobs promise (docs/api/photos.md): the standard widths up to the photo's, and its own. */
function expectedWidths(width: number): number[] {
  return [...new Set([...PHOTO_WIDTHS.filter(w => w <= width), ...(width < PHOTO_WIDTHS.at(-1)! ? [width] : [])])].sort((a, b) => a - b)
}

/** Each photo its own colours, so no two uploads share a SHA-256. */
function tinted(seed: number): Paint {
  return (x, y) => [(x * 3 + seed * 60) & 255, (y * 2 + ((x * y) % 17)) & 255, ((x + y) * seed) & 255]
}

async function readyPhoto(client: Client, benchTestId: number, spec: typeof HERO, seed: number): Promise<ReadyPhoto> {
  const uploaded = await uploadPhoto(client, benchTestId, await makeJpeg(spec.width, spec.height, tinted(seed)), `bench-${seed}.jpg`)
  expect(uploaded.status).toBe(201)
  const ready = await waitForPhoto(client, benchTestId, uploaded.body.photo.id)
  expect(ready.status).toBe('ready')
  const { caption, credit, altText } = spec
  const photo = expectOk(await client.patch(`/api/photos/${ready.id}`, { caption, credit, altText, version: ready.version })).photo as Photo
  return { photo, caption, credit, altText }
}

async function publish(client: Client, storyId: number) {
  await publishStory(client, storyId)
}

beforeAll(async () => {
  const editor = await signedIn(DEMO.editor)
  bench = await storyBench(editor)
  hero = await readyPhoto(editor, bench.benchTestId, HERO, 1)
  shots = []
  for (const [i, spec] of SHOTS.entries()) shots.push(await readyPhoto(editor, bench.benchTestId, spec, i + 2))

  // The body's photos are what attaches them to the story; the hero is a field of its own.
  const placed = shots.map(s => `::photo{id=${s.photo.id} size="inline"}\n::`).join('\n\n')
  const story = await createStory(editor, bench.benchTestId, { body: storyBody(bench, `\n${placed}\n`), deck: 'A cam swap, photographed.' })
  expectOk(await editor.patch(`/api/stories/${story.id}`, { heroPhotoId: hero.photo.id, version: story.version }))
  await publish(editor, story.id)
  slug = story.slug

  const own = await createStory(editor, bench.benchTestId, { body: storyBody(bench, `\n::gallery{ids="${shots.map(s => s.photo.id).join(',')}" caption="Building the long block"}\n::\n`) })
  await publish(editor, own.id)
  ownGallerySlug = own.slug
}, 180_000)

afterAll(closeTestDb)

/** The attributes of every image under `selector`, from a document parsed out of `html` (or the live page). */
async function imagesIn(page: Page, selector: string, html?: string): Promise<ImgAttrs[]> {
  return page.evaluate(({ selector, html }) => {
    const doc = html === undefined ? document : new DOMParser().parseFromString(html, 'text/html')
    return [...doc.querySelectorAll<HTMLImageElement>(`${selector} img`)].map(img => ({
      src: img.getAttribute('src') ?? '',
      srcset: img.getAttribute('srcset') ?? '',
      sizes: img.getAttribute('sizes') ?? '',
      loading: img.getAttribute('loading') ?? '',
      alt: img.getAttribute('alt') ?? '',
      caption: img.closest('figure')?.querySelector('figcaption')?.textContent?.replace(/\s+/g, ' ').trim() ?? '',
    }))
  }, { selector, html })
}

function srcsetOf(attrs: ImgAttrs): { url: string, width: number }[] {
  return attrs.srcset.split(',').map((entry) => {
    const [url, descriptor] = entry.trim().split(/\s+/)
    expect(descriptor).toMatch(/^\d+w$/)
    return { url: url!, width: Number.parseInt(descriptor!, 10) }
  })
}

/** srcset lists exactly the photo's web sizes, by width, at the URLs the API gave. */
function expectResponsive(attrs: ImgAttrs, ready: ReadyPhoto) {
  const candidates = srcsetOf(attrs)
  expect(candidates.map(c => c.width)).toEqual(expectedWidths(ready.photo.width))
  expect(candidates).toEqual(ready.photo.variants.map(v => ({ url: v.url, width: v.width })))
  expect(candidates.map(c => c.url)).toContain(attrs.src)
  expect(attrs.sizes).not.toBe('')
  expect(attrs.alt).toBe(ready.altText)
  expect(attrs.caption).toContain(ready.caption)
  expect(attrs.caption).toContain(`Photo: ${ready.credit}`)
}

/** The width of the srcset candidate the browser chose, once the image has loaded. */
async function chosenWidth(page: Page, selector: string): Promise<number> {
  const img = page.locator(selector)
  await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth > 0), { timeout: 15_000 }).toBe(true)
  return img.evaluate((el: HTMLImageElement) => el.naturalWidth)
}

async function focusedTestId(page: Page): Promise<string> {
  return page.evaluate(() => document.activeElement?.getAttribute('data-testid') ?? '')
}

describe('a reader on a story with photos', () => {
  let browser: BrowserSession
  beforeAll(async () => { browser = await openBrowser() })
  afterAll(async () => { await browser?.close() })

  it('serves the hero and the gallery at every web size, lazily below the hero, with alt text, caption and credit', async () => {
    const { page } = browser
    const response = await page.request.get(`/stories/${slug}`)
    expect(response.status()).toBe(200)
    const html = await response.text()

    await gotoReady(page, `/stories/${slug}`)
    for (const source of [html, undefined]) {
      const [heroImg, ...more] = await imagesIn(page, '[data-testid="story-hero"]', source)
      expect(more).toEqual([])
      expectResponsive(heroImg!, hero)
      expect(heroImg!.loading).toBe('eager')

      const gallery = await imagesIn(page, '[data-testid="gallery"] li', source)
      expect(gallery.map(g => g.alt).sort()).toEqual(shots.map(s => s.altText).sort())
      for (const img of gallery) {
        expectResponsive(img, shots.find(s => s.altText === img.alt)!)
        expect(img.loading).toBe('lazy')
      }
    }
    // The hero is no gallery photo.
    expect(await page.getByTestId(`gallery-photo-${hero.photo.id}`).count()).toBe(0)

    // Every size of the hero and of one gallery photo answers an anonymous reader as an image.
    const urls = [hero, shots[0]!].flatMap(p => p.photo.variants.map(v => v.url))
    for (const url of urls) {
      const image = await page.request.get(url)
      expect(image.status(), url).toBe(200)
      expect(image.headers()['content-type'], url).toMatch(/^image\//)
      expect((await image.body()).length, url).toBeGreaterThan(1000)
    }
  })

  it('opens the lightbox on a photo, steps through with the arrow keys and closes on Escape and on its button', async () => {
    const { page } = browser
    await gotoReady(page, `/stories/${slug}`)
    const lightbox = page.getByTestId('lightbox')
    const isOpen = () => lightbox.evaluate((d: HTMLDialogElement) => d.open)
    expect(await isOpen()).toBe(false)

    // The gallery's order is the page's; the arrows follow it and wrap around.
    const order = await page.locator('[data-testid="gallery"] [data-testid^="gallery-photo-"]').evaluateAll(els => els.map(el => el.getAttribute('data-testid')!))
    const photoAt = (i: number) => shots.find(s => `gallery-photo-${s.photo.id}` === order[(i + order.length) % order.length])!
    expect(order).toHaveLength(shots.length)

    const shownInLightbox = async (ready: ReadyPhoto) => {
      await expect.poll(() => lightbox.locator('img').getAttribute('alt')).toBe(ready.altText)
      const [img] = await imagesIn(page, '[data-testid="lightbox"]')
      expect(srcsetOf(img!)).toEqual(ready.photo.variants.map(v => ({ url: v.url, width: v.width })))
      expect(img!.loading).toBe('eager')
      expect(img!.caption).toContain(ready.caption)
      expect(img!.caption).toContain(`Photo: ${ready.credit}`)
    }

    const first = page.getByTestId(order[0]!)
    const thumbWidth = await (async () => {
      await first.scrollIntoViewIfNeeded()
      return chosenWidth(page, `[data-testid="${order[0]}"] img`)
    })()
    await first.click()
    await expect.poll(isOpen).toBe(true)
    expect(await lightbox.getAttribute('open')).not.toBeNull()
    await shownInLightbox(photoAt(0))
    // Focus went into the dialog, so its coming back below is the dialog's doing.
    expect(await lightbox.evaluate(d => d.contains(document.activeElement))).toBe(true)
    // The same photo, larger: the browser took a bigger size from the same srcset.
    expect(await chosenWidth(page, '[data-testid="lightbox"] img')).toBeGreaterThan(thumbWidth)

    await page.keyboard.press('ArrowRight')
    await shownInLightbox(photoAt(1))
    await page.keyboard.press('ArrowRight')
    await shownInLightbox(photoAt(2))
    await page.keyboard.press('ArrowLeft')
    await shownInLightbox(photoAt(1))
    await page.keyboard.press('ArrowLeft')
    await page.keyboard.press('ArrowLeft')
    await shownInLightbox(photoAt(-1))

    await page.keyboard.press('Escape')
    await expect.poll(isOpen).toBe(false)
    expect(await lightbox.getAttribute('open')).toBeNull()
    expect(await lightbox.locator('img').count()).toBe(0)
    await expect.poll(() => focusedTestId(page)).toBe(order[0])

    // By keyboard: Enter on another photo opens it there; the close button closes.
    const second = page.getByTestId(order[1]!)
    await second.focus()
    await page.keyboard.press('Enter')
    await expect.poll(isOpen).toBe(true)
    await shownInLightbox(photoAt(1))
    await page.getByTestId('lightbox-close').click()
    await expect.poll(isOpen).toBe(false)
    await expect.poll(() => focusedTestId(page)).toBe(order[1])
  })

  it('has no serious or critical accessibility problems with the lightbox open', async () => {
    const { page } = browser
    await gotoReady(page, `/stories/${slug}`)
    await page.getByTestId(`gallery-photo-${shots[0]!.photo.id}`).click()
    await expect.poll(() => page.getByTestId('lightbox').evaluate((d: HTMLDialogElement) => d.open)).toBe(true)
    await chosenWidth(page, '[data-testid="lightbox"] img')
    expect(await seriousViolations(page)).toEqual([])
  })

  it('shows a body\'s own ::gallery at every web size, lazily, in place of the reader\'s gallery', async () => {
    const { page } = browser
    await gotoReady(page, `/stories/${ownGallerySlug}`)
    expect(await page.getByTestId('gallery').count()).toBe(0)
    const figure = page.getByTestId('figure-gallery')
    expect(await figure.locator('figcaption').last().textContent()).toContain('Building the long block')
    const imgs = await page.evaluate(() => [...document.querySelectorAll<HTMLImageElement>('[data-testid="figure-gallery"] li img')].map(img => ({
      src: img.getAttribute('src') ?? '',
      srcset: img.getAttribute('srcset') ?? '',
      sizes: img.getAttribute('sizes') ?? '',
      loading: img.getAttribute('loading') ?? '',
      alt: img.getAttribute('alt') ?? '',
      caption: img.closest('li')?.querySelector('p')?.textContent?.replace(/\s+/g, ' ').trim() ?? '',
    })))
    // In the order the body names them.
    expect(imgs.map(i => i.alt)).toEqual(shots.map(s => s.altText))
    for (const [i, img] of imgs.entries()) {
      expectResponsive(img, shots[i]!)
      expect(img.loading).toBe('lazy')
    }
  })
})
