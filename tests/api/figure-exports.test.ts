// Figures outside the page: print exports (SVG, PDF at the print edition's column
// widths, the results table as a tagged PDF and CSV), the print package ZIP, the
// social card PNG and the embed page's own framing rules. PDFs are opened with
// poppler (pdfinfo, pdftotext, pdffonts, pdftoppm), the reference PDF reader here.
import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { socialCardVersion } from '#shared/figures/social-card'
import { BASE_URL, Client, signedIn } from '../support/http'
import { csvRows } from '../support/csv'
import { DEMO, expectOk, importFiles, pullFile } from '../support/workspace'
import { approveStory, CAM_MODEL, createStory, publishStory, storyBench, storyBody, type StoryBench } from '../support/stories'

const dir = mkdtempSync(join(tmpdir(), 'pullsheet-exports-'))
const SHOTS = join(process.cwd(), '.data', 'test', 'screenshots')
afterAll(() => {
  // The card and a page of the PDF kept for a look by hand.
  mkdirSync(SHOTS, { recursive: true })
  for (const name of readdirSync(dir).filter(f => /\.png$/.test(f))) writeFileSync(join(SHOTS, `export-${name}`), readFileSync(join(dir, name)))
  rmSync(dir, { recursive: true, force: true })
})

let bench: StoryBench
let editor: Client
const story = { id: 0, slug: '', updatedAt: '', draftId: 0, draftSlug: '' }

async function publish(storyId: number) {
  await publishStory(editor, storyId)
}

/** Raw bytes (the test client reads text). */
async function fetchBytes(path: string, client?: Client, headers: Record<string, string> = {}) {
  const res = await fetch(BASE_URL + path, { headers: { ...(client?.cookie ? { cookie: client.cookie } : {}), ...headers } })
  return { status: res.status, headers: res.headers, bytes: Buffer.from(await res.arrayBuffer()) }
}

function saved(name: string, bytes: Buffer): string {
  const file = join(dir, name)
  writeFileSync(file, bytes)
  return file
}

const poppler = (tool: string, ...args: string[]) => execFileSync(tool, args, { encoding: 'utf8' })

/** "Page size: 155.906 x 230 pts" -> [155.906, 230]. */
function pageSize(pdf: string): [number, number] {
  const m = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(poppler('pdfinfo', pdf))!
  return [Number(m[1]), Number(m[2])]
}

beforeAll(async () => {
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(editor)
  const body = [
    storyBody(bench),
    '',
    `::gain-graph{baseline=${bench.baselineId} caption="What the cam adds"}`,
    '::',
    '',
    '::results-table',
    '::',
  ].join('\n')
  const published = await createStory(editor, bench.benchTestId, { body, headline: 'Long-duration cam: more top end on the test engine' })
  await publish(published.id)
  const view = expectOk(await new Client().get(`/api/magazine/stories/${published.slug}`))
  const draft = await createStory(editor, bench.benchTestId, { body })
  Object.assign(story, { id: published.id, slug: published.slug, updatedAt: view.story.updatedAt, draftId: draft.id, draftSlug: draft.slug })
}, 120_000)

