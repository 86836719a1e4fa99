// How a story's graph looks on paper: drawn at one of the print edition's column
// widths (site settings, `printColumnsMm`), measured in points, with print-sized
// type, lines thick enough to survive the press and a colour-blind-safe palette
// whose curves also differ by dash. Pure: the server's exports draw the options
// this returns with ECharts and turn them into SVG, PDF or PNG.
import type { LineSeriesOption } from 'echarts/charts'
import type { GridComponentOption } from 'echarts/components'
import { OKABE_ITO, type PullChartOption } from '../utils/chart-options'
import { legendRows } from '../utils/figure-charts'
import type { GraphView } from '../utils/figure-data'

/** The print edition's column spans; their widths are the site settings' `printColumnsMm`. */
export const PRINT_COLUMNS = ['one', 'two', 'three'] as const
export type PrintColumns = typeof PRINT_COLUMNS[number]
export type PrintColumnsMm = Record<PrintColumns, number>

/** 1 pt = 1/72 in = 25.4/72 mm (PostScript point, the unit of PDF pages). */
export const MM_PER_PT = 25.4 / 72

export const mmToPt = (mm: number) => mm / MM_PER_PT
export const ptToMm = (pt: number) => pt * MM_PER_PT

/** The face the figures are set in on paper; the server embeds (PDF) or outlines (SVG) it. */
export const PRINT_FONT = 'Merriweather'

// Type and rules in points. 7 pt is the usual floor for graph labels in a
// magazine, 0.25 pt the thinnest rule a press holds (common practice); data
// lines at 1.25 pt stay distinct at one column.
export const PRINT_TYPE_PT = { label: 7, axisName: 7.5 }
export const PRINT_LINE_PT = { curve: 1.25, axis: 0.6, grid: 0.35, zero: 0.75 }

const INK = '#000000'
const GRID = '#b8b8b8'

/**
 * Okabe and Ito's colour-blind-safe set in an order for paper: black and the
 * darker hues first, the yellow (weak on white stock) last. Web curve i takes
 * print colour i, so a setup keeps one place in every figure of the story.
 */
export const PRINT_PALETTE = ['#000000', '#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#F0E442'] as const

/** The web look's colour -> its place in the palette -> the print colour at that place. */
function printColour(webColour: unknown): string {
  const i = OKABE_ITO.indexOf(String(webColour).toUpperCase() as typeof OKABE_ITO[number])
  return PRINT_PALETTE[i < 0 ? 0 : i]!
}

/** Web dashes are in pixels for 2.25 px lines; on paper the same pattern, shortened to the thinner line. */
function printDash(dash: unknown, scale: number): 'solid' | number[] {
  if (!Array.isArray(dash)) return 'solid'
  return dash.map(d => Math.round(Number(d) * 0.8 * scale * 100) / 100)
}

export interface PrintSize { widthPt: number, heightPt: number, widthMm: number, heightMm: number }

/** The drawing at a column width: two panels need more height than one, and never less than a readable minimum. */
export function printGraphSize(widthMm: number, view: GraphView): PrintSize {
  const widthPt = mmToPt(widthMm)
  const heightPt = Math.round(view === 'both' ? Math.max(widthPt * 0.7, 230) : Math.max(widthPt * 0.5, 130))
  return { widthPt: Math.round(widthPt * 100) / 100, heightPt, widthMm, heightMm: Math.round(ptToMm(heightPt) * 10) / 10 }
}

const asArray = <T>(v: T | T[] | undefined): T[] => (v === undefined ? [] : Array.isArray(v) ? v : [v])

const LEGEND_ROW_PT = 11
const TOP_PT = 8
const BOTTOM_PT = 30
const PANEL_GAP_PT = 22

/**
 * A graph's options (figure-charts.ts, drawn without a legend) re-dressed for
 * paper at this size: print type and rules, the print palette, a legend laid out
 * for the column (one setup per row when one row would not hold them all).
 * `scale` enlarges type, rules and margins together (the social card draws the
 * same graph at screen size).
 */
