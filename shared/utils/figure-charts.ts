// The chart options of a story's graph for one view: power and torque in two
// panels (chart-options.ts), or one of them on its own at full height. Used by
// the server's SVG render and the live graph alike, so both draw the same thing.
import type { GridComponentOption } from 'echarts/components'
import type { LineSeriesOption } from 'echarts/charts'
import { gainChartOptions, overlayChartOptions, type ChartCurve, type ChartUnits, type PullChartOption } from './chart-options'
import type { GraphView } from './figure-data'

export type GraphKind = 'overlay' | 'gain'

export interface GraphChartInput {
  kind: GraphKind
  curves: readonly ChartCurve[]
  units: ChartUnits
  view: GraphView
  /** For gain graphs: what the gains are taken against. */
  baselineLabel?: string
  /**
   * The drawing's width when the legend is drawn in it (the server's SVG): long setup
   * names wrap the legend onto more rows, and the panels move down to make room.
   * Without it there is no legend in the chart (the live graph names its curves beside it).
   */
  legendWidth?: number
}

/** Drawing size of the server's SVG (it scales with the page through its viewBox). */
export function graphSize(view: GraphView): { width: number, height: number } {
  return view === 'both' ? { width: 720, height: 480 } : { width: 720, height: 340 }
}

const PANEL: Record<'power' | 'torque', number> = { power: 0, torque: 1 }
const FULL_GRID: GridComponentOption = { left: 64, right: 24, top: 48, bottom: 48 }

const asArray = <T>(v: T | T[] | undefined): T[] => (v === undefined ? [] : Array.isArray(v) ? v : [v])

// ECharts' plain legend: a 25 px icon, 5 px to the text, 10 px between items. The
// server lays it out with its own guess at text widths, and the reader's browser
// draws the text in its own font, often wider: so the estimate here is generous
// (12 px system text, 7.2 px a character; common practice, checked on screen),
// and a legend that would wrap is drawn one setup per row, which cannot overlap.
const LEGEND = { icon: 30, gap: 10, charPx: 7.2, rowPx: 20, left: 64, right: 24 }

/** How many rows a side-by-side legend would take at this width. */
export function legendRows(labels: readonly string[], width: number): number {
  const room = width - LEGEND.left - LEGEND.right
  let rows = 1
  let x = 0
  for (const label of labels) {
    const w = LEGEND.icon + label.length * LEGEND.charPx + LEGEND.gap
    if (x > 0 && x + w > room) {
      rows++
      x = w
    }
    else x += w
  }
  return rows
}

const TOP = 48
const BOTTOM = 48
const PANEL_GAP = 44

// A legend that does not fit on one row goes one setup per row; the first panel
// starts below it and the two panels share what is left.
function makeRoom(option: PullChartOption, items: number, height: number): PullChartOption {
  const extra = (items - 1) * LEGEND.rowPx
  const grids = asArray(option.grid as GridComponentOption | GridComponentOption[])
  const top = TOP + extra
  const legend = { ...(option.legend as object), orient: 'vertical' as const, itemGap: LEGEND.rowPx - 14 }
  if (grids.length === 1) return { ...option, legend, grid: [{ ...grids[0], top }] }
  const panel = Math.max(60, (height - top - BOTTOM - PANEL_GAP) / 2)
  return { ...option, legend, grid: [{ ...grids[0], top, height: panel }, { ...grids[1], top: top + panel + PANEL_GAP, bottom: undefined, height: panel }] }
}

// The two-panel options already carry every style; one view keeps its own panel,
// gives it the whole height and moves the rpm axis name under it.
function onePanel(option: PullChartOption, channel: 'power' | 'torque'): PullChartOption {
  const keep = PANEL[channel]
  const xAxes = asArray(option.xAxis as object | object[])
  const yAxes = asArray(option.yAxis as object | object[])
  const series = asArray(option.series as LineSeriesOption | LineSeriesOption[])
  const kept = series.filter(s => s.xAxisIndex === keep).map(s => ({ ...s, xAxisIndex: 0, yAxisIndex: 0 }))
  const markLine = series.find(s => s.markLine)?.markLine
  if (markLine && kept[0]) kept[0] = { ...kept[0], markLine }
  return {
    ...option,
    grid: [FULL_GRID],
    xAxis: [{ ...(xAxes[keep] as object), gridIndex: 0, name: 'Engine speed (rpm)', axisLabel: { show: true, color: '#4a5058' } }],
    yAxis: [{ ...(yAxes[keep] as object), gridIndex: 0 }],
    axisPointer: { ...(option.axisPointer as object), link: [{ xAxisIndex: 'all' }] },
    series: kept,
  } as PullChartOption
}

export function graphChartOptions(input: GraphChartInput): PullChartOption {
  const two = input.kind === 'gain'
    ? gainChartOptions({ curves: input.curves, units: input.units, baselineLabel: input.baselineLabel ?? 'the baseline' })
    : overlayChartOptions({ curves: input.curves, units: input.units })
  const shaped = input.view === 'both' ? two : onePanel(two, input.view)
  if (input.legendWidth === undefined) return { ...shaped, legend: { ...(shaped.legend as object), show: false } }
  const labels = ((shaped.legend as { data?: string[] } | undefined)?.data ?? [])
  if (legendRows(labels, input.legendWidth) <= 1) return shaped
  return makeRoom(shaped, labels.length, graphSize(input.view).height)
}
