// Graphs on a phone (issue 15 item 14): panels keep their height, ticks thin out,
// the legend gets a row per setup. Layout rules here are our own (common practice).
import { describe, expect, it } from 'vitest'
import { overlayChartOptions } from '#shared/utils/chart-options'
import { narrowChartOption, narrowGraphSize } from '#shared/utils/chart-narrow'

const curve = (id: number, label: string) => ({ id, label, points: [{ rpm: 3000, power: 300, torque: 520 }, { rpm: 6000, power: 480, torque: 420 }] })
const curves = [curve(1, 'Stock cast manifolds (invented)'), curve(2, 'Long-tube headers 1-3/4 in (invented)'), curve(3, 'Long-tube headers 1-7/8 in (invented)')]
const units = { power: 'hp', torque: 'lb-ft' }

describe('narrow graphs', () => {
  it('are drawn taller than wide with two panels', () => {
    const size = narrowGraphSize(2)
    expect(size.height).toBeGreaterThan(size.width)
  })

  it('give each panel a usable height, below the legend, without overlapping', () => {
    const { height } = narrowGraphSize(2)
    const o = narrowChartOption(overlayChartOptions({ curves, units }), height, true) as any
    const [a, b] = o.grid
    expect(a.height).toBeGreaterThanOrEqual(150)
    expect(b.top).toBeGreaterThan(a.top + a.height)
    expect(b.top + b.height).toBeLessThanOrEqual(height - 30)
    // One setup per row: three rows above the first panel.
    expect(o.legend.orient).toBe('vertical')
    expect(a.top).toBeGreaterThanOrEqual(8 + 3 * 18)
  })

  it('use fewer, smaller ticks that hide instead of overlapping', () => {
    const o = narrowChartOption(overlayChartOptions({ curves, units }), 540, false) as any
    expect(o.legend.show).toBe(false)
    for (const axis of [...o.xAxis, ...o.yAxis]) {
      expect(axis.splitNumber).toBe(3)
      expect(axis.axisLabel.hideOverlap).toBe(true)
    }
  })
})
