// Graphs on a phone (issue 15 item 14): a 720 x 480 drawing squeezed into 360 px
// squashes the two panels and runs the axis labels into each other. A narrow graph
// is drawn taller (each panel keeps a usable height), with fewer and smaller ticks
// that hide rather than overlap, and, when the legend is in the chart, one setup
// per row above the panels so no name is cut off. Pure: returns a new option.
import type { GridComponentOption } from 'echarts/components'
import type { PullChartOption } from './chart-options'

/** Below this width (CSS px of the graph's box) a graph is drawn the narrow way. */
export const NARROW_GRAPH_PX = 560

/** Drawing size of a narrow graph: taller than wide when it has two panels. */
export function narrowGraphSize(panels: 1 | 2): { width: number, height: number } {
  return panels === 2 ? { width: 360, height: 540 } : { width: 360, height: 320 }
}

type AnyRecord = Record<string, unknown>
const asList = (v: unknown): AnyRecord[] => (Array.isArray(v) ? v : v ? [v] : []) as AnyRecord[]

const SMALL = 10
const LEGEND_ROW = 18
const GAP = 40
const BOTTOM = 44
const LEFT = 52
const RIGHT = 14

/** `height`: the drawing's height in px; `legend`: draw the legend in the chart, one setup per row. */
export function narrowChartOption(option: PullChartOption, height: number, legend: boolean): PullChartOption {
  const o = option as AnyRecord
  const grids = asList(o.grid) as GridComponentOption[]
  const labels = ((o.legend as { data?: unknown[] } | undefined)?.data ?? []).length
  const top = legend && labels ? 14 + labels * LEGEND_ROW : 24
  const panel = Math.max(80, (height - top - BOTTOM - GAP * (grids.length - 1)) / Math.max(1, grids.length))
  return {
    ...o,
    legend: legend
      ? { ...(o.legend as AnyRecord), show: true, orient: 'vertical', left: RIGHT, top: 8, itemGap: LEGEND_ROW - 14, itemWidth: 20, textStyle: { ...((o.legend as AnyRecord | undefined)?.textStyle as AnyRecord | undefined), fontSize: 11 } }
      : { ...(o.legend as AnyRecord), show: false },
    grid: grids.map((g, i) => ({ ...g, left: LEFT, right: RIGHT, top: top + i * (panel + GAP), height: panel, bottom: undefined })),
    xAxis: asList(o.xAxis).map(axis => ({
      ...axis,
      splitNumber: 3,
      nameGap: 24,
      nameTextStyle: { ...(axis.nameTextStyle as AnyRecord | undefined), fontSize: 11 },
      axisLabel: { ...(axis.axisLabel as AnyRecord | undefined), fontSize: SMALL, hideOverlap: true },
    })),
    yAxis: asList(o.yAxis).map(axis => ({
      ...axis,
      splitNumber: 3,
      nameGap: 36,
      nameTextStyle: { ...(axis.nameTextStyle as AnyRecord | undefined), fontSize: 11 },
      axisLabel: { ...(axis.axisLabel as AnyRecord | undefined), fontSize: SMALL, hideOverlap: true },
    })),
  } as PullChartOption
}
