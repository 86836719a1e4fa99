// The dyno day's words: acceptance flags, repeat verdicts and the plan-against-day report.
import { describe, expect, it } from 'vitest'
import { DEFAULT_ACCEPTANCE } from '#shared/types/dyno-day'
import { acceptanceFlags, dayReport, minutesBetween, pullTemperatures, repeatVerdict, temperatureChannel } from '#shared/utils/dyno-day'

const window = { ...DEFAULT_ACCEPTANCE, rpmFrom: 3000, rpmTo: 6500, coolantF: { min: 170, max: 200 }, oilF: { min: 180, max: 240 }, baroInHg: { min: 28.5, max: 30.5 } }
const ok = { rpmFrom: 2980, rpmTo: 6520, weather: { baroInHg: 29.4, airTempF: 75 }, coolantF: { min: 182, max: 190 }, oilF: { min: 200, max: 215 } }

describe('temperature channels', () => {
  it('reads coolant and oil headers and their unit', () => {
    expect(temperatureChannel('Coolant (F)')).toEqual({ kind: 'coolant', celsius: false })
    expect(temperatureChannel('Water temp (C)')).toEqual({ kind: 'coolant', celsius: true })
    expect(temperatureChannel('Oil temp (°C)')).toEqual({ kind: 'oil', celsius: true })
    expect(temperatureChannel('Oil pressure (psi)')).toBeNull()
    expect(temperatureChannel('AFR')).toBeNull()
  })
  it('converts Celsius channels to F (100 C = 212 F, the boiling point of water at one standard atmosphere, NIST SP 811)', () => {
    const t = pullTemperatures([{ extra: { 'Water temp (C)': 80 } }, { extra: { 'Water temp (C)': 100 } }])
    expect(t.coolantF).toEqual({ min: 176, max: 212 })
    expect(t.oilF).toBeNull()
  })
})

describe('acceptance flags (limits are the plan\'s own; common practice)', () => {
  it('lets a pull inside the window through', () => {
    expect(acceptanceFlags(ok, window)).toEqual([])
  })
  it('flags a short rpm range beyond one logging step', () => {
    expect(acceptanceFlags({ ...ok, rpmTo: 6400 }, window)).toEqual(['rpm range short: 2980–6400 rpm, the plan wants 3000–6500'])
    expect(acceptanceFlags({ ...ok, rpmFrom: 3050 }, window)).toEqual([])
  })
  it('flags temperatures and weather out of the window, and missing channels', () => {
    expect(acceptanceFlags({ ...ok, coolantF: { min: 165, max: 204.26 }, oilF: null, weather: { baroInHg: 31, airTempF: 70 } }, window)).toEqual([
      'coolant 165 F, below the window\'s 170 F',
      'coolant 204.3 F, above the window\'s 200 F',
      'no oil temperature in the file to check',
      'barometer 31 inHg, above the window\'s 30.5 inHg',
    ])
    expect(acceptanceFlags({ ...ok, weather: null }, { ...window, airTempF: null })).toEqual(['no weather to check the barometer'])
  })
})

describe('repeat verdict', () => {
  it('says enough, make another pull, or not enough pulls', () => {
    expect(repeatVerdict(2, 0.6, 1)).toEqual({ includedPulls: 2, spreadPct: 0.6, enough: true, verdict: 'two pulls within 0.6 percent: enough' })
    expect(repeatVerdict(3, 1.8, 1)).toEqual({ includedPulls: 3, spreadPct: 1.8, enough: false, verdict: 'spread 1.8 percent: make another pull' })
    expect(repeatVerdict(1, null, 1).enough).toBeNull()
    expect(repeatVerdict(0, null, 1).verdict).toBe('no pull yet')
  })
})

describe('plan against the day', () => {
  it('counts pulls, skipped setups and swap times', () => {
    const r = dayReport([
      { stepId: 1, setupLabel: 'Baseline', plannedPulls: 3, swapMinutes: null, status: 'done', pullsMade: 3, pullsCounted: 3, swapMinutesActual: null },
      { stepId: 2, setupLabel: 'Cam A', plannedPulls: 3, swapMinutes: 90, status: 'done', pullsMade: 2, pullsCounted: 2, swapMinutesActual: 104 },
      { stepId: 3, setupLabel: 'Cam B', plannedPulls: 3, swapMinutes: 90, status: 'skipped', pullsMade: 0, pullsCounted: 0, swapMinutesActual: null },
      { stepId: 4, setupLabel: 'Cam C', plannedPulls: 3, swapMinutes: 90, status: 'current', pullsMade: 3, pullsCounted: 3, swapMinutesActual: 76 },
    ])
    expect(r.rows.map(x => x.outcome)).toEqual(['done', 'short', 'skipped', 'done'])
    expect(r.summary).toBe('3 of 4 planned setups tested, 8 pulls made of 12 planned. 1 setup was skipped: Cam B. Swaps took 90 minutes on average (Cam A 104, Cam C 76).')
    // The first step's start to its first pull is the warm-up, not a swap.
    const warm = dayReport([
      { stepId: 1, setupLabel: 'Baseline', plannedPulls: 1, swapMinutes: null, status: 'done', pullsMade: 1, pullsCounted: 1, swapMinutesActual: 25 },
      { stepId: 2, setupLabel: 'Cam A', plannedPulls: 1, swapMinutes: 90, status: 'done', pullsMade: 1, pullsCounted: 1, swapMinutesActual: 80 },
    ])
    expect(warm.rows.map(x => x.swapMinutesActual)).toEqual([null, 80])
    expect(warm.summary).toBe('2 of 2 planned setups tested, 2 pulls made of 2 planned. Swaps took 80 minutes on average (Cam A 80).')
    expect(minutesBetween('2026-05-14T10:00:00Z', '2026-05-14T11:29:40Z')).toBe(90)
    expect(minutesBetween('2026-05-14T10:00:00Z', null)).toBeNull()
  })
})
