import { describe, expect, it } from 'vitest'
import { parseFigure } from '#shared/utils/story-body'
import { findFigures } from '#shared/utils/story-markup'
import { blockFigureSnippet, inlineValueSnippet, insertSnippet } from '#shared/utils/figure-snippets'
import { changedFields, copyDiffers, draftOf, parseDraftCopy, patchBody, tagsFromText } from '#shared/utils/story-draft'
import { sideBySide } from '#shared/utils/revision-diff'
import { diffLines } from '#shared/utils/story-diff'
import { graphChartOptions, graphSize, legendRows } from '#shared/utils/figure-charts'
import type { Story } from '#shared/types/stories'

describe('figure snippets from the picker', () => {
  it('writes a graph the server\'s own parser reads back with the same options', () => {
    const { text, problems } = blockFigureSnippet('pull-graph', { setups: [12, 13], channel: 'power', from: 2500, to: 6500, caption: 'Cam "A" vs {stock}' })
    expect(problems).toEqual([])
    expect(text).toBe('::pull-graph{setups="12,13" channel="power" from=2500 to=6500 caption="Cam \u201DA\u201D vs (stock)"}\n::')
    const [use] = findFigures(text)
    const parsed = parseFigure(use!)
    expect(parsed?.success).toBe(true)
    expect(parsed?.data).toMatchObject({ setups: [12, 13], channel: 'power', from: 2500, to: 6500 })
  })

  it('refuses options the schema refuses, before they reach the text', () => {
    expect(blockFigureSnippet('pull-graph', { from: 6000, to: 3000 }).problems).toHaveLength(1)
    expect(blockFigureSnippet('cam-card', {}).problems.length).toBeGreaterThan(0)
    expect(inlineValueSnippet({ of: 'not-a-figure', setup: 3 }).problems.length).toBeGreaterThan(0)
  })

  it('writes an inline value the body parser finds as one', () => {
    const { text } = inlineValueSnippet({ of: 'peak-power-gain', setup: 13, vs: 12 })
    expect(text).toBe(':figure-value{of="peak-power-gain" setup=13 vs=12}')
    expect(findFigures(`The cam gained ${text} at the peak.`)).toMatchObject([{ kind: 'inline', name: 'figure-value', props: { of: 'peak-power-gain', setup: '13', vs: '12' } }])
  })

  it('puts a block figure on lines of its own, after the line the cursor is in', () => {
    const body = 'First paragraph.\nSecond line.'
    const at = body.indexOf('paragraph')
    const { body: next, cursor } = insertSnippet(body, at, '::spec-box\n::', 'block')
    expect(next).toBe('First paragraph.\n\n::spec-box\n::\n\nSecond line.')
    expect(next.slice(cursor)).toBe('Second line.')
  })

  it('puts an inline value at the cursor with a space before it', () => {
    const { body, cursor } = insertSnippet('It gained', 9, ':figure-value{of="peak-power" setup=1}', 'inline')
    expect(body).toBe('It gained :figure-value{of="peak-power" setup=1}')
    expect(cursor).toBe(body.length)
  })
})

const story = (over: Partial<Story> = {}) => ({
  headline: 'Cam swap', deck: '', body: 'Text', slug: 'cam-swap', heroPhotoId: null, tags: ['cam'], engineFamily: 'pushrod-v8',
  partType: 'camshaft', searchTitle: '', searchDescription: '', bylineIds: [3], ...over,
}) as Story

describe('the editor draft', () => {
  it('sends only what changed, on top of the version read', () => {
    const saved = draftOf(story())
    const draft = { ...saved, headline: 'Cam swap, tested', tags: ['cam', 'dyno'] }
    const fields = changedFields(draft, saved)
    expect(fields).toEqual(['headline', 'tags'])
    expect(patchBody(draft, fields, 7, true)).toEqual({ version: 7, autosave: true, headline: 'Cam swap, tested', tags: ['cam', 'dyno'] })
  })

  it('reads tags typed on one line', () => {
    expect(tagsFromText(' cam,  small block ,,dyno ')).toEqual(['cam', 'small block', 'dyno'])
  })

  it('offers a kept copy back only when it says something the server does not', () => {
    const copy = { storyId: 5, baseVersion: 3, savedAt: '2026-05-01T10:00:00Z', draft: draftOf(story({ body: 'Typed offline' })) }
    expect(copyDiffers(copy, story())).toBe(true)
    expect(copyDiffers(copy, story({ body: 'Typed offline' }))).toBe(false)
  })

  it('reads a kept copy defensively', () => {
    const copy = { storyId: 5, baseVersion: 3, savedAt: '2026-05-01T10:00:00Z', draft: draftOf(story()) }
    expect(parseDraftCopy(JSON.stringify(copy), 5)).toEqual(copy)
    expect(parseDraftCopy(JSON.stringify(copy), 6)).toBeNull()
    expect(parseDraftCopy('{not json', 5)).toBeNull()
    expect(parseDraftCopy(JSON.stringify({ ...copy, draft: { headline: 1 } }), 5)).toBeNull()
  })
})

