// Tooltips read like the tables (issue 15 item 8). Rounding: half away from zero
// (product brief; common practice), via reportRound.
import { describe, expect, it } from 'vitest'
import { gainChartOptions, overlayChartOptions } from '#shared/utils/chart-options'
import { rpmTooltipLabel, valueTooltipLabel, withReadableTooltips } from '#shared/utils/chart-tooltip'

const NBSP = '\u00a0'
const curves = [{ id: 1, label: 'Baseline', points: [{ rpm: 3000, power: 300.05, torque: 525.25 }, { rpm: 5500, power: 480.25, torque: 458.6 }] }]
const units = { power: 'hp', torque: 'lb-ft' }

describe('graph tooltips', () => {
  it('name the engine speed in whole rpm with thousands grouped', () => {
    expect(rpmTooltipLabel(5500)).toBe(`5,500${NBSP}rpm`)
    expect(rpmTooltipLabel(5499.996)).toBe(`5,500${NBSP}rpm`)
    expect(rpmTooltipLabel(null)).toBe('–')
  })

  it('round values half away from zero, signing gains', () => {
    expect(valueTooltipLabel(480.25, 'hp', false)).toBe(`480.3${NBSP}hp`)
    expect(valueTooltipLabel(16.0 - 19.15, 'inHg', true)).toBe(`-3.2${NBSP}inHg`)
    expect(valueTooltipLabel(13.44, 'lb-ft', true)).toBe(`+13.4${NBSP}lb-ft`)
  })

  it('apply to every rpm axis and every series of an option', () => {
    const option = withReadableTooltips(overlayChartOptions({ curves, units }), id => (id.startsWith('power') ? 'hp' : 'lb-ft'), false) as any
    expect(option.xAxis).toHaveLength(2)
    for (const axis of option.xAxis) expect(axis.axisPointer.label.formatter({ value: 5500 })).toBe(`5,500${NBSP}rpm`)
    const torque = option.series.find((s: any) => s.id.startsWith('torque'))
    expect(torque.tooltip.valueFormatter(458.6)).toBe(`458.6${NBSP}lb-ft`)
    const gains = withReadableTooltips(gainChartOptions({ curves, units, baselineLabel: 'Baseline' }), () => 'hp', true) as any
    expect(gains.series[0].tooltip.valueFormatter(2)).toBe(`+2.0${NBSP}hp`)
  })
})
