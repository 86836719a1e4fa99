// Pull import: preview (nothing saved), commit (all or nothing), every kind of bad
// file named by file, line and column, exclusion, repeatability and the kept original.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { applyCorrection, parsePullCsv, repeatSpread } from '#shared/dyno'
import { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, importFiles, newWriter, pullCsv, pullFile } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let benchTestId: number
let setupA: number
let setupB: number
const weather = { baroInHg: 29.4, airTempF: 78, humidityPct: 35 }

beforeAll(async () => {
  writer = (await newWriter()).client
  benchTestId = (await createBenchTest(writer)).id
  setupA = (await createSetup(writer, benchTestId, 'Baseline')).id
  setupB = (await createSetup(writer, benchTestId, 'Candidate')).id
})

async function pullRows(): Promise<number> {
  const row = await testDb()('pulls').where({ bench_test_id: benchTestId }).count({ n: '*' }).first()
  return Number(row?.n ?? 0)
}

const preview = (files: unknown[]) => writer.post(`/api/bench-tests/${benchTestId}/pulls/preview`, { files })

/** A small valid file by hand: 3000 to 5000 rpm every 100 rpm, torque and power agreeing. */
function handFile(header = 'RPM,Torque (lb-ft),Power (hp)', edit?: (lines: string[]) => void): string {
  const lines = ['# baro: 29.40 inHg', '# air temp: 78 F', '# humidity: 35 %', header]
  for (let rpm = 3000; rpm <= 5000; rpm += 100) {
    const torque = 400 + (rpm - 3000) / 100
    lines.push(`${rpm},${torque.toFixed(1)},${(torque * rpm / 5252.113).toFixed(1)}`)
  }
  edit?.(lines)
  return lines.join('\n') + '\n'
}

describe('preview', () => {
  it('reads a file without saving it: points, rpm range, units and the weather lines', async () => {
    const before = await pullRows()
    const pull = pullCsv({ seed: 101 })
    const body = expectOk(await preview([{ name: 'one.csv', text: pull.csv }]))
    expect(await pullRows()).toBe(before)
    const [file] = body.files
    expect(file).toMatchObject({ name: 'one.csv', ok: true, pointCount: pull.points.length, rpmFrom: 3000, rpmTo: 6000, units: { torque: 'lb-ft', power: 'hp', vacuum: 'inHg' } })
    expect(file.weather).toEqual(pull.weather)
    expect(file.curve.length).toBeLessThanOrEqual(120)
    expect(file.peakPower.value).toBe(Math.max(...pull.points.map(p => p.powerHp)))
  })

  it('detects metric units and converts to lb-ft and hp (NIST SP 811 factors, published)', async () => {
    const text = ['RPM,Torque (N-m),Power (kW)', ...Array.from({ length: 21 }, (_, i) => {
      const rpm = 3000 + i * 100
      const nm = 542.3
      return `${rpm},${nm},${(nm * rpm * 2 * Math.PI / 60000).toFixed(3)}`
    })].join('\n')
    const [file] = expectOk(await preview([{ name: 'metric.csv', text }])).files
    expect(file.units).toEqual({ torque: 'N-m', power: 'kW' })
    // 1 lbf-ft = 1.355818 N-m (NIST SP 811, B.9)
    expect(file.peakTorque.value).toBeCloseTo(542.3 / 1.355818, 3)
  })

  it('lists an unknown header for mapping, and a mapping makes the file readable', async () => {
    const text = handFile('Crank speed,Brake torque,Power (hp)')
    const [raw] = expectOk(await preview([{ name: 'odd.csv', text }])).files
    expect(raw.ok).toBe(false)
    // "Brake torque" names no unit: read as lb-ft with a warning; "Crank speed" is unknown.
    expect(raw.unrecognisedHeaders).toEqual(['Crank speed'])
    expect(raw.problems.map((p: any) => p.text)).toContain('odd.csv, line 4, column "Brake torque": column "Brake torque" names no unit; read as lb-ft')
    const [mapped] = expectOk(await preview([{ name: 'odd.csv', text, mapping: { 'Crank speed': 'rpm', 'Brake torque': 'torque-lb-ft' } }])).files
    expect(mapped.ok).toBe(true)
    expect(mapped.pointCount).toBe(21)
    expect(mapped.unrecognisedHeaders).toEqual([])
  })
})

