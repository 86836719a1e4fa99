// The one analysis pipeline (shared/dyno/analyse.ts): correction per pull, averaging,
// results, gains of any ordered pair, drawn curves, interpolation.
import { describe, expect, it } from 'vitest'
import {
  analyseBench, AnalysisInputError, correctionFactor, interpolateAt, resample, resultsTable, scaleCurve, valueAt, W_PER_HP, NM_PER_LBFT,
  type BenchData, type PullPoint,
} from '../../../shared/dyno/index'
import { readoutAt } from '../../../shared/utils/chart-options'

const K = 33000 / (2 * Math.PI)
// Torque shapes with a peak and a plausible fall-off (invented, as in table.test.ts).
const shape = (peak: number, at: number) => (r: number) => peak - 3e-5 * (r - at) ** 2
function pull(torque: (r: number) => number, from = 2500, to = 6500): PullPoint[] {
  const out: PullPoint[] = []
  for (let r = from; r <= to; r += 10) out.push({ rpm: r, torqueLbFt: torque(r), powerHp: (torque(r) * r) / K })
  return out
}
const weather = { baroInHg: 29.2, airTempF: 84, humidityPct: 40 }

function bench(): BenchData {
  const setup = (setupId: number, label: string, torque: (r: number) => number, isBaseline = false) => ({
    setupId, label, position: setupId, isBaseline, idleVacuumInHg: 15 - setupId,
    pulls: [1, 2].map(n => ({
      pullId: setupId * 10 + n, number: n, fileName: `${label}-${n}.csv`, weather, dynoCorrected: false,
      peakPower: { value: 0, rpm: 0 }, points: pull(r => torque(r) * (n === 1 ? 1 : 1.004)),
    })),
  })
  return {
    benchTestId: 1,
    defaultStandard: 'sae-j1349-1990',
    setups: [setup(1, 'Baseline', shape(430, 4400), true), setup(2, 'Cam', shape(441, 4800)), setup(3, 'Headers', shape(436, 4600))],
  }
}

