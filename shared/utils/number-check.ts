// The editor's number check: every number in a story's prose that carries a unit
// the data speaks to (hp, lb-ft, rpm, inHg, %) against the figures the bench test's
// data gives, after reporting rounding. It informs; it never blocks.
import { reportFixed, reportRound } from '../dyno/round'
import { INLINE_FIGURES, type FigureComparison, type FigureSource, type FigureUnit, type InlineFigureKey } from '../types/story-figures'
import { inlineFigureMeta, withUnit } from '../stories/figure-values'
import type { FigureCandidate, NumberFinding } from '../types/stories'
import type { AnalysisGains, AnalysisRow } from '../types/analysis-results'
import type { Weather } from '../types/workspace'
import { parseFigure } from './story-body'
import { findFigures, proseLines } from './story-markup'

// ---------- the numbers of the prose ----------

export interface ProseNumber {
  text: string
  value: number
  /** Places after the decimal point as written ("31.4" has 1). */
  decimals: number
  unit: FigureUnit
  line: number
}

const NUMBER = String.raw`(\d{1,3}(?:,\d{3})+|\d+)(?:\.(\d+))?`
const UNITS: { unit: FigureUnit, pattern: string }[] = [
  { unit: 'lb-ft', pattern: String.raw`(?:lbs?\.?\s?-?\s?ft\.?|ft\.?\s?-?\s?lbs?\.?|lb·ft|pound-?\s?feet|foot-?\s?pounds)` },
  { unit: 'hp', pattern: String.raw`(?:b?hp|horsepower)` },
  { unit: 'rpm', pattern: String.raw`(?:rpm|r/min|revs)` },
  { unit: 'inHg', pattern: String.raw`(?:in\.?\s?-?\s?Hg|inches of (?:mercury|vacuum)|"\s?Hg)` },
  { unit: '%', pattern: String.raw`(?:%|\s?percent)` },
]
const UNIT_GROUP = UNITS.map(u => `(${u.pattern})`).join('|')
// A number (or a range "3,800-6,200" / "3,800 to 6,200"), an optional hyphen ("20-hp gain"), a unit.
const NUMBER_WITH_UNIT = new RegExp(
  String.raw`(?<![\w.,])${NUMBER}(?:\s*(?:-|–|—|to|and)\s*${NUMBER})?\s*-?\s*(?:${UNIT_GROUP})(?![A-Za-z])`,
  'gi',
)

function toNumber(whole: string, frac: string | undefined): { value: number, decimals: number } {
  return { value: Number(`${whole.replace(/,/g, '')}${frac ? `.${frac}` : ''}`), decimals: frac?.length ?? 0 }
}

/** Every number followed by a checked unit, line by line (figure markup, code and links left out). */
export function findProseNumbers(body: string): ProseNumber[] {
  const found: ProseNumber[] = []
  proseLines(body).forEach((line, i) => {
    for (const m of line.matchAll(NUMBER_WITH_UNIT)) {
      const unitIndex = m.slice(5).findIndex(g => g !== undefined)
      const unit = UNITS[unitIndex]?.unit
      if (!unit) continue
      const unitText = m[5 + unitIndex]!.trim()
      const first = toNumber(m[1]!, m[2])
      const label = (n: { value: number, decimals: number }, raw: string, frac?: string) => ({ text: `${raw}${frac ? `.${frac}` : ''} ${unitText}`.replace(/ %$/, '%'), ...n, unit, line: i + 1 })
      found.push(label(first, m[1]!, m[2]))
      if (m[3]) found.push(label(toNumber(m[3], m[4]), m[3], m[4]))
    }
  })
  return found
}

// ---------- the figures the data gives ----------

export interface CandidateSource extends FigureSource {
  /** Pull weather per setup, for barometer readings quoted in the text. */
  pullWeather?: { setupId: number, weather: Weather | null }[]
}

const pairKeys = INLINE_FIGURES.filter(f => f.pair).map(f => f.id)

