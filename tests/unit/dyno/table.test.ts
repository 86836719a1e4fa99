import { describe, expect, it } from 'vitest'
import { csvCell, parsePullCsv, resultsTable, resultsTableCsv, writeCsv, type PullPoint } from '../../../shared/dyno/index'

const K = 33000 / (2 * Math.PI)
const c = 3e-5
const baseT = (r: number): number => 607.5 - c * (r - 4500) ** 2 // torque peak 4500, power peak 6000 (see compare.test.ts)
const sample = (scale: number, from: number, to: number): PullPoint[] => {
  const out: PullPoint[] = []
  for (let r = from; r <= to; r += 50) out.push({ rpm: r, torqueLbFt: scale * baseT(r), powerHp: (scale * baseT(r) * r) / K })
  return out
}
// Trapezoid mean of baseT over [a, b] with 50 rpm steps: exact mean + h^2 f''/12, f'' = -2c.
const meanBaseT = (a: number, b: number): number =>
  607.5 - (c * ((b - 4500) ** 3 - (a - 4500) ** 3)) / 3 / (b - a) + (50 ** 2 * (-2 * c)) / 12

describe('resultsTable: rows vs baseline and vs previous (check-sources "Curves")', () => {
  const setups = [
    { name: 'Baseline', points: sample(1, 2500, 7000), spreadPct: 0.8, idleVacuumInHg: 14.3 },
    { name: 'Headers', points: sample(1.02, 2500, 6800), spreadPct: 0.6, idleVacuumInHg: 14.1 },
    { name: 'Headers + timing', points: sample(1.02 * 1.005, 2600, 7000), spreadPct: 0.7 },
  ]
  const table = resultsTable(setups)
  const [a, b, cRow] = table.rows

  it('averages over the band every setup covers, with its limits', () => {
    expect(table.band).toEqual({ fromRpm: 2600, toRpm: 6800 })
    expect(a?.averageTorqueLbFt).toBeCloseTo(meanBaseT(2600, 6800), 9)
    expect(b?.averageTorqueLbFt).toBeCloseTo(1.02 * meanBaseT(2600, 6800), 9)
  })
  it('peaks with rpm, from full data', () => {
    expect(a?.peakTorqueLbFt).toEqual({ value: 607.5, rpm: 4500 })
    expect(a?.peakPowerHp.rpm).toBe(6000)
    expect(a?.peakPowerHp.value).toBeCloseTo((6000 * baseT(6000)) / K, 9)
    expect(cRow?.peakPowerHp.value).toBeCloseTo((1.02 * 1.005 * 6000 * baseT(6000)) / K, 9)
  })
  it('gains vs baseline and vs previous are the scale factors', () => {
    expect(a?.vsBaseline).toBeUndefined()
    expect(b?.vsBaseline?.peakPowerPct).toBeCloseTo(2, 9)
    expect(b?.vsBaseline?.averageTorquePct).toBeCloseTo(2, 9)
    expect(b?.vsBaseline?.peakTorqueLbFt).toBeCloseTo(0.02 * 607.5, 9)
    expect(cRow?.vsBaseline?.peakPowerPct).toBeCloseTo((1.02 * 1.005 - 1) * 100, 9)
    expect(cRow?.vsPrevious?.peakPowerPct).toBeCloseTo(0.5, 9)
    expect(cRow?.vsPrevious?.averagePowerPct).toBeCloseTo(0.5, 9)
  })
  it('largest gain and loss and where; no crossover when one setup is above everywhere', () => {
    expect(b?.vsBaseline?.maxGain.powerHp.rpm).toBe(6000) // 2 % of power is largest at the power peak
    expect(b?.vsBaseline?.maxGain.torqueLbFt.rpm).toBe(4500)
    expect(b?.vsBaseline?.maxLoss.torqueLbFt.rpm).toBe(6800) // smallest gain where torque is lowest on the shared grid
    expect(b?.vsBaseline?.maxLoss.torqueLbFt.value).toBeGreaterThan(0)
    expect(b?.vsBaseline?.crossovers).toEqual({ powerRpm: [], torqueRpm: [] })
  })
  it('a 0.5 % gain inside a 0.7 % spread is within repeatability; a 2 % gain is not (common practice)', () => {
    expect(b?.vsBaseline?.withinRepeatability.peakPower).toBe(false)
    expect(cRow?.vsPrevious?.withinRepeatability).toEqual({ peakPower: true, peakTorque: true, averagePower: true, averageTorque: true })
  })
  it('idle vacuum passes through, and its change needs both setups to have one', () => {
    expect(a?.idleVacuumInHg).toBe(14.3)
    expect(b?.vsBaseline?.idleVacuumInHg).toBeCloseTo(-0.2, 9)
    expect(cRow?.idleVacuumInHg).toBeUndefined()
    expect(cRow?.vsPrevious?.idleVacuumInHg).toBeUndefined()
  })
  it('power band per setup', () => {
    expect(a?.powerBand.fromRpm).toBeGreaterThan(4000)
    expect(a?.powerBand.toRpm).toBeGreaterThan(6000)
    expect(a?.powerBand.toRpm).toBeLessThanOrEqual(7000)
  })
  it('the table as CSV reads back with the same figures, rounded', () => {
    const csv = resultsTableCsv(table)
    const lines = csv.trimEnd().split('\r\n')
    expect(lines).toHaveLength(4)
    expect(lines[0]).toMatch(/^Setup,Peak power \(hp\),Peak power at \(rpm\)/)
    expect(lines[0]).toContain('Average power 2600-6800 rpm (hp)')
    const baseCells = lines[1]!.split(',')
    expect(baseCells[0]).toBe('Baseline')
    expect(Number(baseCells[1])).toBe(Number(((6000 * baseT(6000)) / K).toFixed(1)))
    expect(baseCells[2]).toBe('6000')
    expect(lines[2]).not.toContain('within repeatability') // 2 % against spreads of 0.8 and 0.6 %, both ways
    expect(lines[2]).toContain('beyond repeatability')
    expect(lines[3]).toMatch(/beyond repeatability.*within repeatability/) // 2.5 % vs baseline, 0.5 % vs previous
  })
  it('needs at least one setup', () => {
    expect(() => resultsTable([])).toThrow(RangeError)
  })
})

