// ECharts options for Pullsheet's pull graphs, built as plain data so the same
// figure can be drawn by vue-echarts in the browser and rendered to SVG on the
// server (reader pages). No Vue, no echarts runtime: types only.
import type { ComposeOption } from 'echarts/core'
import type { LineSeriesOption } from 'echarts/charts'
import type {
  AriaComponentOption,
  AxisPointerComponentOption,
  GridComponentOption,
  LegendComponentOption,
  MarkLineComponentOption,
  TooltipComponentOption,
} from 'echarts/components'
import type { CurvePoint } from '../types/analysis-results'
import { interpolateAt } from '../dyno/interpolate'

export type PullChartOption = ComposeOption<
  | LineSeriesOption
  | GridComponentOption
  | TooltipComponentOption
  | LegendComponentOption
  | AxisPointerComponentOption
  | AriaComponentOption
  | MarkLineComponentOption
>

/** Okabe and Ito's colour-blind-safe set, in the order curves take them. */
export const OKABE_ITO = ['#E69F00', '#56B4E9', '#009E73', '#F0E442', '#0072B2', '#D55E00', '#CC79A7', '#000000'] as const

/** Dash patterns (px on, px off) so curves differ in print and without colour. */
export const CURVE_DASHES: readonly ('solid' | number[])[] = [
  'solid', [9, 4], [2, 3], [12, 3, 2, 3], [5, 5], [16, 5], [2, 7], [12, 3, 2, 3, 2, 3],
]

export interface CurveStyle { color: string, dash: 'solid' | number[] }

/**
 * The look of the n-th curve. Colour and dash both change from one curve to the
 * next; past eight curves the dash shifts, so no two of the first 64 look alike.
 */
export function curveStyle(index: number): CurveStyle {
  const i = Math.max(0, Math.floor(index))
  const n = OKABE_ITO.length
  return { color: OKABE_ITO[i % n]!, dash: CURVE_DASHES[(i + Math.floor(i / n)) % CURVE_DASHES.length]! }
}

export interface ChartCurve {
  id: number
  label: string
  points: readonly CurvePoint[]
  /** Which look it takes (keep one per setup across graphs); defaults to its place in the list. */
  styleIndex?: number
}

export interface ChartUnits { power: string, torque: string }

type Channel = 'power' | 'torque'
const CHANNELS: readonly Channel[] = ['power', 'torque']
const CHANNEL_NAME: Record<Channel, string> = { power: 'Power', torque: 'Torque' }

const INK = '#1f2328'
const INK_SOFT = '#4a5058'
const GRID_LINE = '#e2d9cb'
const FONT = 'system-ui, -apple-system, Segoe UI, Roboto, Arial, sans-serif'

function rpmExtent(curves: readonly ChartCurve[]): { min: number, max: number } | undefined {
  let min = Infinity
  let max = -Infinity
  for (const c of curves) {
    for (const p of c.points) {
      if (p.rpm < min) min = p.rpm
      if (p.rpm > max) max = p.rpm
    }
  }
  return Number.isFinite(min) && Number.isFinite(max) ? { min, max } : undefined
}

/** Round the axis ends out to whole 500 rpm so the scale reads like a dyno sheet. */
function niceRpmExtent(curves: readonly ChartCurve[]): { min?: number, max?: number } {
  const e = rpmExtent(curves)
  if (!e) return {}
  return { min: Math.floor(e.min / 500) * 500, max: Math.ceil(e.max / 500) * 500 }
}

function oneDecimal(value: unknown): string {
  return typeof value === 'number' && Number.isFinite(value) ? value.toFixed(1) : '–'
}

interface TwoPanelInput {
  curves: readonly ChartCurve[]
  units: ChartUnits
  axisName: (channel: Channel) => string
  seriesName: (curve: ChartCurve) => string
  zeroLine: boolean
  description: string
}