function pairValues(key: InlineFigureKey, g: AnalysisGains): { values: number[], within: boolean | null } {
  const r = g.withinRepeatability
  switch (key) {
    case 'peak-power-gain': return { values: [g.peakPower], within: r.peakPower }
    case 'peak-power-gain-pct': return { values: [g.peakPowerPct], within: r.peakPower }
    case 'peak-torque-gain': return { values: [g.peakTorque], within: r.peakTorque }
    case 'peak-torque-gain-pct': return { values: [g.peakTorquePct], within: r.peakTorque }
    case 'average-power-gain': return { values: [g.averagePower], within: r.averagePower }
    case 'average-power-gain-pct': return { values: [g.averagePowerPct], within: r.averagePower }
    case 'average-torque-gain': return { values: [g.averageTorque], within: r.averageTorque }
    case 'average-torque-gain-pct': return { values: [g.averageTorquePct], within: r.averageTorque }
    case 'largest-power-gain': return { values: [g.largestGain.power.value], within: null }
    case 'largest-power-gain-rpm': return { values: [g.largestGain.power.rpm], within: null }
    case 'largest-torque-gain': return { values: [g.largestGain.torque.value], within: null }
    case 'largest-torque-gain-rpm': return { values: [g.largestGain.torque.rpm], within: null }
    case 'largest-power-loss': return { values: g.largestLoss.power.value < 0 ? [g.largestLoss.power.value, g.largestLoss.power.rpm] : [], within: null }
    case 'largest-torque-loss': return { values: g.largestLoss.torque.value < 0 ? [g.largestLoss.torque.value, g.largestLoss.torque.rpm] : [], within: null }
    case 'torque-crossover-rpm': return { values: g.crossovers.torqueRpm, within: null }
    case 'power-crossover-rpm': return { values: g.crossovers.powerRpm, within: null }
    case 'idle-vacuum-change': return { values: g.idleVacuumInHg === null ? [] : [g.idleVacuumInHg], within: null }
    default: return { values: [], within: null }
  }
}

function rowCandidates(row: AnalysisRow): FigureCandidate[] {
  const single = (key: InlineFigureKey, value: number | null, what: string = inlineFigureMeta(key).label): FigureCandidate[] =>
    value === null || !Number.isFinite(value) ? [] : [{ key, label: `${what}, ${row.label}`, value, unit: inlineFigureMeta(key).unit, setupId: row.setupId, vsSetupId: null, withinRepeatability: null }]
  return [
    ...single('peak-power', row.peakPower.value),
    ...single('peak-power-rpm', row.peakPower.rpm),
    ...single('peak-torque', row.peakTorque.value),
    ...single('peak-torque-rpm', row.peakTorque.rpm),
    ...single('average-power', row.averagePower),
    ...single('average-torque', row.averageTorque),
    ...single('power-band', row.powerBand.fromRpm, 'Start of the power band'),
    ...single('power-band', row.powerBand.toRpm, 'End of the power band'),
    ...single('power-band-width', row.powerBand.toRpm - row.powerBand.fromRpm),
    ...single('idle-vacuum', row.idleVacuumInHg),
  ]
}

/** The pairs whose gains the text may quote: each row against the baseline and the setup before, plus any named. */
export function comparedPairs(source: FigureSource, extra: readonly { setupId: number, vsSetupId: number }[] = []): { setupId: number, vsSetupId: number }[] {
  const rows = source.analysis.table.rows
  const pairs = rows.flatMap((row, i) => i === 0 ? [] : [{ setupId: row.setupId, vsSetupId: rows[0]!.setupId }, { setupId: row.setupId, vsSetupId: rows[i - 1]!.setupId }])
  const seen = new Set<string>()
  return [...pairs, ...extra].filter((p) => {
    const key = `${p.setupId}:${p.vsSetupId}`
    if (p.setupId === p.vsSetupId || seen.has(key)) return false
    seen.add(key)
    return true
  })
}

/** Pairs named by the body's inline values and gain graphs (vs defaults to the baseline). */
export function pairsNamedInBody(body: string, baselineSetupId: number): { setupId: number, vsSetupId: number }[] {
  const pairs: { setupId: number, vsSetupId: number }[] = []
  for (const use of findFigures(body)) {
    const parsed = parseFigure(use)
    if (!parsed?.success) continue
    const o = parsed.data as { of?: InlineFigureKey, setup?: number, vs?: number, baseline?: number, setups?: number[] }
    if (use.kind === 'inline' && o.of && o.setup !== undefined && inlineFigureMeta(o.of).pair) pairs.push({ setupId: o.setup, vsSetupId: o.vs ?? baselineSetupId })
    if (use.name === 'gain-graph') for (const s of o.setups ?? []) pairs.push({ setupId: s, vsSetupId: o.baseline ?? baselineSetupId })
  }
  return pairs
}

