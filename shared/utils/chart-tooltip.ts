// Graph tooltips in the words of the tables (issue 15 item 8): the engine speed as
// "5,500 rpm" rather than the axis' own "5,500.00", each value rounded like every
// other figure (half away from zero, one decimal, a sign on gains) with its unit
// joined by a non-breaking space. Pure: it returns a new option, the input is kept.
import type { PullChartOption } from './chart-options'
import { formatReported, formatRpm, formatSigned, withUnitNbsp } from './figures'

type AnyRecord = Record<string, unknown>

const asList = (v: unknown): AnyRecord[] => (Array.isArray(v) ? v : v ? [v] : []) as AnyRecord[]

export function rpmTooltipLabel(value: unknown): string {
  return typeof value === 'number' && Number.isFinite(value) ? withUnitNbsp(formatRpm(value), 'rpm') : '–'
}

export function valueTooltipLabel(value: unknown, unit: string, signed: boolean): string {
  if (typeof value !== 'number' || !Number.isFinite(value)) return '–'
  return withUnitNbsp(signed ? formatSigned(value, 1) : formatReported(value, 1), unit)
}

/** `unitOf(seriesId)`: the unit of a series ("hp", "lb-ft"); `signed`: the values are gains. */
export function withReadableTooltips(option: PullChartOption, unitOf: (seriesId: string) => string, signed: boolean): PullChartOption {
  const o = option as AnyRecord
  return {
    ...o,
    xAxis: asList(o.xAxis).map(axis => ({
      ...axis,
      axisPointer: { ...(axis.axisPointer as AnyRecord | undefined), label: { ...((axis.axisPointer as AnyRecord | undefined)?.label as AnyRecord | undefined), formatter: (p: { value: unknown }) => rpmTooltipLabel(p.value) } },
    })),
    series: asList(o.series).map(s => ({
      ...s,
      tooltip: { ...(s.tooltip as AnyRecord | undefined), valueFormatter: (value: unknown) => valueTooltipLabel(value, unitOf(String(s.id ?? '')), signed) },
    })),
  } as PullChartOption
}
