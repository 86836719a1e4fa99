import { describe, expect, it, vi } from 'vitest'
import type { PullChartOption } from '../../../shared/utils/chart-options'
import { fnv1a32, textHashName } from '../../../shared/utils/string-hash'

const SIZE = { width: 320, height: 200 }
const graph = (points: [number, number][]): PullChartOption => ({
  animation: false,
  grid: { left: 40, right: 10, top: 10, bottom: 30 },
  xAxis: { type: 'value', min: 2000, max: 6000 },
  yAxis: { type: 'value' },
  series: [{ type: 'line', data: points, showSymbol: false }],
}) as PullChartOption

const power = graph([[2000, 150], [4000, 300], [6000, 380]])
const torque = graph([[2000, 390], [4000, 420], [6000, 330]])

// A fresh copy of the module each time: its kept drawings start empty, while the chart
// library's own id counter (outside the reset) goes on, as in a process with a history.
async function freshRender() {
  vi.resetModules()
  return (await import('../../../shared/figures/graph-svg')).renderGraphSvg
}

describe('graph SVG ids', () => {
  it('name a graph\'s clip paths after the graph, whatever was drawn before it', async () => {
    let render = await freshRender()
    const powerFirst = render(structuredClone(power), SIZE)
    render(structuredClone(torque), SIZE)
    render = await freshRender()
    const torqueFirst = render(structuredClone(torque), SIZE)
    const powerSecond = render(structuredClone(power), SIZE)

    expect(powerSecond).toBe(powerFirst)
    expect(powerFirst).toMatch(/clip-path="url\(#g[0-9a-z]{7}-c\d+\)"/)
    expect(powerFirst).not.toMatch(/\bzr\d+-/)
    // Two graphs on one page keep ids of their own.
    const ids = (svg: string) => new Set([...svg.matchAll(/id="([^"]+)"/g)].map(m => m[1]))
    const shared = [...ids(powerSecond)].filter(id => ids(torqueFirst).has(id))
    expect(shared).toEqual([])
  })
})

describe('fnv1a32', () => {
  // Test vectors of the FNV reference code (IETF draft-eastlake-fnv, FNV-1a 32-bit); from memory.
  it('matches the reference vectors', () => {
    expect(fnv1a32('')).toBe(0x811C9DC5)
    expect(fnv1a32('a')).toBe(0xE40C292C)
    expect(fnv1a32('foobar')).toBe(0xBF9CF968)
  })

  it('names texts with seven base-36 digits', () => {
    expect(textHashName('')).toMatch(/^[0-9a-z]{7}$/)
    expect(textHashName('a')).not.toBe(textHashName('b'))
  })
})
