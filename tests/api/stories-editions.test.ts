// Editions (issue 13): what an editor approved is what readers see. The editor's
// figures and the reader's are the same for every figure kind and every ordered pair
// of setups; later workspace changes (a new setup, a new pull, a part note) reach no
// public answer; a data change is shown to the desk with the figures it moves, and a
// correction publishes a new edition with a dated note readers see.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { INLINE_FIGURES } from '#shared/types/story-figures'
import { inlineFigureValue } from '#shared/stories/figure-values'
import { gainCurves, graphSetups, overlayCurves, resultsTableRows } from '#shared/utils/figure-data'
import { figureSourceOf } from '#shared/utils/story-figure-use'
import { Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { buildDemoBenchTest } from '../../server/db/demo/bench-tests'
import { DEMO_MAGAZINE_TESTS } from '../../server/db/demo/magazine-tests'
import { DEMO, createSetup, expectOk, importFiles, pullFile } from '../support/workspace'
import { CAM_MODEL, createStory, publishStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'

afterAll(closeTestDb)

const HEADERS_MODEL = { peakTorqueLbFt: 436, peakTorqueRpm: 4600, widthLowRpm: 2400, widthHighRpm: 2200 }
let bench: StoryBench
let headersId: number
let editor: Client
let setups: number[]
let seed = 91_000

async function approveAndPublish(storyId: number) {
  await publishStory(editor, storyId)
}

/** Every figure kind over every ordered pair of the three setups. */
function everyPairBody(ids: number[]): string {
  const lines = ['Three setups on one engine, every pair compared.', '', `::pull-graph{setups="${ids.join(',')}"}`, '::', '::results-table', '::', '::spec-box', '::']
  for (const a of ids) {
    lines.push(`::results-table{baseline=${a}}`, '::')
    for (const b of ids) {
      if (a === b) continue
      lines.push(`::gain-graph{baseline=${a} setups="${b}"}`, '::')
      lines.push(INLINE_FIGURES.filter(f => f.pair).map(f => `:figure-value{of="${f.id}" setup=${b} vs=${a}}`).join(' '))
    }
    lines.push(INLINE_FIGURES.filter(f => !f.pair).map(f => `:figure-value{of="${f.id}" setup=${a}}`).join(' '))
  }
  return lines.join('\n')
}

beforeAll(async () => {
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(editor)
  const headers = await createSetup(editor, bench.benchTestId, 'Long-tube headers')
  headersId = headers.id
  expectOk(await importFiles(editor, bench.benchTestId, [1, 2].map(n => pullFile(`headers-${n}.csv`, headersId, { ...HEADERS_MODEL, seed: seed++ }))), 201)
  setups = [bench.baselineId, bench.camId, headersId]
}, 120_000)

/**
 * The editor's figures and the reader's, compared for every figure kind over every
 * ordered pair of `ids`; returns how many pair values were compared.
 */
function expectParity(ids: number[], editorFigures: any, reader: any, opts: { idleEverywhere: boolean }): number {
  const ed = figureSourceOf(editorFigures)!
  const rd = figureSourceOf(reader)!
  let compared = 0
  for (const a of ids) {
    for (const f of INLINE_FIGURES.filter(x => !x.pair)) {
      expect(inlineFigureValue(rd, { of: f.id, setup: a }), `${f.id} of ${a}`).toEqual(inlineFigureValue(ed, { of: f.id, setup: a }))
    }
    expect(resultsTableRows(reader.analysis, reader.comparisons, undefined, a)).toEqual(resultsTableRows(editorFigures.analysis, editorFigures.comparisons, undefined, a))
    for (const b of ids) {
      if (a === b) continue
      for (const f of INLINE_FIGURES.filter(x => x.pair)) {
        const value = inlineFigureValue(rd, { of: f.id, setup: b, vs: a })
        // Without idle checks on every setup, the one figure the data cannot give.
        if (opts.idleEverywhere || f.id !== 'idle-vacuum-change') expect(value.problem, `${f.id} of ${b} vs ${a}`).toBeNull()
        expect(value).toEqual(inlineFigureValue(ed, { of: f.id, setup: b, vs: a }))
        compared++
      }
      for (const units of ['hp-lbft', 'kw-nm'] as const) {
        const readerCurve = gainCurves(reader.analysis, a, graphSetups(reader.analysis, [b]).setups, { units })
        expect(readerCurve).toHaveLength(1)
        expect(readerCurve).toEqual(gainCurves(editorFigures.analysis, a, graphSetups(editorFigures.analysis, [b]).setups, { units }))
      }
    }
    for (const units of ['hp-lbft', 'kw-nm'] as const) {
      expect(overlayCurves(reader.analysis, graphSetups(reader.analysis, ids).setups, { units }))
        .toEqual(overlayCurves(editorFigures.analysis, graphSetups(editorFigures.analysis, ids).setups, { units }))
    }
  }
  // The drawn curves (and so every readout) are the very same points.
  expect(reader.analysis.setups.map((s: any) => s.curve)).toEqual(editorFigures.analysis.setups.map((s: any) => s.curve))
  expect(reader.buildSheet).toEqual(editorFigures.buildSheet)
  return compared
}

describe('one pipeline: the editor and the reader', () => {
  it('give identical values for every figure kind and every ordered pair of setups', async () => {
    const story = await createStory(editor, bench.benchTestId, { body: everyPairBody(setups) })
    const editorFigures = expectOk(await editor.get(`/api/stories/${story.id}/figures`))
    await approveAndPublish(story.id)
    const reader = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`)).figures
    expect(expectParity(setups, editorFigures, reader, { idleEverywhere: false })).toBe(6 * INLINE_FIGURES.filter(x => x.pair).length)
  })

  it('on the demo magazine\'s camshaft bench test, four cams, every ordered pair', async () => {
    // The test profile leaves the magazine's bench tests out (PULLSHEET_DEMO_STORIES=0):
    // this one is built here by the same demo module the seed uses, with the same seeds.
    const camTest = DEMO_MAGAZINE_TESTS.find(t => t.benchTest.partType === 'camshaft')!
    const db = testDb()
    let benchTestId = (await db('bench_tests').where({ slug: camTest.slug }).first('id'))?.id as number | undefined
    if (!benchTestId) {
      const writer = await db('users').where({ email: DEMO.writer }).first('id')
      benchTestId = await buildDemoBenchTest(db, Number(writer.id), camTest, 20_000)
    }
    const demoSetups = expectOk(await editor.get(`/api/bench-tests/${benchTestId}/setups`)).setups.map((s: any) => s.id) as number[]
    expect(demoSetups).toHaveLength(camTest.setups.length)
    const story = await createStory(editor, benchTestId, { body: everyPairBody(demoSetups) })
    const editorFigures = expectOk(await editor.get(`/api/stories/${story.id}/figures`))
    await approveAndPublish(story.id)
    const reader = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`)).figures
    expect(expectParity(demoSetups, editorFigures, reader, { idleEverywhere: true })).toBe(4 * 3 * INLINE_FIGURES.filter(x => x.pair).length)
    // The reader's other standard and units: the same results table as the workspace's analysis.
    const switched = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}/figures?standard=din-70020&units=kw-nm`))
    const workspace = expectOk(await editor.get(`/api/bench-tests/${benchTestId}/analysis?standard=din-70020&units=kw-nm&setups=${demoSetups.join(',')}`))
    expect(switched.analysis.standard).toBe('din-70020')
    expect(switched.analysis.table).toEqual(workspace.table)
  }, 120_000)
})

describe('everywhere a reader meets a story, its published edition', () => {
  const word = () => Math.random().toString(36).replace(/[^a-z]/g, '').slice(0, 8).padEnd(6, 'q')
  const approvedWord = `approved${word()}`
  const laterWord = `unapproved${word()}`
  const tag = `edition-${word()}`
  let story: { id: number, slug: string, version: number }

  beforeAll(async () => {
    story = await createStory(editor, bench.benchTestId, {
      headline: `Cam test ${approvedWord}`,
      deck: `The deck ${approvedWord} as approved.`,
      tags: [tag],
      body: storyBody(bench),
    })
    await approveAndPublish(story.id)
    // An editor may edit a live story's text; readers get it only through a new approval.
    const live = expectOk(await editor.get(`/api/stories/${story.id}`)).story
    expectOk(await editor.patch(`/api/stories/${story.id}`, {
      version: live.version,
      headline: `Cam test ${laterWord}`,
      deck: `The deck ${laterWord} not yet approved.`,
      searchTitle: `Search title ${laterWord}`,
      searchDescription: `Search description ${laterWord}.`,
    }))
  }, 120_000)

  it('shows the approved headline and deck on the home page, the lists, the search and the feed, never a later edit', async () => {
    const anonymous = new Client()
    const pages: [string, string][] = []
    for (const path of ['/', `/stories/${story.slug}`, `/tags/${tag}`, '/search?q=cam', '/feed.xml']) {
      const res = await fetch(`${anonymous.base}${path}`)
      expect(res.status, path).toBe(200)
      pages.push([path, await res.text()])
    }
    for (const path of ['/api/magazine/home', '/api/magazine/latest', '/api/magazine/engine/pushrod-v8', '/api/magazine/part/exhaust', `/api/magazine/tags/${tag}`, `/api/magazine/search?q=${approvedWord}`, `/api/magazine/stories/${story.slug}`]) {
      pages.push([path, JSON.stringify(expectOk(await anonymous.get(path)))])
    }
    for (const [path, text] of pages) {
      expect(text, path).not.toContain(laterWord)
      if (path !== '/search?q=cam') expect(text, path).toContain(`Cam test ${approvedWord}`)
    }
    const found = expectOk(await anonymous.get(`/api/magazine/search?q=${approvedWord}`))
    expect(found.stories.map((s: any) => s.slug)).toEqual([story.slug])
    expect(found.stories[0].deck).toBe(`The deck ${approvedWord} as approved.`)
    expect(expectOk(await anonymous.get(`/api/magazine/search?q=${laterWord}`)).total).toBe(0)
  })
})

describe('an edition is frozen', () => {
  let story: { id: number, slug: string }
  let before: any
  const embargoLabel = `Embargoed intake ${Math.random().toString(36).slice(2, 8)}`
  const partNote = `Secret part note ${Math.random().toString(36).slice(2, 8)}`
  const lateFile = `late-pull-${Math.random().toString(36).slice(2, 8)}.csv`

  beforeAll(async () => {
    const body = [
      `::pull-graph{setups="${bench.baselineId},${bench.camId}"}`, '::',
      `It gained :figure-value{of="peak-power-gain" setup=${bench.camId}} and :figure-value{of="average-torque-gain" setup=${bench.camId}} on average.`,
      `::cam-card{setup=${bench.camId}}`, '::',
    ].join('\n')
    story = await createStory(editor, bench.benchTestId, { body })
    await approveAndPublish(story.id)
    before = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`))
    // After publication: a new setup with a noted part and a pull, a pull on the cam
    // setup that moves its average, and a part note on the cam setup the story shows.
    const late = await createSetup(editor, bench.benchTestId, embargoLabel, { parts: [{ category: 'other', title: 'Intake for next month', notes: partNote }] })
    expectOk(await importFiles(editor, bench.benchTestId, [pullFile(lateFile, late.id, { ...HEADERS_MODEL, seed: seed++ })]), 201)
    expectOk(await importFiles(editor, bench.benchTestId, [pullFile(`more-${lateFile}`, bench.camId, { ...CAM_MODEL, peakTorqueLbFt: 470, seed: seed++ })]), 201)
    const cam = expectOk(await editor.get(`/api/bench-tests/${bench.benchTestId}/setups`)).setups.find((s: any) => s.id === bench.camId)
    expectOk(await editor.patch(`/api/bench-tests/${bench.benchTestId}/setups/${bench.camId}`, { version: cam.version, parts: [...cam.parts, { category: 'other', title: 'Spacer', notes: partNote }] }))
  }, 120_000)

  it('keeps every public answer, the page and every download free of what came later', async () => {
    const anonymous = new Client()
    const reader = await signedIn(DEMO.reader)
    const answers: string[] = []
    for (const client of [anonymous, reader]) {
      answers.push(await (await fetch(`${client.base}/stories/${story.slug}`, { headers: client.cookie ? { cookie: client.cookie } : {} })).text())
      for (const path of ['', '/figures', '/analysis', '/data.csv', '/figures?standard=iso-1585&units=kw-nm', '/analysis?standard=din-70020&units=kw-nm', '/data.csv?standard=none']) {
        const res = await client.get(`/api/magazine/stories/${story.slug}${path}`)
        expect(res.status, path).toBe(200)
        answers.push(typeof res.body === 'string' ? res.body : JSON.stringify(res.body))
      }
    }
    for (const text of answers) {
      expect(text).not.toContain(embargoLabel)
      expect(text).not.toContain(partNote)
      expect(text).not.toContain(lateFile)
    }
  })

  it('shows readers the published figures unchanged', async () => {
    const after = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`))
    expect(after.figures).toEqual(before.figures)
    expect(after.story.body).toBe(before.story.body)
  })

  it('tells the desk the data changed since approval, with each figure that moves, old and new', async () => {
    const status = expectOk(await editor.get(`/api/stories/${story.id}/edition`))
    expect(status.dataChanged).toBe(true)
    expect(status.textChanged).toBe(false)
    expect(status.current.number).toBe(1)
    expect(status.published.number).toBe(1)
    expect(status.current.contentHash).toMatch(/^[0-9a-f]{64}$/)
    const moved = status.moved.find((m: any) => m.label.startsWith('Average torque gain'))
    expect(moved).toBeTruthy()
    expect(moved.old).not.toBe(moved.new)
    expect(status.moved.some((m: any) => m.label.includes(embargoLabel))).toBe(false)
  })

  it('needs a new approval to reach readers: a correction with a dated note, the first edition kept', async () => {
    const refused = await transition(editor, story.id, 'publish_correction', { note: 'Added a third cam pull.' })
    expect(refused.status).toBe(422)
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expect((await transition(editor, story.id, 'publish_correction')).status).toBe(400)
    expectOk(await transition(editor, story.id, 'publish_correction', { note: 'Added a third cam pull; the average gain moved.' }))
    // A signed-in reader: never served from the page cache, which drops within 2 s anyway.
    const reader = await signedIn(DEMO.reader)
    const view = expectOk(await reader.get(`/api/magazine/stories/${story.slug}`))
    expect(view.edition.number).toBe(2)
    expect(view.edition.corrections).toEqual([{ number: 2, at: expect.any(String), note: 'Added a third cam pull; the average gain moved.' }])
    expect(view.figures.comparisons).not.toEqual(before.figures.comparisons)
    expect(JSON.stringify(view)).not.toContain(embargoLabel)
    const html = await (await fetch(`${reader.base}/stories/${story.slug}`, { headers: { cookie: reader.cookie } })).text()
    expect(html).toContain('Added a third cam pull; the average gain moved.')
    expect(html).toContain('data-testid="story-corrections"')
    const status = expectOk(await editor.get(`/api/stories/${story.id}/edition`))
    expect(status.dataChanged).toBe(false)
    expect(status.editions.map((e: any) => [e.number, Boolean(e.publishedAt)])).toEqual([[1, true], [2, true]])
    expect(status.editions[0].correctionNote).toBe('')
  })
})
