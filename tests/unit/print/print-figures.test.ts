// The pure parts of figures outside the page: print sizes and style, the numbering
// of a story's standalone figures, the social card's key gain and text wrapping,
// and the embed page's Content-Security-Policy.
import { describe, expect, it } from 'vitest'
import type { LineSeriesOption } from 'echarts/charts'
import { PRINT_LINE_PT, PRINT_PALETTE, mmToPt, printGraphOption, printGraphSize } from '#shared/figures/print-style'
import { standaloneFigure, standaloneFigureLabel, standaloneFigures } from '#shared/figures/story-figure-list'
import { SOCIAL_CARD, keyGain, socialCardPath, socialCardSvg, wrapText } from '#shared/figures/social-card'
import { OKABE_ITO, curveStyle, overlayChartOptions } from '#shared/utils/chart-options'
import { contentSecurityPolicy, embedContentSecurityPolicy, isEmbedPath } from '../../../server/utils/csp'
import { DEFAULT_SITE_SETTINGS } from '#shared/types/site-settings'
import { source } from '../stories/figure-source'

describe('print sizes', () => {
  // Source: the PostScript/PDF point is 1/72 in (published: PDF 32000-1:2008, 8.3.2.3
  // "default user space unit"); 1 in = 25.4 mm exactly (published: NIST SP 811, B.8).
  it('converts the column widths to points', () => {
    expect(mmToPt(25.4)).toBe(72)
    expect(mmToPt(DEFAULT_SITE_SETTINGS.printColumnsMm.one)).toBeCloseTo(155.906, 3)
    expect(mmToPt(DEFAULT_SITE_SETTINGS.printColumnsMm.three)).toBeCloseTo(496.063, 3)
  })

  it('gives two panels more height than one, and never less than a readable minimum', () => {
    const both = printGraphSize(55, 'both')
    const power = printGraphSize(55, 'power')
    expect(both.heightPt).toBe(230)
    expect(power.heightPt).toBe(130)
    expect(printGraphSize(175, 'both').heightPt).toBe(Math.round(mmToPt(175) * 0.7))
    expect(both.heightMm).toBeCloseTo(81.1, 1)
  })
})

describe('print style', () => {
  const base = overlayChartOptions({
    curves: [0, 1, 2].map(i => ({ id: i + 1, label: `Setup ${i + 1}`, points: [{ rpm: 3000, power: 200 + i, torque: 350 }, { rpm: 6000, power: 400 + i, torque: 330 }] })),
    units: { power: 'hp', torque: 'lb-ft' },
  })
  const printed = printGraphOption(base, { widthPt: 326, heightPt: 240 })
  const series = printed.series as LineSeriesOption[]

  it('draws curves at the print weight, in the print palette, keeping each web curve\'s place and its dash', () => {
    expect(series.every(s => s.lineStyle?.width === PRINT_LINE_PT.curve)).toBe(true)
    // Web curve i is Okabe-Ito colour i; on paper it takes print colour i (yellow, weak on white stock, last).
    expect(series.slice(0, 3).map(s => s.lineStyle?.color)).toEqual([PRINT_PALETTE[0], PRINT_PALETTE[1], PRINT_PALETTE[2]])
    expect(PRINT_PALETTE[PRINT_PALETTE.length - 1]).toBe(OKABE_ITO[3])
    expect(new Set(PRINT_PALETTE.map(c => c.toUpperCase()))).toEqual(new Set(OKABE_ITO))
    expect(series[0]!.lineStyle?.type).toBe('solid')
    expect(series[1]!.lineStyle?.type).toEqual((curveStyle(1).dash as number[]).map(d => d * 0.8))
  })

  it('sets every label in the print face at 7 pt or more and shows a legend', () => {
    expect(printed.textStyle).toMatchObject({ fontFamily: 'Merriweather', fontSize: 7 })
    expect(printed.legend).toMatchObject({ show: true, textStyle: { fontSize: 7 }, itemStyle: { opacity: 0 } })
    expect(printed.tooltip).toBeUndefined()
  })

  it('scales type and rules together for the social card', () => {
    const big = printGraphOption(base, { widthPt: 690, heightPt: 372 }, 2)
    expect((big.series as LineSeriesOption[])[0]!.lineStyle?.width).toBe(PRINT_LINE_PT.curve * 2)
    expect(big.textStyle).toMatchObject({ fontSize: 14 })
  })
})