/** Refused at commit with 422, the message naming the file (and line and column where they apply); nothing saved. */
async function expectRefused(name: string, text: string, expected: RegExp[], extra: Record<string, unknown> = {}) {
  const before = await pullRows()
  const res = await importFiles(writer, benchTestId, [{ name, text, setupId: setupA, weather, ...extra }])
  expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(422)
  expect(res.body.message).toContain(name)
  const texts = res.body.data.problems.map((p: any) => p.text).join('\n')
  for (const re of expected) expect(texts).toMatch(re)
  expect(res.body.data.files[0].ok).toBe(false)
  expect(await pullRows()).toBe(before)
  return res.body.data.problems
}

describe('bad files', () => {
  it('an empty file', async () => {
    await expectRefused('empty.csv', '', [/empty\.csv: the file is empty/])
    await expectRefused('blank.csv', '\n \n', [/blank\.csv: the file is empty/])
  })

  it('a binary file (NUL bytes), naming the line', async () => {
    await expectRefused('photo.csv', 'RPM,Torque (lb-ft)\n3000,400\n\u0000\u0001PNG', [/photo\.csv, line 3: the file holds NUL bytes/])
  })

  it('bytes that are not UTF-8, naming the line', async () => {
    await expectRefused('latin.csv', handFile().replace('3200,', '3200\uFFFD,'), [/latin\.csv, line 7: the file is not UTF-8/])
  })

  it('a file over 5 MB', async () => {
    const big = handFile() + `# ${'x'.repeat(5 * 1024 * 1024)}\n`
    await expectRefused('huge.csv', big, [/huge\.csv: the file is 5\.\d MB; files up to 5\.0 MB are accepted/])
  })

  it('a file over 200,000 lines', async () => {
    const many = handFile() + '#\n'.repeat(200_000)
    await expectRefused('long.csv', many, [/long\.csv: the file has 200,0\d\d lines; up to 200,000 are accepted/])
  })

  it('a unit Pullsheet does not read, naming the header line and the column', async () => {
    await expectRefused('units.csv', handFile('RPM,Torque (kg-m),Power (hp)'), [/units\.csv, line 4, column "Torque \(kg-m\)": unit "kg-m"/])
  })

  it('a cell that is not a number, naming line and column', async () => {
    const text = handFile(undefined, (lines) => { lines[9] = '3500,4o5.0,338.5' })
    await expectRefused('typo.csv', text, [/typo\.csv, line 10, column "Torque \(lb-ft\)": "4o5\.0" in column "Torque \(lb-ft\)" is not a number/])
  })

  it('garbage text', async () => {
    await expectRefused('notes.csv', 'Dear editor,\nthe pulls are on the other stick.\nRegards\n', [/notes\.csv, line 1: none of the columns/])
  })

  it('a file with no usable columns', async () => {
    const text = ['alpha,beta,gamma', ...Array.from({ length: 20 }, (_, i) => `${i},${i * 2},${i * 3}`)].join('\n')
    await expectRefused('columns.csv', text, [/columns\.csv, line 1: none of the columns \("alpha", "beta", "gamma"\) is one Pullsheet reads/, /no rpm column/])
  })

  it('a mapping that leaves no rpm', async () => {
    await expectRefused('mapped.csv', handFile(), [/mapped\.csv, line 4: the column mapping leaves no rpm column/], { mapping: { RPM: 'ignore' } })
  })

  it('impossible values, naming line and column', async () => {
    const text = handFile(undefined, (lines) => { lines[6] = '-3200,402.0,245.0' })
    await expectRefused('negative.csv', text, [/negative\.csv, line 7, column "RPM": engine speed -3200 rpm is not plausible/])
  })

  it('a non-monotonic file is read with a warning naming the line, sorted by rpm', async () => {
    const text = handFile(undefined, (lines) => { const l = lines.splice(10, 1)[0]!; lines.splice(14, 0, l) })
    const [file] = expectOk(await preview([{ name: 'order.csv', text }])).files
    expect(file.ok).toBe(true)
    const warning = file.problems.find((p: any) => /change direction/.test(p.message))
    expect(warning.text).toMatch(/^order\.csv, line \d+: rows change direction/)
    expect(file.curve.map((p: any) => p.rpm)).toEqual([...file.curve.map((p: any) => p.rpm)].sort((a: number, b: number) => a - b))
  })

  it('weather left out without the dyno-corrected mark (schema, 400)', async () => {
    const res = await importFiles(writer, benchTestId, [{ name: 'w.csv', text: handFile(), setupId: setupA, weather: null }])
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toContainEqual(expect.objectContaining({ path: 'files.0.weather' }))
  })
})