describe('revisions side by side', () => {
  it('faces a changed line with the line that replaced it', () => {
    const rows = sideBySide(diffLines('a\nold b\nc', 'a\nnew b\nnew b2\nc'))
    expect(rows.map(r => [r.left?.text ?? null, r.right?.text ?? null])).toEqual([
      ['a', 'a'], ['old b', 'new b'], [null, 'new b2'], ['c', 'c'],
    ])
    expect(rows[3]).toMatchObject({ left: { line: 3 }, right: { line: 4 } })
  })
})

describe('graph views', () => {
  const curves = [{ id: 1, label: 'A', points: [{ rpm: 3000, power: 200, torque: 350 }, { rpm: 6000, power: 400, torque: 350 }] }]
  const units = { power: 'hp', torque: 'lb-ft' }

  it('draws power and torque in two panels, or one of them at full height', () => {
    const both = graphChartOptions({ kind: 'overlay', curves, units, view: 'both' })
    expect((both.series as unknown[]).length).toBe(2)
    const torque = graphChartOptions({ kind: 'overlay', curves, units, view: 'torque' })
    const series = torque.series as { id: string, xAxisIndex: number, data: number[][] }[]
    expect(series.map(s => s.id)).toEqual(['torque-1'])
    expect(series[0]!.xAxisIndex).toBe(0)
    expect(series[0]!.data[0]).toEqual([3000, 350])
    expect((torque.grid as unknown[]).length).toBe(1)
    expect(graphSize('torque').height).toBeLessThan(graphSize('both').height)
  })

  it('keeps the zero line of a gain graph in a one-panel view', () => {
    const power = graphChartOptions({ kind: 'gain', curves, units, view: 'power', baselineLabel: 'Base' })
    const series = power.series as { markLine?: unknown }[]
    expect(series[0]!.markLine).toBeDefined()
  })
})

describe('room for the legend in the server\'s SVG', () => {
  const long = (id: number, label: string) => ({ id, label, points: [{ rpm: 3000, power: 200, torque: 350 }, { rpm: 6000, power: 400, torque: 350 }] })
  const units = { power: 'hp', torque: 'lb-ft' }

  it('keeps a short legend on one row', () => {
    const o = graphChartOptions({ kind: 'overlay', curves: [long(1, 'Baseline'), long(2, 'Cam')], units, view: 'both', legendWidth: 720 })
    expect((o.legend as { orient?: string }).orient).toBeUndefined()
  })

  it('counts the rows long setup names need', () => {
    expect(legendRows(['Baseline', 'Cam'], 720)).toBe(1)
    expect(legendRows(['Stock intake, 60 mm throttle', 'Tuned intake, 60 mm throttle', 'Tuned intake, 70 mm throttle'], 720)).toBe(2)
  })

  it('stacks a legend that would wrap, one setup per row, and moves the panels below it', () => {
    const curves = ['Stock intake, 60 mm throttle', 'Tuned intake, 60 mm throttle', 'Tuned intake, 70 mm throttle'].map((l, i) => long(i + 1, l))
    const o = graphChartOptions({ kind: 'overlay', curves, units, view: 'both', legendWidth: 720 })
    expect((o.legend as { orient: string }).orient).toBe('vertical')
    const [a, b] = o.grid as { top: number, height: number }[]
    expect(a!.top).toBe(48 + 2 * 20)
    expect(b!.top).toBeGreaterThanOrEqual(a!.top + a!.height + 40)
    expect(b!.top + b!.height).toBeLessThanOrEqual(graphSize('both').height - 40)
  })

  it('leaves the legend out of the live graph, which names its curves beside it', () => {
    const o = graphChartOptions({ kind: 'overlay', curves: [long(1, 'A')], units, view: 'both' })
    expect((o.legend as { show: boolean }).show).toBe(false)
  })
})
