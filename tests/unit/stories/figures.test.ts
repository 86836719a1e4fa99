import { describe, expect, it } from 'vitest'
import { formatFigureNumber, inlineFigureValue } from '#shared/stories/figure-values'
import { BASE, CAM, HEADERS, source } from './figure-source'

const value = (of: Parameters<typeof inlineFigureValue>[1]['of'], setup: number, extra: { vs?: number, decimals?: number } = {}) =>
  inlineFigureValue(source(), { of, setup, ...extra })

describe('inline figure values', () => {
  it('reports a peak rounded half away from zero (product brief: 487.5 hp is reported as 488 hp)', () => {
    expect(value('peak-power', BASE)).toMatchObject({ text: '488 hp', value: 488, unit: 'hp', problem: null })
  })

  it('groups thousands in rpm and keeps whole rpm (common practice in print)', () => {
    expect(value('peak-power-rpm', BASE).text).toBe('6,190 rpm')
  })

  it('gives the peak-to-peak gain against the baseline when vs is left out', () => {
    const v = value('peak-power-gain', CAM)
    expect(v.text).toBe('31 hp')
    expect(v.label).toBe('Peak-to-peak power gain, Long cam vs Baseline')
  })

  it('honours decimals and gives percentages to one decimal', () => {
    expect(value('peak-power-gain', CAM, { decimals: 1 }).text).toBe('31.4 hp')
    expect(value('peak-power-gain-pct', CAM).text).toBe('6.4%')
  })

  it('compares with any analysed setup, not only the baseline', () => {
    expect(value('peak-power-gain', HEADERS, { vs: BASE }).text).toBe('44 hp')
    expect(value('peak-power-gain', BASE, { vs: CAM }).text).toBe('-31 hp')
  })

  it('shows a gain within the spread of repeat pulls as within repeatability (product brief)', () => {
    const v = value('peak-power-gain', HEADERS, { vs: CAM })
    expect(v.text).toBe('within repeatability')
    expect(v.withinRepeatability).toBe(true)
    expect(v.value).toBe(13)
  })

  it('says so when the curves do not cross', () => {
    expect(value('torque-crossover-rpm', HEADERS, { vs: CAM })).toMatchObject({ text: 'no crossover', value: null, problem: null })
    expect(value('torque-crossover-rpm', CAM).text).toBe('4,180 rpm')
  })

  it('gives the power band as a range and the idle vacuum to one decimal', () => {
    expect(value('power-band', CAM).text).toBe('4,800-6,600 rpm')
    expect(value('power-band-width', CAM).text).toBe('1,800 rpm')
    expect(value('idle-vacuum', BASE).text).toBe('17.5 inHg')
    expect(value('idle-vacuum-change', CAM).text).toBe('-3.5 inHg')
  })

  it('gives a loss as a positive number', () => {
    expect(value('largest-power-loss', CAM).text).toBe('9 hp')
    expect(value('largest-torque-loss', CAM).text).toBe('16 lb-ft')
  })

  it('names the problem instead of inventing a figure', () => {
    expect(value('peak-power', 999).problem).toMatch(/Setup 999/)
    expect(value('idle-vacuum', HEADERS).problem).toMatch(/idle vacuum/)
    expect(value('peak-power-gain', CAM, { vs: CAM }).problem).toMatch(/two different setups/)
  })

  it('refuses figures from an analysis in kW and N-m', () => {
    const s = source()
    s.analysis.units = { id: 'kw-nm', power: 'kW', torque: 'N-m' }
    expect(inlineFigureValue(s, { of: 'peak-power', setup: BASE }).problem).toMatch(/hp and lb-ft/)
  })
})

describe('formatFigureNumber', () => {
  it.each([
    [1234.5, 0, '1,235'],
    [-1234.5, 0, '-1,235'],
    [999.95, 1, '1,000.0'],
    [1.005, 2, '1.01'],
    [12, 1, '12.0'],
  ])('%d with %d decimals is %s (ties away from zero, as reportRound)', (v, d, text) => {
    expect(formatFigureNumber(v, d)).toBe(text)
  })
})
