import { describe, expect, it } from 'vitest'
import type { LineSeriesOption } from 'echarts/charts'
import {
  CURVE_DASHES, OKABE_ITO, chartRpmRange, curveStyle, curveValueAt, gainChartOptions, overlayChartOptions, readoutAt,
  type ChartCurve,
} from '#shared/utils/chart-options'

const curve = (id: number, label: string, torqueAt: (rpm: number) => number): ChartCurve => ({
  id,
  label,
  points: [3000, 3500, 4000, 4500, 5000].map(rpm => ({ rpm, torque: torqueAt(rpm), power: (torqueAt(rpm) * rpm) / 5252.113 })),
})
const units = { power: 'hp', torque: 'lb-ft' }
const seriesOf = (o: ReturnType<typeof overlayChartOptions>) => o.series as LineSeriesOption[]

describe('the palette', () => {
  // Published: Okabe and Ito, "Color Universal Design" (2008), the eight colours
  // recommended for figures readable with any common colour-vision deficiency.
  it('is the Okabe-Ito set as published', () => {
    expect([...OKABE_ITO].sort()).toEqual(['#000000', '#0072B2', '#009E73', '#56B4E9', '#CC79A7', '#D55E00', '#E69F00', '#F0E442'])
  })

  // Common practice: curves must differ by more than colour (print, colour-blind readers).
  it('gives the first eight curves eight colours and eight dash patterns', () => {
    const styles = Array.from({ length: 8 }, (_, i) => curveStyle(i))
    expect(new Set(styles.map(s => s.color)).size).toBe(8)
    expect(new Set(styles.map(s => JSON.stringify(s.dash))).size).toBe(8)
    expect(CURVE_DASHES).toHaveLength(8)
  })

  it('keeps every look distinct past eight curves', () => {
    const looks = Array.from({ length: 64 }, (_, i) => JSON.stringify(curveStyle(i)))
    expect(new Set(looks).size).toBe(64)
  })
})

describe('overlayChartOptions', () => {
  const a = curve(11, 'Stock manifolds', () => 400)
  const b = curve(12, 'Long tubes', rpm => 400 + (rpm - 3000) / 100)
  const options = overlayChartOptions({ curves: [a, b], units })

  it('draws power and torque for each setup, one panel each', () => {
    const series = seriesOf(options)
    expect(series.map(s => s.id)).toEqual(['power-11', 'power-12', 'torque-11', 'torque-12'])
    expect(series.filter(s => s.xAxisIndex === 0).every(s => s.yAxisIndex === 0)).toBe(true)
    expect(series.filter(s => s.xAxisIndex === 1).every(s => s.yAxisIndex === 1)).toBe(true)
  })

  it('plots [rpm, value] pairs from the curve as given', () => {
    const series = seriesOf(options)
    const torqueB = series.find(s => s.id === 'torque-12')!
    expect(torqueB.data).toEqual(b.points.map(p => [p.rpm, p.torque]))
    const powerA = series.find(s => s.id === 'power-11')!
    expect(powerA.data).toEqual(a.points.map(p => [p.rpm, p.power]))
  })

  it('gives a setup the same colour and dash in both panels, and another setup another look', () => {
    const series = seriesOf(options)
    const look = (id: string) => { const s = series.find(x => x.id === id)!; return [s.lineStyle?.color, JSON.stringify(s.lineStyle?.type)] }
    expect(look('power-11')).toEqual(look('torque-11'))
    expect(look('power-11')).not.toEqual(look('power-12'))
  })

  it('follows styleIndex so a setup keeps its look when others are hidden', () => {
    const only = overlayChartOptions({ curves: [{ ...b, styleIndex: 1 }], units })
    expect(seriesOf(only)[0]!.lineStyle?.color).toBe(OKABE_ITO[1])
  })

  it('names the axes with their units and reads out every curve on hover (axis tooltip)', () => {
    const yAxis = options.yAxis as { name: string }[]
    expect(yAxis.map(y => y.name)).toEqual(['Power (hp)', 'Torque (lb-ft)'])
    expect((options.tooltip as { trigger: string }).trigger).toBe('axis')
    expect(options.axisPointer).toMatchObject({ link: [{ xAxisIndex: 'all' }] })
    const kw = overlayChartOptions({ curves: [a], units: { power: 'kW', torque: 'N-m' } })
    expect((kw.yAxis as { name: string }[]).map(y => y.name)).toEqual(['Power (kW)', 'Torque (N-m)'])
  })

  it('rounds the rpm axis out to whole 500 rpm', () => {
    const odd = overlayChartOptions({ curves: [{ id: 1, label: 'x', points: [{ rpm: 2730, torque: 1, power: 1 }, { rpm: 6120, torque: 1, power: 1 }] }], units })
    expect((odd.xAxis as { min: number, max: number }[])[0]).toMatchObject({ min: 2500, max: 6500 })
  })

  it('is plain data that survives JSON apart from its formatters', () => {
    expect(() => JSON.stringify(options)).not.toThrow()
    expect(options.legend).toMatchObject({ data: ['Stock manifolds', 'Long tubes'] })
  })

  it('copes with no curves', () => {
    const empty = overlayChartOptions({ curves: [], units })
    expect(empty.series).toEqual([])
  })
})

describe('gainChartOptions', () => {
  it('names each curve against the baseline and draws a zero line in both panels', () => {
    const g = gainChartOptions({ curves: [curve(12, 'Long tubes', () => 5)], units, baselineLabel: 'Stock' })
    const series = g.series as LineSeriesOption[]
    expect(series.map(s => s.name)).toEqual(['Long tubes vs Stock', 'Long tubes vs Stock'])
    expect(series.every(s => (s.markLine?.data as { yAxis: number }[] | undefined)?.[0]?.yAxis === 0)).toBe(true)
    expect((g.yAxis as { name: string }[]).map(y => y.name)).toEqual(['Power gain (hp)', 'Torque gain (lb-ft)'])
  })
})

describe('readout', () => {
  const a = curve(1, 'A', rpm => rpm / 10)

  // Common practice: linear interpolation between samples, nothing outside the pull.
  it('interpolates linearly between points', () => {
    expect(curveValueAt(a.points, 3250, 'torque')).toBeCloseTo(325, 10)
    expect(curveValueAt(a.points, 3000, 'torque')).toBe(300)
    expect(curveValueAt(a.points, 5000, 'torque')).toBe(500)
  })

  it('gives null outside a curve instead of extrapolating', () => {
    expect(curveValueAt(a.points, 2999, 'torque')).toBeNull()
    expect(curveValueAt(a.points, 5001, 'power')).toBeNull()
    expect(curveValueAt([], 4000, 'power')).toBeNull()
  })

  it('reads every curve at one rpm', () => {
    const b = { ...curve(2, 'B', () => 400), points: curve(2, 'B', () => 400).points.slice(2) }
    const r = readoutAt([a, b], 3500)
    expect(r.map(x => x.id)).toEqual([1, 2])
    expect(r[0]!.torque).toBe(350)
    // hp = lb-ft x rpm / 5252.113 (published: NIST SP 811 units)
    expect(r[0]!.power).toBeCloseTo((350 * 3500) / 5252.113, 9)
    expect(r[1]).toMatchObject({ torque: null, power: null })
    expect(chartRpmRange([a, b])).toEqual({ min: 3000, max: 5000 })
    expect(chartRpmRange([])).toBeNull()
  })
})