describe('commit', () => {
  it('saves every file of a batch, keeping the original file, the weather and the points', async () => {
    const a = pullFile('keep-1.csv', setupA, { seed: 201 })
    const b = pullFile('keep-2.csv', setupB, { seed: 202 })
    const before = await pullRows()
    const { pulls } = expectOk(await importFiles(writer, benchTestId, [a, b]), 201)
    expect(await pullRows()).toBe(before + 2)
    expect(pulls.map((p: any) => [p.fileName, p.setupId, p.included])).toEqual([['keep-1.csv', setupA, true], ['keep-2.csv', setupB, true]])
    expect(pulls[0].weather).toEqual(a.weather)
    expect(pulls[0].uploadedBy).toMatchObject({ kind: 'user' })
    const file = await writer.get(`/api/bench-tests/${benchTestId}/pulls/${pulls[0].id}/file`)
    expect(file.headers.get('content-type')).toMatch(/text\/csv/)
    expect(file.body).toBe(a.text)
    const detail = expectOk(await writer.get(`/api/bench-tests/${benchTestId}/pulls/${pulls[0].id}`)).pull
    expect(detail.points).toEqual(parsePullCsv(a.text).points.map(({ extra: _e, ...p }) => p))
  })

  it('refuses the whole batch when one file has an error, and names it', async () => {
    const before = await pullRows()
    const res = await importFiles(writer, benchTestId, [pullFile('fine.csv', setupA, { seed: 203 }), { name: 'broken.csv', text: handFile(undefined, (l) => { l[5] = '3100,,250' }), setupId: setupA, weather }])
    expect(res.status).toBe(422)
    expect(res.body.message).toMatch(/Nothing was saved: 1 of 2 files has errors\. broken\.csv, line 6, column "Torque \(lb-ft\)": missing value/)
    expect(res.body.data.files.map((f: any) => f.ok)).toEqual([true, false])
    expect(await pullRows()).toBe(before)
  })

  it('rolls back files already written when a later file of the batch cannot be saved', async () => {
    const gone = await createSetup(writer, benchTestId, 'Soon deleted')
    expectOk(await writer.delete(`/api/bench-tests/${benchTestId}/setups/${gone.id}`))
    const before = await pullRows()
    const res = await importFiles(writer, benchTestId, [pullFile('first.csv', setupA, { seed: 204 }), pullFile('second.csv', gone.id, { seed: 205 })])
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/second\.csv: setup \d+ is not a setup of this bench test/)
    expect(res.body.data.issues[0].path).toBe('files.1.setupId')
    expect(await pullRows()).toBe(before)
    expect(await testDb()('pulls').where({ bench_test_id: benchTestId, file_name: 'first.csv' }).first()).toBeUndefined()
  })

  it('refuses a setup of another bench test', async () => {
    const other = await createBenchTest(writer)
    const otherSetup = await createSetup(writer, other.id, 'Elsewhere')
    const res = await importFiles(writer, benchTestId, [pullFile('x.csv', otherSetup.id, { seed: 206 })])
    expect(res.status).toBe(409)
  })

  it('imports with a mapping and stores it', async () => {
    const text = handFile('Crank speed,Brake torque,Power (hp)')
    const { pulls } = expectOk(await importFiles(writer, benchTestId, [{ name: 'mapped-ok.csv', text, setupId: setupB, weather, mapping: { 'Crank speed': 'rpm', 'Brake torque': 'torque-lb-ft' } }]), 201)
    expect(pulls[0]).toMatchObject({ pointCount: 21, rpmFrom: 3000, rpmTo: 5000 })
    const row = await testDb()('pulls').where({ id: pulls[0].id }).first('column_mapping')
    expect(JSON.parse(row.column_mapping)).toEqual({ 'Crank speed': 'rpm', 'Brake torque': 'torque-lb-ft' })
  })
})

