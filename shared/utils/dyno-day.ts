// The dyno day's judgements in words: does a pull fall inside the plan's acceptance
// window, is a setup's repeatability enough to call it, and what happened against the
// plan. Pure; the spreads come from shared/dyno (repeatSpread through the server's
// setup curves), nothing here does new arithmetic on the curves.
import { cToF } from '../dyno/units'
import type { Acceptance, DayReport, DayReportRow, DayRepeat, StepStatus } from '../types/dyno-day'

export interface TemperatureSpan { min: number, max: number }

/** An extra channel's header as a temperature the window can check, with its unit read from the header. */
export function temperatureChannel(header: string): { kind: 'coolant' | 'oil', celsius: boolean } | null {
  const h = header.toLowerCase()
  const kind = /coolant|water/.test(h) ? 'coolant' : /\boil\b/.test(h) && /temp|\(\s*°?\s*[cf]\s*\)/.test(h) ? 'oil' : null
  if (!kind) return null
  return { kind, celsius: /\(\s*°?\s*c\s*\)|\bdeg\s*c\b|°c/.test(h) }
}

/** Lowest and highest coolant and oil temperature of a pull's extra channels, in F. */
export function pullTemperatures(points: readonly { extra?: Record<string, number> }[]): { coolantF: TemperatureSpan | null, oilF: TemperatureSpan | null } {
  const out: { coolantF: TemperatureSpan | null, oilF: TemperatureSpan | null } = { coolantF: null, oilF: null }
  for (const p of points) {
    for (const [header, raw] of Object.entries(p.extra ?? {})) {
      const channel = temperatureChannel(header)
      if (!channel || !Number.isFinite(raw)) continue
      const f = channel.celsius ? cToF(raw) : raw
      const key = channel.kind === 'coolant' ? 'coolantF' : 'oilF'
      const span = out[key]
      out[key] = span ? { min: Math.min(span.min, f), max: Math.max(span.max, f) } : { min: f, max: f }
    }
  }
  return out
}

export interface PullFacts {
  rpmFrom: number
  rpmTo: number
  weather: { baroInHg: number, airTempF: number } | null
  coolantF: TemperatureSpan | null
  oilF: TemperatureSpan | null
}

/** A pull may start or end this close to the planned range and still cover it (common practice: one logging step). */
export const RPM_SLACK = 50

const one = (v: number) => (Math.round(v * 10) / 10).toString()

/** Why a pull falls outside the acceptance window, one sentence per reason; empty when it counts. */
export function acceptanceFlags(pull: PullFacts, window: Acceptance): string[] {
  const flags: string[] = []
  if (pull.rpmFrom > window.rpmFrom + RPM_SLACK || pull.rpmTo < window.rpmTo - RPM_SLACK) {
    flags.push(`rpm range short: ${Math.round(pull.rpmFrom)}–${Math.round(pull.rpmTo)} rpm, the plan wants ${window.rpmFrom}–${window.rpmTo}`)
  }
  const check = (label: string, unit: string, span: TemperatureSpan | null, limits: TemperatureSpan | null, missing: string) => {
    if (!limits) return
    if (!span) {
      flags.push(missing)
      return
    }
    if (span.min < limits.min) flags.push(`${label} ${one(span.min)} ${unit}, below the window's ${one(limits.min)} ${unit}`)
    if (span.max > limits.max) flags.push(`${label} ${one(span.max)} ${unit}, above the window's ${one(limits.max)} ${unit}`)
  }
  check('coolant', 'F', pull.coolantF, window.coolantF, 'no coolant temperature in the file to check')
  check('oil', 'F', pull.oilF, window.oilF, 'no oil temperature in the file to check')
  const w = pull.weather
  check('air', 'F', w ? { min: w.airTempF, max: w.airTempF } : null, window.airTempF, 'no weather to check the air temperature')
  check('barometer', 'inHg', w ? { min: w.baroInHg, max: w.baroInHg } : null, window.baroInHg, 'no weather to check the barometer')
  return flags
}

const pct = (v: number) => v.toFixed(1)

/**
 * The plain verdict on a setup's repeat pulls. The spread is the largest difference
 * between its counted pulls at any rpm (repeatSpread), compared with the plan's limit.
 */
export function repeatVerdict(counted: number, spreadPct: number | null, limitPct: number): DayRepeat {
  if (counted === 0) return { includedPulls: 0, spreadPct: null, enough: null, verdict: 'no pull yet' }
  if (counted === 1 || spreadPct === null) return { includedPulls: counted, spreadPct, enough: null, verdict: 'one pull: make another to judge the repeat' }
  const words = counted === 2 ? 'two pulls' : `${counted} pulls`
  return spreadPct <= limitPct
    ? { includedPulls: counted, spreadPct, enough: true, verdict: `${words} within ${pct(spreadPct)} percent: enough` }
    : { includedPulls: counted, spreadPct, enough: false, verdict: `spread ${pct(spreadPct)} percent: make another pull` }
}

/** Minutes between two ISO times, whole, or null when either is missing or they run backwards. */
export function minutesBetween(from: string | null, to: string | null): number | null {
  if (!from || !to) return null
  const ms = Date.parse(to) - Date.parse(from)
  return Number.isFinite(ms) && ms >= 0 ? Math.round(ms / 60_000) : null
}

export interface ReportStepInput {
  stepId: number
  setupLabel: string
  plannedPulls: number
  swapMinutes: number | null
  status: StepStatus
  pullsMade: number
  pullsCounted: number
  swapMinutesActual: number | null
}

/** The plan against what happened, as rows and as sentences a story can quote. */
export function dayReport(steps: readonly ReportStepInput[]): DayReport {
  const rows: DayReportRow[] = steps.map((s, i) => ({
    stepId: s.stepId,
    setupLabel: s.setupLabel,
    plannedPulls: s.plannedPulls,
    pullsMade: s.pullsMade,
    pullsCounted: s.pullsCounted,
    swapMinutesPlanned: s.swapMinutes,
    // The first step swaps nothing: its start to its first pull is the warm-up, not a swap.
    swapMinutesActual: i === 0 ? null : s.swapMinutesActual,
    outcome: s.status === 'skipped' ? 'skipped' : s.pullsMade === 0 ? 'not reached' : s.pullsCounted >= s.plannedPulls ? 'done' : 'short',
  }))
  const pullsPlanned = rows.reduce((n, r) => n + r.plannedPulls, 0)
  const pullsMade = rows.reduce((n, r) => n + r.pullsMade, 0)
  const setupsSkipped = rows.filter(r => r.outcome === 'skipped').length
  const tested = rows.filter(r => r.pullsMade > 0).length
  const swaps = rows.filter(r => r.swapMinutesActual !== null)
  const parts = [`${tested} of ${rows.length} planned setup${rows.length === 1 ? '' : 's'} tested, ${pullsMade} pull${pullsMade === 1 ? '' : 's'} made of ${pullsPlanned} planned.`]
  if (setupsSkipped) parts.push(`${setupsSkipped} setup${setupsSkipped === 1 ? ' was' : 's were'} skipped: ${rows.filter(r => r.outcome === 'skipped').map(r => r.setupLabel).join(', ')}.`)
  if (swaps.length) {
    const total = swaps.reduce((n, r) => n + (r.swapMinutesActual ?? 0), 0)
    parts.push(`Swaps took ${Math.round(total / swaps.length)} minutes on average (${swaps.map(r => `${r.setupLabel} ${r.swapMinutesActual}`).join(', ')}).`)
  }
  return { rows, pullsPlanned, pullsMade, setupsSkipped, summary: rows.length ? parts.join(' ') : 'No plan yet.' }
}
