// The analysis route against shared/dyno computed directly on the same files: the
// server adds storage, correction per pull and averaging, and must not change a figure.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { applyCorrection, averagePulls, correctionFactor, parsePullCsv, repeatSpread, reportRound, resultsTable, type CorrectionStandard, type ResultsRow } from '#shared/dyno'
import { ANALYSIS_GRID } from '#shared/types/analysis'
import type { Client } from '../support/http'
import { closeTestDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let bt: number
let setups: { id: number, label: string, files: ReturnType<typeof pullFile>[], idle?: number }[]
let pullIds: number[][]

const MODELS = [
  { label: 'Stock', model: { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }, idle: 17.5 },
  { label: 'Small tubes', model: { peakTorqueLbFt: 446, peakTorqueRpm: 4500, widthLowRpm: 2600, widthHighRpm: 2050 }, idle: 17.8 },
  { label: '=Big tubes', model: { peakTorqueLbFt: 441, peakTorqueRpm: 4800, widthLowRpm: 2250, widthHighRpm: 2300 } },
]

beforeAll(async () => {
  writer = (await newWriter()).client
  bt = (await createBenchTest(writer)).id
  setups = []
  pullIds = []
  for (const [i, m] of MODELS.entries()) {
    const setup = await createSetup(writer, bt, m.label)
    if (m.idle) expectOk(await writer.post(`/api/bench-tests/${bt}/setups/${setup.id}/idle-checks`, { idleRpm: 750, vacuumInHg: m.idle }), 201)
    const files = [1, 2, 3].map(n => pullFile(`s${i}-p${n}.csv`, setup.id, { ...m.model, seed: 500 + i * 10 + n }))
    pullIds.push(expectOk(await importFiles(writer, bt, files), 201).pulls.map((p: any) => p.id))
    setups.push({ id: setup.id, label: m.label, files, idle: m.idle })
  }
})

/** The same figures straight from shared/dyno: parse, correct each pull by its weather, average, table. */
function direct(order: number[], standard: CorrectionStandard, keep: (setup: number, pull: number) => boolean = () => true) {
  const inputs = order.map((si) => {
    const s = setups[si]!
    const corrected = s.files.filter((_, pi) => keep(si, pi)).map(f => applyCorrection(parsePullCsv(f.text).points, standard, f.weather))
    const { points } = averagePulls(corrected, ANALYSIS_GRID.curveStepRpm)
    return { name: s.label, points, spreadPct: corrected.length > 1 ? repeatSpread(corrected, ANALYSIS_GRID.compareStepRpm).spreadPct : undefined, ...(s.idle ? { idleVacuumInHg: s.idle } : {}) }
  })
  return resultsTable(inputs.map(({ spreadPct, ...rest }) => (spreadPct === undefined ? rest : { ...rest, spreadPct })), { stepRpm: ANALYSIS_GRID.compareStepRpm })
}

function expectRowsAgree(rows: any[], expected: ResultsRow[], k = { power: 1, torque: 1 }) {
  expect(rows.map(r => r.label)).toEqual(expected.map(r => r.name))
  rows.forEach((row, i) => {
    const e = expected[i]!
    expect(row.peakPower.value).toBeCloseTo(e.peakPowerHp.value * k.power, 9)
    expect(row.peakPower.rpm).toBe(e.peakPowerHp.rpm)
    expect(row.peakTorque.value).toBeCloseTo(e.peakTorqueLbFt.value * k.torque, 9)
    expect(row.peakTorque.rpm).toBe(e.peakTorqueLbFt.rpm)
    expect(row.averagePower).toBeCloseTo(e.averagePowerHp * k.power, 9)
    expect(row.averageTorque).toBeCloseTo(e.averageTorqueLbFt * k.torque, 9)
    expect(row.powerBand.fromRpm).toBeCloseTo(e.powerBand.fromRpm, 9)
    expect(row.powerBand.toRpm).toBeCloseTo(e.powerBand.toRpm, 9)
    expect(row.spreadPct ?? undefined).toBe(e.spreadPct)
    expect(row.idleVacuumInHg ?? undefined).toBe(e.idleVacuumInHg)
    if (!e.vsBaseline) return expect(row.vsBaseline).toBeNull()
    for (const [got, want] of [[row.vsBaseline, e.vsBaseline], [row.vsPrevious, e.vsPrevious!]] as const) {
      expect(got.peakPower).toBeCloseTo(want.peakPowerHp * k.power, 9)
      expect(got.peakPowerPct).toBeCloseTo(want.peakPowerPct, 9)
      expect(got.peakTorque).toBeCloseTo(want.peakTorqueLbFt * k.torque, 9)
      expect(got.averagePower).toBeCloseTo(want.averagePowerHp * k.power, 9)
      expect(got.averageTorque).toBeCloseTo(want.averageTorqueLbFt * k.torque, 9)
      expect(got.largestGain.power.rpm).toBe(want.maxGain.powerHp.rpm)
      expect(got.largestLoss.torque.value).toBeCloseTo(want.maxLoss.torqueLbFt.value * k.torque, 9)
      expect(got.crossovers.torqueRpm).toHaveLength(want.crossovers.torqueRpm.length)
      got.crossovers.torqueRpm.forEach((r: number, j: number) => expect(r).toBeCloseTo(want.crossovers.torqueRpm[j]!, 9))
      expect(got.withinRepeatability).toEqual(want.withinRepeatability)
      expect(got.idleVacuumInHg ?? undefined).toBe(want.idleVacuumInHg)
    }
  })
}

const analysis = (query = '') => writer.get(`/api/bench-tests/${bt}/analysis${query}`)

describe('analysis', () => {
  it('agrees with shared/dyno on every figure, each pull corrected by its own weather', async () => {
    const a = expectOk(await analysis())
    expect(a).toMatchObject({ standard: 'sae-j1349-1990', standardLabel: 'SAE J1349 (JUN1990)', units: { power: 'hp', torque: 'lb-ft' }, baselineSetupId: setups[0]!.id })
    const expected = direct([0, 1, 2], 'sae-j1349-1990')
    expect(a.table.band).toEqual(expected.band)
    expectRowsAgree(a.table.rows, expected.rows)
    for (const [i, s] of a.setups.entries()) {
      expect(s.pulls.map((p: any) => p.pullId)).toEqual(pullIds[i])
      s.pulls.forEach((p: any, j: number) => expect(p.factor).toBe(correctionFactor('sae-j1349-1990', setups[i]!.files[j]!.weather)))
      expect(s.curve.length).toBeLessThanOrEqual(400)
      expect(s.curve[0].rpm).toBe(3000)
    }
    // Gain curves: setup minus baseline at 100 rpm steps.
    const gain = a.gains.find((g: any) => g.setupId === setups[1]!.id)
    expect(gain.againstSetupId).toBe(setups[0]!.id)
    expect(gain.curve[0].rpm % 100).toBe(0)
  })

  it('follows the chosen standard, baseline, setups and units', async () => {
    const none = expectOk(await analysis('?standard=none'))
    expect(none.setups.flatMap((s: any) => s.pulls.map((p: any) => p.factor))).toEqual(Array(9).fill(1))
    expectRowsAgree(none.table.rows, direct([0, 1, 2], 'none').rows)

    const din = expectOk(await analysis(`?standard=din-70020&setups=${setups[2]!.id},${setups[1]!.id}&baseline=${setups[2]!.id}`))
    expect(din.baselineSetupId).toBe(setups[2]!.id)
    expectRowsAgree(din.table.rows, direct([2, 1], 'din-70020').rows)

    // kW = hp x 0.7456999 and N-m = lb-ft x 1.355818 (NIST SP 811, B.9, published)
    const metric = expectOk(await analysis('?units=kw-nm'))
    expect(metric.units).toMatchObject({ power: 'kW', torque: 'N-m' })
    expectRowsAgree(metric.table.rows, direct([0, 1, 2], 'sae-j1349-1990').rows, { power: 550 * 0.3048 * 4.4482216152605 / 1000, torque: 0.3048 * 4.4482216152605 })
    expect(metric.table.rows[1].vsBaseline.peakPowerPct).toBeCloseTo(expectOk(await analysis()).table.rows[1].vsBaseline.peakPowerPct, 9)
  })

  it('thins only the curves drawn, never the figures', async () => {
    const thin = expectOk(await analysis('?maxPoints=40'))
    const full = expectOk(await analysis())
    expect(thin.setups.every((s: any) => s.curve.length <= 40)).toBe(true)
    expect(thin.table).toEqual(full.table)
  })

  it('changes when a pull is excluded, and again when it comes back', async () => {
    const before = expectOk(await analysis())
    const pull = expectOk(await writer.get(`/api/bench-tests/${bt}/pulls/${pullIds[1]![0]}`)).pull
    const out = expectOk(await writer.patch(`/api/bench-tests/${bt}/pulls/${pull.id}`, { version: pull.version, included: false, exclusionReason: 'test' })).pull
    const after = expectOk(await analysis())
    expect(after.setups[1].pulls).toHaveLength(2)
    expectRowsAgree(after.table.rows, direct([0, 1, 2], 'sae-j1349-1990', (s, p) => !(s === 1 && p === 0)).rows)
    expect(after.table.rows[1].peakPower.value).not.toBe(before.table.rows[1].peakPower.value)
    expectOk(await writer.patch(`/api/bench-tests/${bt}/pulls/${pull.id}`, { version: out.version, included: true }))
    expect(expectOk(await analysis()).table).toEqual(before.table)
  })

  it('takes a pull the dyno already corrected with factor 1', async () => {
    const extra = await createSetup(writer, bt, 'Corrected by the dyno')
    const f = pullFile('dyno.csv', extra.id, { seed: 777 })
    expectOk(await importFiles(writer, bt, [{ ...f, weather: null, dynoCorrected: true }]), 201)
    const a = expectOk(await analysis(`?setups=${setups[0]!.id},${extra.id}`))
    expect(a.setups[1].pulls[0]).toMatchObject({ factor: 1, dynoCorrected: true, weather: null })
    const raw = averagePulls([parsePullCsv(f.text).points], ANALYSIS_GRID.curveStepRpm).points
    expect(a.table.rows[1].peakPower.value).toBeCloseTo(Math.max(...raw.map(p => p.powerHp)), 9)
    expect(a.table.rows[1].spreadPct).toBeNull()
    expect(a.table.rows[1].vsBaseline.withinRepeatability.peakPower).toBe(false)
    expectOk(await writer.delete(`/api/bench-tests/${bt}/setups/${extra.id}?confirm=true`))
  })

  it('names setups without pulls and refuses foreign or empty choices', async () => {
    const empty = await createSetup(writer, bt, 'No pulls yet')
    const a = expectOk(await analysis())
    expect(a.notes).toEqual(['No pulls yet has no included pulls and is left out.'])
    expect((await analysis('?setups=999999')).status).toBe(400)
    expect((await analysis(`?setups=${empty.id}`)).status).toBe(400)
    expect((await analysis(`?baseline=${empty.id}`)).status).toBe(400)
    expect((await analysis('?standard=metric-ish')).status).toBe(400)
    expectOk(await writer.delete(`/api/bench-tests/${bt}/setups/${empty.id}`))
  })

  it('exports the table as CSV, figures rounded as on the page, text guarded against formulas', async () => {
    const res = await writer.get(`/api/bench-tests/${bt}/analysis/csv`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename=".*-results-sae-j1349-1990\.csv"/)
    const lines = (res.body as string).trimEnd().split('\r\n')
    expect(lines).toHaveLength(4)
    expect(lines[0]).toMatch(/^Setup,Corrected to,Peak power \(hp\),Peak power at \(rpm\)/)
    const table = expectOk(await analysis()).table
    const cells = lines[1]!.split(',')
    expect(cells[0]).toBe('Stock')
    // Rounded as the page shows it: peaks whole, half away from zero (brief, "Numbers users trust");
    // the header row says so in its last cell (issue 15 item 8).
    expect(Number(cells[2])).toBe(reportRound(table.rows[0].peakPower.value, 0))
    expect(lines[0]!.endsWith(',Values rounded as on the page (half away from zero)')).toBe(true)
    expect(lines[3]!.startsWith('\'=Big tubes,')).toBe(true)
  })
})
