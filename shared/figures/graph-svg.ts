// Story graphs drawn as SVG on the server (ECharts' server-side renderer), so
// they show without JavaScript, print sharp and cost nothing to scroll past. Pure (no
// I/O), so it lives in shared/; only the server render imports it. The
// figure components call this while rendering the page on the server only; the
// browser never downloads ECharts until a graph turns interactive.
import * as echarts from 'echarts/core'
import { LineChart } from 'echarts/charts'
import { AriaComponent, GridComponent, LegendComponent, MarkLineComponent } from 'echarts/components'
import { SVGRenderer } from 'echarts/renderers'
import type { PullChartOption } from '../utils/chart-options'
import { memoOn } from '../utils/object-memo'
import { textHashName } from '../utils/string-hash'

echarts.use([LineChart, GridComponent, LegendComponent, MarkLineComponent, AriaComponent, SVGRenderer])

/**
 * The chart as an SVG string for inline use: no hover styles or class names (they
 * would collide between graphs on one page), hidden from screen readers because
 * the figure carries its own summary and data table.
 */
export function renderGraphSvg(option: PullChartOption, size: { width: number, height: number }): string {
  // Drawing costs tens of ms per graph and the same graph is drawn on every
  // uncached render: keep recent drawings, keyed by exactly what they depend on.
  // A kept option object (FigureGraph's memoOn) skips even building that key.
  const sizeKey = `svg|${size.width}x${size.height}`
  return memoOn(option, sizeKey, () => drawnByValue(option, size))
}

function drawnByValue(option: PullChartOption, size: { width: number, height: number }): string {
  const key = JSON.stringify([size.width, size.height, option])
  const hit = drawn.get(key)
  if (hit !== undefined) {
    drawn.delete(key)
    drawn.set(key, hit) // most recently used last
    return hit
  }
  const svg = drawGraphSvg(option, size, key)
  drawn.set(key, svg)
  if (drawn.size > MAX_DRAWN) drawn.delete(drawn.keys().next().value!)
  return svg
}

const MAX_DRAWN = 200
const drawn = new Map<string, string>()

function drawGraphSvg(option: PullChartOption, size: { width: number, height: number }, key: string): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width: size.width, height: size.height })
  try {
    // A static picture: no pointer, no tooltip, nothing that waits for a mouse.
    chart.setOption({ ...option, tooltip: undefined, axisPointer: undefined, aria: { enabled: false } } as PullChartOption)
    const svg = chart.renderToSVGString()
      .replace(/<style[\s\S]*?<\/style>/g, '')
      .replace(/\sclass="zr\d+-cls-\d+"/g, '')
      .replace(/^<svg /, '<svg aria-hidden="true" focusable="false" preserveAspectRatio="xMidYMid meet" ')
    // The renderer names its clip paths after a counter of the process (zr0-, zr1-...), so
    // the same graph came out with other ids from another process, or after another
    // graph was drawn first. Named after what is drawn, every server sends the same bytes.
    const counterPrefix = /\bzr\d+-/.exec(svg)?.[0]
    return counterPrefix ? svg.replaceAll(counterPrefix, `g${textHashName(key)}-`) : svg
  }
  finally {
    chart.dispose()
  }
}