export function printGraphOption(base: PullChartOption, size: Pick<PrintSize, 'widthPt' | 'heightPt'>, scale = 1): PullChartOption {
  const k = (n: number) => n * scale
  const labels = ((base.legend as { data?: string[] } | undefined)?.data ?? [])
  const left = k(size.widthPt / scale < 200 ? 36 : 44)
  const right = k(8)
  // figure-charts estimates 12 px type; ours is 7 pt, so the same room holds 12/7 times the text.
  const rows = labels.length ? legendRows(labels, ((size.widthPt - left - right) / scale) * (12 / PRINT_TYPE_PT.label) + 88) : 0
  const vertical = rows > 1
  const legendHeight = labels.length ? (vertical ? labels.length : 1) * k(LEGEND_ROW_PT) : 0
  const top = k(TOP_PT) + legendHeight + k(10)

  const grids = asArray(base.grid as GridComponentOption | GridComponentOption[])
  const panel = (size.heightPt - top - k(BOTTOM_PT) - (grids.length > 1 ? k(PANEL_GAP_PT) : 0)) / Math.max(1, grids.length)
  const grid = grids.map((_, i) => ({ left, right, top: top + i * (panel + k(PANEL_GAP_PT)), height: Math.max(40, panel) }))

  const axisText = { fontFamily: PRINT_FONT, fontSize: k(PRINT_TYPE_PT.label), color: INK }
  const nameText = { fontFamily: PRINT_FONT, fontSize: k(PRINT_TYPE_PT.axisName), color: INK }
  const xAxis = asArray(base.xAxis as object | object[]).map(axis => ({
    ...axis,
    nameGap: k(16),
    nameTextStyle: nameText,
    axisLabel: { ...(axis as { axisLabel?: object }).axisLabel, ...axisText, hideOverlap: true },
    axisLine: { lineStyle: { color: INK, width: k(PRINT_LINE_PT.axis) } },
    axisTick: { lineStyle: { color: INK, width: k(PRINT_LINE_PT.axis) } },
    splitLine: { lineStyle: { color: GRID, width: k(PRINT_LINE_PT.grid) } },
  }))
  const yAxis = asArray(base.yAxis as object | object[]).map(axis => ({
    ...axis,
    nameGap: left - k(10),
    nameTextStyle: nameText,
    axisLabel: { ...axisText, hideOverlap: true },
    axisLine: { show: true, lineStyle: { color: INK, width: k(PRINT_LINE_PT.axis) } },
    splitLine: { lineStyle: { color: GRID, width: k(PRINT_LINE_PT.grid) } },
  }))
  const series = asArray(base.series as LineSeriesOption | LineSeriesOption[]).map((s) => {
    const colour = printColour(s.lineStyle?.color ?? s.color)
    const out: LineSeriesOption = {
      ...s,
      color: colour,
      symbol: 'none',
      lineStyle: { color: colour, width: k(PRINT_LINE_PT.curve), type: printDash(s.lineStyle?.type, scale) },
      tooltip: undefined,
    }
    if (s.markLine) out.markLine = { ...s.markLine, lineStyle: { color: INK, type: 'solid', width: k(PRINT_LINE_PT.zero) } }
    return out
  })

  return {
    ...base,
    animation: false,
    aria: { enabled: false },
    tooltip: undefined,
    axisPointer: undefined,
    textStyle: { fontFamily: PRINT_FONT, fontSize: k(PRINT_TYPE_PT.label), color: INK },
    legend: {
      ...(base.legend as object),
      show: labels.length > 0,
      top: k(TOP_PT),
      left,
      orient: vertical ? 'vertical' : 'horizontal',
      // The key is each setup's line and dash alone: ECharts' point symbol on it is hidden.
      itemStyle: { opacity: 0 },
      itemWidth: k(22),
      itemHeight: k(8),
      itemGap: k(vertical ? LEGEND_ROW_PT - 8 : 10),
      textStyle: { fontFamily: PRINT_FONT, fontSize: k(PRINT_TYPE_PT.label), color: INK },
    },
    grid,
    xAxis,
    yAxis,
    series,
  } as PullChartOption
}