// Power above, torque below, one rpm axis each and a shared pointer: a dash
// pattern then only has to tell setups apart, never power from torque.
function twoPanelOptions(input: TwoPanelInput): PullChartOption {
  const extent = niceRpmExtent(input.curves)
  const grids: GridComponentOption[] = [
    { left: 72, right: 24, top: 44, height: '36%' },
    { left: 72, right: 24, top: '58%', bottom: 48 },
  ]
  const xAxis = CHANNELS.map((_, gridIndex) => ({
    type: 'value' as const,
    gridIndex,
    ...extent,
    name: gridIndex === 1 ? 'Engine speed (rpm)' : '',
    nameLocation: 'middle' as const,
    nameGap: 28,
    axisLabel: { show: gridIndex === 1, color: INK_SOFT },
    splitLine: { lineStyle: { color: GRID_LINE } },
    axisLine: { lineStyle: { color: INK_SOFT } },
  }))
  const yAxis = CHANNELS.map((channel, gridIndex) => ({
    type: 'value' as const,
    gridIndex,
    scale: !input.zeroLine,
    name: input.axisName(channel),
    // Beside the axis, turned, so the legend above the top panel never covers it.
    nameLocation: 'middle' as const,
    nameRotate: 90,
    nameGap: 46,
    nameTextStyle: { color: INK },
    axisLabel: { color: INK_SOFT },
    splitLine: { lineStyle: { color: GRID_LINE } },
  }))
  const series: LineSeriesOption[] = []
  CHANNELS.forEach((channel, gridIndex) => {
    input.curves.forEach((curve, i) => {
      const style = curveStyle(curve.styleIndex ?? i)
      const s: LineSeriesOption = {
        id: `${channel}-${curve.id}`,
        type: 'line',
        name: input.seriesName(curve),
        xAxisIndex: gridIndex,
        yAxisIndex: gridIndex,
        data: curve.points.map(p => [p.rpm, p[channel]]),
        showSymbol: false,
        smooth: false,
        color: style.color,
        lineStyle: { color: style.color, type: style.dash, width: 2.25 },
        emphasis: { focus: 'series' },
        tooltip: { valueFormatter: value => `${oneDecimal(value)} ${input.units[channel]}` },
      }
      if (input.zeroLine && i === 0) {
        s.markLine = { silent: true, symbol: 'none', label: { show: false }, lineStyle: { color: INK_SOFT, type: 'solid', width: 1 }, data: [{ yAxis: 0 }] }
      }
      series.push(s)
    })
  })
  return {
    animation: false,
    textStyle: { fontFamily: FONT, color: INK },
    aria: { enabled: true, label: { description: input.description } },
    legend: { top: 8, left: 72, data: input.curves.map(c => input.seriesName(c)), textStyle: { color: INK } },
    grid: grids,
    xAxis,
    yAxis,
    axisPointer: { link: [{ xAxisIndex: 'all' }], lineStyle: { color: INK_SOFT } },
    tooltip: { trigger: 'axis', axisPointer: { type: 'line' }, order: 'seriesAsc' },
    series,
  }
}

function listLabels(curves: readonly ChartCurve[]): string {
  return curves.map(c => c.label).join(', ') || 'no setups'
}

/** Torque and power against rpm for each setup's curve. */
export function overlayChartOptions(input: { curves: readonly ChartCurve[], units: ChartUnits }): PullChartOption {
  return twoPanelOptions({
    curves: input.curves,
    units: input.units,
    axisName: channel => `${CHANNEL_NAME[channel]} (${input.units[channel]})`,
    seriesName: c => c.label,
    zeroLine: false,
    description: `Power (${input.units.power}) and torque (${input.units.torque}) against engine speed for ${listLabels(input.curves)}.`,
  })
}

/** Each setup minus the baseline at every rpm; the zero line is the baseline itself. */
export function gainChartOptions(input: { curves: readonly ChartCurve[], units: ChartUnits, baselineLabel: string }): PullChartOption {
  return twoPanelOptions({
    curves: input.curves,
    units: input.units,
    axisName: channel => `${CHANNEL_NAME[channel]} gain (${input.units[channel]})`,
    seriesName: c => `${c.label} vs ${input.baselineLabel}`,
    zeroLine: true,
    description: `Gain in power and torque over ${input.baselineLabel} at each engine speed for ${listLabels(input.curves)}.`,
  })
}

export interface ReadoutValue { id: number, label: string, styleIndex: number, power: number | null, torque: number | null }

/** A curve's value at an rpm, linear between its points; null outside its range (shared/dyno's one interpolation). */
export function curveValueAt(points: readonly CurvePoint[], rpm: number, channel: Channel): number | null {
  return interpolateAt(points, rpm, channel)
}

/** What the readout beside a graph shows at one rpm: every curve's power and torque there. */
export function readoutAt(curves: readonly ChartCurve[], rpm: number): ReadoutValue[] {
  return curves.map((c, i) => ({
    id: c.id,
    label: c.label,
    styleIndex: c.styleIndex ?? i,
    power: curveValueAt(c.points, rpm, 'power'),
    torque: curveValueAt(c.points, rpm, 'torque'),
  }))
}

/** The rpm range any of the curves covers, for the readout's slider. */
export function chartRpmRange(curves: readonly ChartCurve[]): { min: number, max: number } | null {
  return rpmExtent(curves) ?? null
}