describe('print exports', () => {
  it('a graph as PDF is one page exactly one column wide, with its text in the embedded print face', async () => {
    const res = await fetchBytes(`/api/stories/${story.id}/figures/1/print?format=pdf&columns=one`, editor)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename=".+-figure-1-pull-graph-one-column\.pdf"/)
    const pdf = saved('graph-one.pdf', res.bytes)
    // 55 mm (the default one-column width) / 25.4 mm per inch x 72 pt per inch (PostScript point; NIST SP 811 for the inch).
    const [width, height] = pageSize(pdf)
    expect(width).toBeCloseTo((55 / 25.4) * 72, 1)
    expect(height).toBeGreaterThanOrEqual(130)
    expect(poppler('pdfinfo', pdf)).toMatch(/Pages:\s+1\b/)
    const text = poppler('pdftotext', pdf, '-')
    expect(text).toContain('Engine speed (rpm)')
    expect(text).toContain('Power (hp)')
    expect(text).toContain('Long-duration cam')
    expect(poppler('pdffonts', pdf)).toMatch(/Merriweather\S*\s+CID TrueType\s+Identity-H\s+yes\s+yes/)
    poppler('pdftoppm', '-png', '-r', '150', pdf, join(dir, 'graph-one'))
    expect(readdirSync(dir).some(f => /^graph-one.*\.png$/.test(f))).toBe(true)
  })

  it('the same graph at three columns is 175 mm wide; the gain graph as SVG is sized in millimetres with its text outlined', async () => {
    const pdf = saved('graph-three.pdf', (await fetchBytes(`/api/stories/${story.id}/figures/1/print?format=pdf&columns=three`, editor)).bytes)
    expect(pageSize(pdf)[0]).toBeCloseTo((175 / 25.4) * 72, 1)
    const res = await fetchBytes(`/api/stories/${story.id}/figures/2/print?format=svg&columns=two`, editor)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^image\/svg\+xml/)
    expect(res.headers.get('content-disposition')).toMatch(/^attachment;/)
    const svg = res.bytes.toString('utf8')
    expect(svg).toMatch(/^<\?xml[^>]*>\s*<svg width="115mm" height="[\d.]+mm"/)
    expect(svg).toContain('<title>')
    expect(svg).not.toMatch(/<text\b/)
    expect(svg).toMatch(/aria-label="Engine speed \(rpm\)"/)
    // Curves at 1.25 pt, dashed for the second setup (print style).
    expect(svg).toMatch(/stroke-width="1\.25"/)
  })

  it('the results table is a tagged PDF table and a CSV for layout', async () => {
    const pdf = saved('table.pdf', (await fetchBytes(`/api/stories/${story.id}/figures/3/print?format=pdf&columns=three`, editor)).bytes)
    expect(pageSize(pdf)[0]).toBeCloseTo((175 / 25.4) * 72, 1)
    expect(poppler('pdfinfo', pdf)).toMatch(/Tagged:\s+yes/)
    expect(poppler('pdftotext', '-layout', pdf, '-')).toMatch(/Long-duration cam\s+\d{3} hp at/)
    poppler('pdftoppm', '-png', '-r', '150', pdf, join(dir, 'table-three'))
    // Narrower than three columns: one block of measures per setup.
    const narrow = saved('table-two.pdf', (await fetchBytes(`/api/stories/${story.id}/figures/3/print?format=pdf&columns=two`, editor)).bytes)
    expect(pageSize(narrow)[0]).toBeCloseTo((115 / 25.4) * 72, 1)
    const text = poppler('pdftotext', '-layout', narrow, '-')
    expect(text).toMatch(/Measure\s+Value/)
    expect(text).toMatch(/Peak power \(at rpm\)\s+\d{3} hp at [\d,]+/)
    poppler('pdftoppm', '-png', '-r', '150', narrow, join(dir, 'table-two'))
    const csv = await fetchBytes(`/api/stories/${story.id}/figures/3/print?format=csv`, editor)
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/)
    const rows = csvRows(csv.bytes.toString('utf8'))
    expect(rows[0]).toContain('Peak power (at rpm)')
    expect(rows.map(r => r[0])).toEqual(['Setup', 'Baseline (baseline)', 'Long-duration cam'])
  })

  it('refuses what a figure does not have, and figures a story does not place', async () => {
    expect((await editor.get(`/api/stories/${story.id}/figures/3/print?format=svg`)).status).toBe(422)
    expect((await editor.get(`/api/stories/${story.id}/figures/9/print?format=pdf`)).status).toBe(404)
    expect((await editor.get(`/api/stories/${story.id}/figures/1/print?format=png`)).status).toBe(400)
    expect((await editor.get(`/api/stories/${story.id}/figures/1/print?format=pdf&columns=four`)).status).toBe(400)
  })

  it('the print package holds every figure at every width and the captions file', async () => {
    const res = await fetchBytes(`/api/stories/${story.draftId}/print-package`, editor)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/zip')
    const zip = saved('package.zip', res.bytes)
    const listing = execFileSync('unzip', ['-Z1', zip], { encoding: 'utf8' }).split('\n').filter(Boolean)
    expect(listing).toContain(`${story.draftSlug}/captions-and-credits.txt`)
    expect(listing.filter(f => f.endsWith('.pdf'))).toHaveLength(9) // 3 figures x 3 widths
    expect(listing.filter(f => f.endsWith('.svg'))).toHaveLength(6) // 2 graphs x 3 widths
    expect(listing.filter(f => f.endsWith('.csv'))).toHaveLength(1)
    const captions = execFileSync('unzip', ['-p', zip, `${story.draftSlug}/captions-and-credits.txt`], { encoding: 'utf8' })
    expect(captions).toContain('What the cam adds')
    expect(captions).toMatch(/Corrected to /)
  })

  it('is for the story\'s desk only', async () => {
    expect((await new Client().get(`/api/stories/${story.id}/figures/1/print?format=pdf`)).status).toBe(401)
    expect((await (await signedIn(DEMO.reader)).get(`/api/stories/${story.id}/print-package`)).status).toBe(403)
  })
})