function findGains(comparisons: readonly FigureComparison[], rows: readonly AnalysisRow[], pair: { setupId: number, vsSetupId: number }): AnalysisGains | null {
  const found = comparisons.find(c => c.setupId === pair.setupId && c.vsSetupId === pair.vsSetupId)
  if (found) return found.gains
  const i = rows.findIndex(r => r.setupId === pair.setupId)
  const row = rows[i]
  if (row && rows[0]?.setupId === pair.vsSetupId) return row.vsBaseline
  if (row && rows[i - 1]?.setupId === pair.vsSetupId) return row.vsPrevious
  return null
}

/** Every figure the text may quote, unrounded. */
export function figureCandidates(source: CandidateSource, pairs = comparedPairs(source)): FigureCandidate[] {
  const rows = source.analysis.table.rows
  const name = (id: number) => rows.find(r => r.setupId === id)?.label ?? `setup ${id}`
  const out: FigureCandidate[] = rows.flatMap(rowCandidates)
  for (const pair of pairs) {
    const gains = findGains(source.comparisons, rows, pair)
    if (!gains) continue
    for (const key of pairKeys) {
      const meta = inlineFigureMeta(key)
      const { values, within } = pairValues(key, gains)
      values.forEach((value, i) => {
        if (!Number.isFinite(value)) return
        // Loss figures give the loss and then its rpm.
        const isLossRpm = key.endsWith('-loss') && i === 1
        out.push({
          key,
          label: `${isLossRpm ? `Rpm of the ${meta.label.toLowerCase()}` : meta.label}, ${name(pair.setupId)} vs ${name(pair.vsSetupId)}`,
          value,
          unit: isLossRpm ? 'rpm' : meta.unit,
          setupId: pair.setupId,
          vsSetupId: pair.vsSetupId,
          withinRepeatability: within,
        })
      })
    }
  }
  for (const { setupId, weather } of source.pullWeather ?? []) {
    if (weather) out.push({ key: 'pull-baro', label: `Barometer of a pull, ${name(setupId)}`, value: weather.baroInHg, unit: 'inHg', setupId, vsSetupId: null, withinRepeatability: null })
  }
  return out
}

// ---------- the check ----------

/**
 * Whether a figure reads as the number written: rounded to the number's own
 * decimals (common practice: 31.4 may be written 31). An rpm written as a round
 * hundred or ten may be the figure rounded to that (peak at 6,190 rpm -> "6,200 rpm").
 */
export function agrees(figure: number, written: { value: number, decimals: number, unit: FigureUnit }): boolean {
  const magnitude = Math.abs(figure)
  if (reportRound(magnitude, written.decimals) === written.value) return true
  if (written.unit === 'rpm' && written.decimals === 0) {
    for (const step of [100, 10]) {
      if (written.value % step === 0 && reportRound(magnitude / step, 0) * step === written.value) return true
    }
  }
  return false
}

const shown = (value: number, unit: FigureUnit) => withUnit(reportFixed(Math.abs(value), unit === 'rpm' ? 0 : 1), unit)

export function checkNumbers(body: string, candidates: readonly FigureCandidate[]): NumberFinding[] {
  return findProseNumbers(body).map((n) => {
    const sameUnit = candidates.filter(c => c.unit === n.unit)
    const nearest = [...sameUnit]
      .sort((a, b) => Math.abs(Math.abs(a.value) - n.value) - Math.abs(Math.abs(b.value) - n.value))
      .filter((c, i, list) => list.findIndex(o => o.label === c.label) === i)
      .slice(0, 3)
      .map(c => ({ label: c.label, value: Number(reportFixed(Math.abs(c.value), n.unit === 'rpm' ? 0 : 1)), unit: c.unit }))
    const match = sameUnit.find(c => agrees(c.value, n))
    const finding: NumberFinding = { text: n.text, value: n.value, unit: n.unit, line: n.line, nearest, message: '' }
    if (match) {
      finding.matched = { label: match.label, value: Number(reportFixed(Math.abs(match.value), n.unit === 'rpm' ? 0 : 1)), withinRepeatability: match.withinRepeatability }
      finding.message = `${n.text} agrees with ${match.label} (${shown(match.value, match.unit)})`
        + (match.withinRepeatability ? '; that gain is within repeatability, so it should read as such, not as a gain.' : '.')
    }
    else if (nearest[0]) {
      finding.message = `Text says ${n.text}; the data gives ${withUnit(reportFixed(nearest[0].value, n.unit === 'rpm' ? 0 : 1), n.unit)} (${nearest[0].label}).`
    }
    else {
      finding.message = `Text says ${n.text}; the data gives no figure in ${n.unit}.`
    }
    return finding
  })
}