describe('analyseBench', () => {
  it('corrects each pull with its own weather before averaging (SAE J1349 JUN1990 factor, check-sources "Correction")', () => {
    const a = analyseBench(bench())
    const cf = correctionFactor('sae-j1349-1990', weather)
    // Mean of the two pulls at 4400 rpm, times the factor: 430 x (1 + 1.004) / 2 x cf.
    expect(a.table.rows[0]!.peakTorque.value).toBeCloseTo(430 * 1.002 * cf, 6)
    expect(a.setups[0]!.pulls.map(p => p.factor)).toEqual([cf, cf])
  })

  it('compares every ordered pair with the same numbers the results table gives with that setup first (check-sources "Curves")', () => {
    const data = bench()
    const a = analyseBench(data, { pairs: 'all' })
    expect(a.comparisons).toHaveLength(6)
    // Against setup 3 directly: a results table led by Headers.
    const a3 = analyseBench(data, { baseline: 3 })
    for (const row of a3.table.rows.slice(1)) {
      const pair = a.comparisons.find(c => c.setupId === row.setupId && c.vsSetupId === 3)!
      expect(pair.gains).toEqual(row.vsBaseline)
    }
    // Gain curves for every ordered pair, each the negative of its reverse.
    expect(a.gains).toHaveLength(6)
    const camOverHeaders = a.gains.find(g => g.setupId === 2 && g.againstSetupId === 3)!.curve
    const headersOverCam = a.gains.find(g => g.setupId === 3 && g.againstSetupId === 2)!.curve
    camOverHeaders.forEach((p, i) => expect(p.torque).toBeCloseTo(-headersOverCam[i]!.torque, 2))
    // The workspace asks for the baseline's pairs only.
    expect(analyseBench(data).gains.map(g => [g.setupId, g.againstSetupId])).toEqual([[2, 1], [3, 1]])
  })

  it('keeps the shared band (and every average) the same whichever setup leads', () => {
    const data = bench()
    const curves = [1, 2, 3].map(id => analyseBench(data, { baseline: id }).table)
    expect(new Set(curves.map(t => JSON.stringify(t.band))).size).toBe(1)
    const avg = (t: typeof curves[number], id: number) => t.rows.find(r => r.setupId === id)!.averagePower
    expect(avg(curves[0]!, 2)).toBe(avg(curves[2]!, 2))
    // The band is resultsTable's own (shared/dyno/table.ts) over the averaged curves.
    expect(curves[0]!.band).toEqual(resultsTable([{ name: 'x', points: pull(shape(430, 4400)) }]).band)
  })

  it('converts units with the SI factors (NIST SP 811: 1 hp = 745.69987 W, 1 lb-ft = 1.3558179 N-m)', () => {
    const hp = analyseBench(bench())
    const kw = analyseBench(bench(), { units: 'kw-nm' })
    expect(kw.table.rows[1]!.peakPower.value).toBeCloseTo(hp.table.rows[1]!.peakPower.value * W_PER_HP / 1000, 9)
    expect(kw.table.rows[1]!.peakTorque.value).toBeCloseTo(hp.table.rows[1]!.peakTorque.value * NM_PER_LBFT, 9)
    expect(W_PER_HP).toBeCloseTo(745.69987, 4)
    expect(scaleCurve([{ rpm: 5000, power: 100, torque: 100 }], 'kw-nm')[0]!.power).toBeCloseTo(74.569987, 5)
  })

  it('draws curves of at most maxPoints, to two decimals', () => {
    const a = analyseBench(bench(), { maxPoints: 120 })
    for (const s of a.setups) {
      expect(s.curve.length).toBeLessThanOrEqual(120)
      for (const p of s.curve) expect(Math.round(p.torque * 100) / 100).toBe(p.torque)
    }
  })

  it('refuses data without included pulls, and leaves out setups without any, with a note', () => {
    const data = bench()
    expect(() => analyseBench({ ...data, setups: data.setups.map(s => ({ ...s, pulls: [] })) })).toThrow(AnalysisInputError)
    const some = analyseBench({ ...data, setups: [...data.setups, { setupId: 9, label: 'Empty', position: 9, isBaseline: false, idleVacuumInHg: null, pulls: [] }] })
    expect(some.notes).toEqual(['Empty has no included pulls and is left out.'])
  })
})

describe('one interpolation', () => {
  it('is linear between points and null outside the data (common practice: linear interpolation on the rpm grid)', () => {
    const pts = [{ rpm: 4000, torque: 360, power: 274 }, { rpm: 4600, torque: 372, power: 326 }]
    expect(interpolateAt(pts, 4500, 'torque')).toBeCloseTo(370, 12)
    expect(interpolateAt(pts, 3999, 'torque')).toBeNull()
    expect(interpolateAt(pts, 4600, 'power')).toBe(326)
  })

  it('gives resampling, the pull reader and the graph readout the same value', () => {
    const points = pull(shape(430, 4400), 2500, 6500).filter((_, i) => i % 7 === 0)
    const curve = points.map(p => ({ rpm: p.rpm, torque: p.torqueLbFt, power: p.powerHp }))
    for (const rpm of [2600, 3333, 4500, 6120]) {
      const fromReadout = readoutAt([{ id: 1, label: 'x', points: curve }], rpm)[0]!.torque
      expect(fromReadout).toBe(valueAt(points, rpm, 'torqueLbFt'))
      const grid = resample(points, 10).find(p => p.rpm === Math.round(rpm / 10) * 10)
      if (rpm % 10 === 0) expect(grid!.torqueLbFt).toBeCloseTo(fromReadout!, 9)
    }
  })

  it('reads a story graph at 4,500 rpm exactly as the workspace graph does: both draw the pipeline\'s one curve', () => {
    const workspace = analyseBench(bench())
    const story = analyseBench(bench(), { pairs: 'all' })
    const at = (a: typeof workspace) => readoutAt([{ id: 2, label: 'Cam', points: a.setups[1]!.curve }], 4500)[0]!.torque
    expect(at(story)).toBe(at(workspace))
    expect(at(story)!.toFixed(1)).toBe(at(workspace)!.toFixed(1))
  })
})
