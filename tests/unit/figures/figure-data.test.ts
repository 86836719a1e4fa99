import { describe, expect, it } from 'vitest'
import type { AnalysisResponse, CurvePoint } from '#shared/types/analysis-results'
import {
  clipPoints, convertPoints, gainCurves, gainSummary, graphDataTable, graphSetups, overlayCurves,
  overlaySummary, resultsTableRows, signedFigure, thinCurve,
} from '#shared/utils/figure-data'
import { source, BASE, CAM, HEADERS } from '../stories/figure-source'

// Straight-line curves, so every value in between is known exactly (invented numbers).
const line = (from: number, to: number, step: number, torque: (rpm: number) => number): CurvePoint[] => {
  const out: CurvePoint[] = []
  for (let rpm = from; rpm <= to; rpm += step) out.push({ rpm, torque: torque(rpm), power: (torque(rpm) * rpm) / 5252.113 })
  return out
}

function analysis(): AnalysisResponse {
  const s = source()
  const setups = [
    { setupId: BASE, label: 'Baseline', isBaseline: true, curve: line(3000, 6500, 10, () => 400) },
    { setupId: CAM, label: 'Long cam', isBaseline: false, curve: line(3000, 6500, 10, rpm => 380 + (rpm - 3000) / 100) },
    { setupId: HEADERS, label: 'Long cam + headers', isBaseline: false, curve: line(3200, 6600, 10, rpm => 390 + (rpm - 3000) / 100) },
  ].map((x, i) => ({ ...x, position: i, pulls: [], spreadPct: null, outlierPullId: null, idleVacuumInHg: null, rpmFrom: x.curve[0]!.rpm, rpmTo: x.curve.at(-1)!.rpm }))
  return {
    benchTestId: 1,
    standard: 'sae-j1349-1990',
    standardLabel: 'SAE J1349',
    units: { id: 'hp-lbft', power: 'hp', torque: 'lb-ft' },
    baselineSetupId: BASE,
    setups,
    // The server's own gain curve for the cam (a flat +5, so it is told apart from a computed one).
    gains: [{ setupId: CAM, againstSetupId: BASE, curve: line(3000, 6500, 100, () => 5) }],
    table: s.analysis.table,
    notes: [],
  }
}

describe('which setups a graph shows', () => {
  it('takes the setups in the order written and keeps each one\'s look from the analysis', () => {
    const { setups, missing } = graphSetups(analysis(), [HEADERS, BASE, 999])
    expect(setups.map(s => [s.setupId, s.styleIndex])).toEqual([[HEADERS, 2], [BASE, 0]])
    expect(missing).toEqual([999])
  })

  it('shows every analysed setup when none are named', () => {
    expect(graphSetups(analysis()).setups.map(s => s.setupId)).toEqual([BASE, CAM, HEADERS])
  })
})

describe('curves in units and windows', () => {
  // Published: NIST SP 811 (2008) Appendix B: 1 hp (550 ft-lbf/s) = 745.6999 W; 1 lbf-ft = 1.355818 N-m.
  it('converts hp to kW and lb-ft to N-m', () => {
    const [p] = convertPoints([{ rpm: 5000, power: 100, torque: 100 }], 'kw-nm')
    expect(p!.power).toBeCloseTo(74.56999, 4)
    expect(p!.torque).toBeCloseTo(135.5818, 3)
    expect(convertPoints([{ rpm: 5000, power: 100, torque: 100 }], 'hp-lbft')[0]!.power).toBe(100)
  })

  it('clips to the rpm window the figure asks for', () => {
    const clipped = clipPoints(line(3000, 6500, 500, () => 1), 3500, 5000)
    expect(clipped.map(p => p.rpm)).toEqual([3500, 4000, 4500, 5000])
  })

  it('draws overlay curves for the chosen setups only', () => {
    const a = analysis()
    const curves = overlayCurves(a, graphSetups(a, [CAM]).setups, { from: 4000, to: 4100, units: 'hp-lbft' })
    expect(curves).toHaveLength(1)
    expect(curves[0]!.points.map(p => p.rpm)).toEqual(Array.from({ length: 11 }, (_, i) => 4000 + i * 10))
  })
})