describe('standalone figures', () => {
  const body = [
    'Intro with :figure-value{of="peak-power" setup=1}.',
    '::photo{id=4}',
    '::',
    '::pull-graph{setups="1,2" channel="power" caption="Power, both cams"}',
    '::',
    '```',
    '::gain-graph{baseline=1}',
    '```',
    '::results-table',
    '::',
    '::cautions',
    '::',
  ].join('\n')

  it('numbers only the data figures, in the body\'s order, skipping code', () => {
    const figures = standaloneFigures(body)
    expect(figures.map(f => [f.number, f.name])).toEqual([[1, 'pull-graph'], [2, 'results-table']])
    expect(figures[0]!.markup).toBe('::pull-graph{setups="1,2" channel="power" caption="Power, both cams"}\n::\n')
    expect(standaloneFigure(body, 2)?.name).toBe('results-table')
    expect(standaloneFigure(body, 3)).toBeNull()
  })

  it('labels them with the caption when there is one', () => {
    const [graph, table] = standaloneFigures(body)
    expect(standaloneFigureLabel(graph!)).toBe('Figure 1, graph: Power, both cams')
    expect(standaloneFigureLabel(table!)).toBe('Figure 2, results table')
  })
})

describe('social card', () => {
  it('shows the largest peak power gain over the baseline, signed and rounded as the text reports it', () => {
    // figure-source.ts: cam + headers gains 44 hp peak to peak over the baseline, the most of the setups.
    expect(keyGain(source())).toEqual({ text: '+44 hp', label: 'Peak power, Long cam + headers vs Baseline' })
  })

  it('says "within repeatability" rather than a gain the repeat pulls cannot tell apart', () => {
    const s = source()
    const within = { peakPower: true, peakTorque: false, averagePower: false, averageTorque: false }
    const rows = s.analysis.table.rows.map(r => (r.vsBaseline ? { ...r, vsBaseline: { ...r.vsBaseline, withinRepeatability: within } } : r))
    const comparisons = s.comparisons.map(c => ({ ...c, gains: { ...c.gains, withinRepeatability: within } }))
    expect(keyGain({ analysis: { ...s.analysis, table: { ...s.analysis.table, rows } }, comparisons })?.text).toBe('within repeatability')
  })

  it('wraps the headline into lines that fit and ends a cut one with an ellipsis', () => {
    const measure = (t: string) => t.length * 10
    expect(wrapText('one two three four', 100, 3, measure)).toEqual(['one two', 'three four'])
    expect(wrapText('one two three four five six', 100, 2, measure)).toEqual(['one two', 'three …'])
  })

  it('is a 1200 x 630 drawing with the headline escaped, and its address changes with the story', () => {
    const svg = socialCardSvg({ siteName: 'Test Magazine', headline: 'Cams & <cranks>', gain: { text: '+31 hp', label: 'Peak power' }, standardLabel: 'SAE J1349', graphSvg: null, measure: (t, size) => t.length * size * 0.5 })
    expect(svg).toMatch(new RegExp(`^<svg [^>]*width="${SOCIAL_CARD.width}" height="${SOCIAL_CARD.height}"`))
    expect(svg).toContain('Cams &amp; &lt;cranks&gt;')
    const a = socialCardPath({ slug: 'a-story', id: 4, updatedAt: '2026-05-01T10:00:00.000Z' })
    const b = socialCardPath({ slug: 'a-story', id: 4, updatedAt: '2026-05-01T10:00:01.000Z' })
    expect(a).toMatch(/^\/api\/magazine\/stories\/a-story\/card\.png\?v=/)
    expect(a).not.toBe(b)
  })
})

describe('embed policy', () => {
  it('lets any site frame the embed page and nothing else; the site keeps refusing', () => {
    const embed = embedContentSecurityPolicy(['abc='])
    expect(embed).toContain('frame-ancestors *')
    expect(embed).toContain(`default-src 'none'`)
    expect(embed).toContain(`script-src 'self' 'sha256-abc='`)
    expect(contentSecurityPolicy([])).toContain(`frame-ancestors 'none'`)
    expect(isEmbedPath('/embed/a-story/2')).toBe(true)
    expect(isEmbedPath('/stories/embed')).toBe(false)
  })
})