describe('the sample file the import page offers', () => {
  it('downloads without an account as a CSV attachment and imports cleanly: preview without problems, then saved', async () => {
    const res = await new Client().get('/api/pull-files/sample.csv')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/text\/csv/)
    expect(res.headers.get('content-disposition')).toMatch(/attachment; filename="pullsheet-sample-pull\.csv"/)
    const text = String(res.body)
    const [file] = expectOk(await preview([{ name: 'pullsheet-sample-pull.csv', text }])).files
    expect(file).toMatchObject({ ok: true, problems: [], rpmFrom: 2500, rpmTo: 6500, units: { torque: 'lb-ft', power: 'hp', vacuum: 'inHg' } })
    // Its own bench test: the repeatability tests below count this one's pulls.
    const sampleBench = (await createBenchTest(writer)).id
    const setupId = (await createSetup(writer, sampleBench, 'Baseline')).id
    const { pulls } = expectOk(await importFiles(writer, sampleBench, [{ name: 'pullsheet-sample-pull.csv', text, setupId, weather: file.weather }]), 201)
    expect(pulls).toHaveLength(1)
    expect(pulls[0]).toMatchObject({ setupId, included: true, weather: { baroInHg: 29.42, airTempF: 77, humidityPct: 38 } })
  })
})

describe('exclusion and repeatability', () => {
  let bt: number
  let setup: number
  let files: ReturnType<typeof pullFile>[]
  let pulls: any[]

  beforeAll(async () => {
    bt = (await createBenchTest(writer)).id
    setup = (await createSetup(writer, bt, 'Baseline')).id
    files = [301, 302, 303].map(seed => pullFile(`rep-${seed}.csv`, setup, { seed }))
    pulls = expectOk(await importFiles(writer, bt, files), 201).pulls
  })

  it('gives the spread and outlier shared/dyno gives on the same corrected pulls', async () => {
    const list = expectOk(await writer.get(`/api/bench-tests/${bt}/pulls`))
    expect(list.standard).toBe('sae-j1349-1990')
    const rep = list.repeatability.find((r: any) => r.setupId === setup)
    const corrected = files.map(f => applyCorrection(parsePullCsv(f.text).points, 'sae-j1349-1990', f.weather))
    const direct = repeatSpread(corrected, 100)
    expect(rep.includedPulls).toBe(3)
    expect(rep.spreadPct).toBeCloseTo(direct.spreadPct, 10)
    expect(rep.rpmOfLargestSpread).toBe(direct.rpmOfLargestSpread)
    expect(rep.outlier.pullId).toBe(pulls[direct.outlier!.index].id)
    expect(list.pulls.map((p: any) => p.number)).toEqual([1, 2, 3])
  })

  it('excludes a pull only with a reason, refuses a stale version, and re-includes it', async () => {
    const url = `/api/bench-tests/${bt}/pulls/${pulls[2].id}`
    const noReason = await writer.patch(url, { version: pulls[2].version, included: false })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.issues[0].path).toBe('exclusionReason')
    const out = expectOk(await writer.patch(url, { version: pulls[2].version, included: false, exclusionReason: 'Operator lifted early' })).pull
    expect(out).toMatchObject({ included: false, exclusionReason: 'Operator lifted early', version: pulls[2].version + 1 })
    const stale = await writer.patch(url, { version: pulls[2].version, included: true })
    expect(stale.status).toBe(409)
    expect(stale.body.data.currentVersion).toBe(out.version)
    expect(stale.body.data.current.included).toBe(false)
    const list = expectOk(await writer.get(`/api/bench-tests/${bt}/pulls`))
    expect(list.repeatability.find((r: any) => r.setupId === setup).includedPulls).toBe(2)
    const back = expectOk(await writer.patch(url, { version: out.version, included: true })).pull
    expect(back).toMatchObject({ included: true, exclusionReason: '' })
  })

  it('edits the weather and refuses impossible weather', async () => {
    const url = `/api/bench-tests/${bt}/pulls/${pulls[0].id}`
    const current = expectOk(await writer.get(url)).pull
    const bad = await writer.patch(url, { version: current.version, weather: { baroInHg: 10, airTempF: 70, humidityPct: 30 } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('weather.baroInHg')
    const ok = expectOk(await writer.patch(url, { version: current.version, weather: { baroInHg: 29.9, airTempF: 70, humidityPct: 30 } })).pull
    expect(ok.weather).toEqual({ baroInHg: 29.9, airTempF: 70, humidityPct: 30 })
  })
})