describe('gain curves', () => {
  it('draws the gain curve shared/dyno computed for the pair, against any setup of the analysis', () => {
    const a = analysis()
    const all = graphSetups(a).setups
    const overBase = gainCurves(a, BASE, all, { units: 'hp-lbft' })
    expect(overBase.map(c => c.id)).toEqual([CAM])
    expect(overBase[0]!.points.every(p => p.torque === 5)).toBe(true)
    // A pair without a computed curve is not made up from the drawn curves.
    expect(gainCurves(a, CAM, all, { units: 'hp-lbft' })).toEqual([])
    const withPair = { ...a, gains: [...a.gains, { setupId: HEADERS, againstSetupId: CAM, curve: [{ rpm: 4000, torque: 10, power: 7 }] }] }
    const overCam = gainCurves(withPair, CAM, all, { units: 'hp-lbft' })
    expect(overCam.map(c => c.id)).toEqual([HEADERS])
    expect(overCam[0]!.points).toEqual([{ rpm: 4000, torque: 10, power: 7 }])
  })
})

describe('thinning for the server\'s SVG', () => {
  it('keeps both ends and the peaks within the point budget', () => {
    const pts = line(2000, 7000, 10, rpm => 500 - ((rpm - 4400) ** 2) / 20000)
    const thin = thinCurve(pts, 100)
    expect(thin.length).toBeLessThanOrEqual(100)
    expect(thin[0]).toBe(pts[0])
    expect(thin.at(-1)).toBe(pts.at(-1))
    const peakTorque = pts.reduce((m, p) => (p.torque > m.torque ? p : m))
    const peakPower = pts.reduce((m, p) => (p.power > m.power ? p : m))
    expect(thin).toContain(peakTorque)
    expect(thin).toContain(peakPower)
  })
})

describe('the numbers under a graph', () => {
  it('lists every 250 rpm with a column per curve and channel', () => {
    const curves = [{ id: 1, label: 'A', points: line(3000, 4000, 10, () => 400) }]
    const t = graphDataTable(curves, { power: 'hp', torque: 'lb-ft' }, 'both', 250)
    expect(t.rpm).toEqual([3000, 3250, 3500, 3750, 4000])
    expect(t.columns.map(c => c.label)).toEqual(['A, power', 'A, torque'])
    // hp = lb-ft x rpm / 5252.113 (brief, "Numbers users trust").
    expect(t.columns[0]!.values[0]).toBeCloseTo(400 * 3000 / 5252.113, 6)
  })

  it('sums up peaks in words for screen readers', () => {
    const curves = [{ id: 1, label: 'Long cam', points: line(3000, 6000, 100, rpm => 500 - Math.abs(rpm - 4500) / 10) }]
    const s = overlaySummary(curves, { power: 'hp', torque: 'lb-ft' }, 'torque')
    expect(s).toContain('Torque against engine speed from 3,000 to 6,000 rpm for Long cam')
    expect(s).toContain('Long cam peaks at 500 lb-ft at 4,500 rpm')
  })

  it('says where a setup gains and loses over the baseline', () => {
    const curves = [{ id: 2, label: 'Long cam', points: [{ rpm: 3000, torque: -12.04, power: -6 }, { rpm: 6000, torque: 20.46, power: 23.4 }] }]
    const s = gainSummary(curves, { power: 'hp', torque: 'lb-ft' }, 'torque', 'Baseline')
    expect(s).toContain('gains up to 20.5 lb-ft of torque at 6,000 rpm, loses up to 12.0 lb-ft at 3,000 rpm')
  })
})

describe('the results table', () => {
  it('rounds peaks to the unit (half away from zero) and shows gains over the chosen baseline', () => {
    const s = source()
    const rows = resultsTableRows(s.analysis, s.comparisons, undefined, BASE)
    const base = rows.find(r => r.setupId === BASE)!
    // Brief: a peak of 487.5 hp is reported as 488 hp.
    expect(base.peakPower).toBe('488 hp at 6,190')
    expect(base.powerGain).toBe('–')
    const cam = rows.find(r => r.setupId === CAM)!
    expect(cam.powerGain).toBe('+31.4 hp')
    // Averages keep one decimal (brief: one decimal where it matters).
    expect(cam.averagePowerGain).toBe('+12.3 hp')
  })

  it('takes gains against another setup from the comparisons', () => {
    const s = source()
    const rows = resultsTableRows(s.analysis, s.comparisons, [CAM, HEADERS], CAM)
    expect(rows.map(r => r.setupId)).toEqual([CAM, HEADERS])
    // Headers over the cam are within repeatability in the fixture: no gain is claimed.
    expect(rows[1]!.powerGain).toBe('within repeatability')
  })

  it('writes signs the way a table reads', () => {
    expect(signedFigure(12.44)).toBe('+12.4')
    expect(signedFigure(-3)).toBe('-3.0')
    expect(signedFigure(-0.04)).toBe('0.0')
    expect(signedFigure(0.05)).toBe('+0.1')
  })
})