describe('social cards', () => {
  it('is a 1200 x 630 PNG kept for a year at its versioned address, with an ETag that answers 304', async () => {
    const path = `/api/magazine/stories/${story.slug}/card.png?v=${socialCardVersion(story)}`
    const res = await fetchBytes(path)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('image/png')
    // PNG signature, then the IHDR chunk: width and height as 4-byte big-endian at bytes 16 and 20 (PNG spec, ISO/IEC 15948).
    expect(res.bytes.subarray(1, 4).toString('latin1')).toBe('PNG')
    expect([res.bytes.readUInt32BE(16), res.bytes.readUInt32BE(20)]).toEqual([1200, 630])
    expect(res.headers.get('cache-control')).toBe('public, max-age=31536000, immutable')
    const etag = res.headers.get('etag')
    expect(etag).toMatch(/^"card-[0-9a-f]+"$/)
    saved('card.png', res.bytes)
    const again = await fetchBytes(path, undefined, { 'if-none-match': etag! })
    expect(again.status).toBe(304)
    // An address without the current version may show a newer card: kept briefly.
    expect((await fetchBytes(`/api/magazine/stories/${story.slug}/card.png`)).headers.get('cache-control')).toBe('public, max-age=600')
  })

  it('the story page names it as its Open Graph and Twitter image', async () => {
    const html = (await new Client().request('GET', `/stories/${story.slug}`, { headers: { accept: 'text/html' } })).body as string
    const card = `/api/magazine/stories/${story.slug}/card.png?v=${socialCardVersion(story)}`
    expect(html).toMatch(new RegExp(`<meta property="og:image" content="https?://[^"]+${card.replace(/[?.]/g, '\\$&')}"`))
    expect(html).toMatch(/<meta name="twitter:card" content="summary_large_image"/)
    expect(html).toMatch(/<meta property="og:image:width" content="1200"/)
  })

  it('a draft has none for the public', async () => {
    expect((await fetchBytes(`/api/magazine/stories/${story.draftSlug}/card.png`)).status).toBe(404)
  })
})

describe('embeds', () => {
  it('the embed page may be framed by any site; every other page keeps refusing', async () => {
    const embed = await new Client().request('GET', `/embed/${story.slug}/1`, { headers: { accept: 'text/html' } })
    expect(embed.status).toBe(200)
    expect(embed.headers.get('x-frame-options')).toBeNull()
    const csp = embed.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('frame-ancestors *')
    expect(csp).toContain(`default-src 'none'`)
    expect(csp).toContain(`form-action 'none'`)
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
    expect(embed.body).toContain('data-figure-svg')
    expect(embed.body).toContain(`/stories/${story.slug}`)

    const page = await new Client().request('GET', `/stories/${story.slug}`, { headers: { accept: 'text/html' } })
    expect(page.headers.get('x-frame-options')).toBe('DENY')
    expect(page.headers.get('content-security-policy')).toContain(`frame-ancestors 'none'`)
  })

  it('a figure the story does not have, or a story readers cannot see, is not found', async () => {
    expect((await new Client().request('GET', `/embed/${story.slug}/9`, { headers: { accept: 'text/html' } })).status).toBe(404)
    expect((await new Client().request('GET', `/embed/${story.draftSlug}/1`, { headers: { accept: 'text/html' } })).status).toBe(404)
  })
})

describe('exports are drawn from the edition, not the workspace', () => {
  it('a pull added after approval and publication moves no desk export and no card; a story still being written follows the workspace', async () => {
    const approved = await createStory(editor, bench.benchTestId, { body: storyBody(bench, '\n::results-table\n::') })
    await approveStory(editor, approved.id)
    const table = async (id: number, number: number) => {
      const res = await fetchBytes(`/api/stories/${id}/figures/${number}/print?format=csv`, editor)
      expect(res.status).toBe(200)
      return res.bytes.toString('utf8')
    }
    const card = async () => (await fetchBytes(`/api/magazine/stories/${story.slug}/card.png?v=${socialCardVersion(story)}`)).headers.get('etag')
    const before = { published: await table(story.id, 3), approved: await table(approved.id, 2), draft: await table(story.draftId, 3), card: await card() }

    // A much stronger cam pull: the cam's averaged curve, and so its peak, moves.
    expectOk(await importFiles(editor, bench.benchTestId, [pullFile(`late-${Date.now()}.csv`, bench.camId, { ...CAM_MODEL, peakTorqueLbFt: 490, seed: 93_001 })]), 201)

    expect(await table(story.draftId, 3)).not.toBe(before.draft)
    expect(await table(story.id, 3)).toBe(before.published)
    expect(await table(approved.id, 2)).toBe(before.approved)
    expect(await card()).toBe(before.card)
  })
})