describe('CSV writer (RFC 4180 quoting; formula-injection guard, common practice)', () => {
  it('escapes text cells that begin with = + - @ (or tab, CR) so a spreadsheet shows them as text', () => {
    expect(csvCell('=SUM(A1:A9)')).toBe('\'=SUM(A1:A9)')
    expect(csvCell('+1 cam')).toBe('\'+1 cam')
    expect(csvCell('-2 deg timing')).toBe('\'-2 deg timing')
    expect(csvCell('@home')).toBe('\'@home')
    expect(csvCell('\tx')).toBe('\'\tx')
  })
  it('quotes cells with the delimiter, quotes, line breaks or outer spaces, doubling quotes', () => {
    expect(csvCell('a,b')).toBe('"a,b"')
    expect(csvCell('the "big" cam')).toBe('"the ""big"" cam"')
    expect(csvCell('two\nlines')).toBe('"two\nlines"')
    expect(csvCell(' padded ')).toBe('" padded "')
    expect(csvCell('a;b', ';')).toBe('"a;b"')
    expect(csvCell('a;b')).toBe('a;b')
  })
  it('writes numbers as numbers (a loss of -2.8 is data, not a formula), empties for null and NaN', () => {
    expect(writeCsv([[-2.8, 0, null, undefined, Number.NaN, 'x']])).toBe('-2.8,0,,,,x\r\n')
  })
  it('a hostile setup name is escaped in the results table, and the file still parses', () => {
    const pts = sample(1, 2500, 7000)
    const csv = resultsTableCsv(resultsTable([{ name: '=HYPERLINK("http://x","click")', points: pts }, { name: '-1, the "big" one', points: pts }]))
    expect(csv).toContain(`"'=HYPERLINK(""http://x"",""click"")"`)
    expect(csv).toContain(`"'-1, the ""big"" one"`)
    // papaparse (via our reader's CSV level) splits it into the same number of columns on every line
    const parsed = parsePullCsv(csv, { columns: { 'Setup': 'extra', 'Peak power at (rpm)': 'rpm', 'Peak power (hp)': 'power-hp' } })
    expect(parsed.columns).toHaveLength(25)
  })
})
