// Bench tests, build sheets, setups with typed part specs and idle checks: the rules
// of versions (stale -> 409 with the current row), soft delete with confirmation and
// restore, and exactly one baseline.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
beforeAll(async () => { writer = (await newWriter()).client })

const SHEET = { boreIn: 4.1, strokeIn: 3.622, cylinders: 8, compressionRatio: 10.4, heads: 'Cast iron', induction: 'EFI', fuel: '93', ignition: 'Coil-near-plug', exhaust: 'Test cell', notes: '' }
const CAM = { category: 'camshaft', maker: 'Invented Cams', intakeDuration050Deg: 224, exhaustDuration050Deg: 230, intakeAdvertisedDeg: 280, exhaustAdvertisedDeg: 286, intakeLiftIn: 0.571, exhaustLiftIn: 0.578, lsaDeg: 112, iclDeg: 108 }

describe('bench tests', () => {
  it('creates with defaults and a slug from the title, unique on a repeat', async () => {
    const title = `Header test ${Date.now()}`
    const res = await writer.post('/api/bench-tests', { title, engineFamily: 'pushrod-v8', partType: 'exhaust' })
    const bt = expectOk(res, 201).benchTest
    expect(bt).toMatchObject({ title, shop: '', notes: '', testedFrom: null, defaultStandard: 'sae-j1349-1990', version: 1, deletedAt: null })
    expect(bt.slug).toBe(title.toLowerCase().replace(/ /g, '-'))
    const again = expectOk(await writer.post('/api/bench-tests', { title, engineFamily: 'pushrod-v8', partType: 'exhaust' }), 201).benchTest
    expect(again.slug).toBe(`${bt.slug}-2`)
  })

  it('validates fields with messages by path', async () => {
    const res = await writer.post('/api/bench-tests', { title: '', engineFamily: 'rotary-jet', partType: 'exhaust', testedFrom: '2026-05-10', testedTo: '2026-05-01' })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: any) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['title', 'engineFamily']))
  })

  it('updates with the version read and refuses a stale one with the current row', async () => {
    const bt = await createBenchTest(writer)
    const first = expectOk(await writer.patch(`/api/bench-tests/${bt.id}`, { version: 1, shop: 'First', testedFrom: '2026-05-01', testedTo: '2026-05-02' })).benchTest
    expect(first).toMatchObject({ shop: 'First', version: 2, testedFrom: '2026-05-01', testedTo: '2026-05-02' })
    const stale = await writer.patch(`/api/bench-tests/${bt.id}`, { version: 1, shop: 'Second' })
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ currentVersion: 2, current: { shop: 'First' } })
    const backwards = await writer.patch(`/api/bench-tests/${bt.id}`, { version: 2, testedTo: '2026-04-01' })
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.issues[0].path).toBe('testedTo')
  })

  it('deletes softly: asks for confirmation when pulls would go, lists and restores it', async () => {
    const bt = await createBenchTest(writer)
    const setup = await createSetup(writer, bt.id, 'Baseline')
    expectOk(await importFiles(writer, bt.id, [pullFile('p1.csv', setup.id, { seed: 1 }), pullFile('p2.csv', setup.id, { seed: 2 })]), 201)
    const ask = await writer.delete(`/api/bench-tests/${bt.id}`)
    expect(ask.status).toBe(409)
    expect(ask.body.data).toMatchObject({ setups: 1, pulls: 2 })
    expect(ask.body.message).toMatch(/2 pulls in 1 setup/)
    const gone = expectOk(await writer.delete(`/api/bench-tests/${bt.id}?confirm=true`)).benchTest
    expect(gone.deletedAt).not.toBeNull()
    expect((await writer.get(`/api/bench-tests/${bt.id}`)).status).toBe(404)
    expect(expectOk(await writer.get('/api/bench-tests')).benchTests.map((b: any) => b.id)).not.toContain(bt.id)
    expect(expectOk(await writer.get('/api/bench-tests?deleted=only')).benchTests.map((b: any) => b.id)).toContain(bt.id)
    expect(await testDb()('pulls').where({ bench_test_id: bt.id }).count({ n: '*' }).first()).toMatchObject({ n: 2 })
    const back = expectOk(await writer.post(`/api/bench-tests/${bt.id}/restore`)).benchTest
    expect(back.deletedAt).toBeNull()
    const detail = expectOk(await writer.get(`/api/bench-tests/${bt.id}`))
    expect(detail.setups[0].pullCount).toBe(2)
    expect((await writer.post(`/api/bench-tests/${bt.id}/restore`)).status).toBe(404)
  })

  it('deletes one without pulls without asking', async () => {
    const bt = await createBenchTest(writer)
    expect(expectOk(await writer.delete(`/api/bench-tests/${bt.id}`)).benchTest.deletedAt).not.toBeNull()
  })
})

describe('build sheet', () => {
  it('is created with version 0, computes displacement, and refuses a stale version', async () => {
    const bt = await createBenchTest(writer)
    const sheet = expectOk(await writer.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { version: 0, ...SHEET } })).buildSheet
    // pi/4 x 4.1^2 x 3.622 x 8 = 382.6 in^3 (swept volume, Heywood ch. 2, textbook); 1 in^3 = 16.387064 cm^3 (exact)
    expect(sheet.displacementCi).toBeCloseTo(Math.PI / 4 * 4.1 ** 2 * 3.622 * 8, 9)
    expect(sheet.displacementCi).toBeCloseTo(382.6, 1)
    expect(sheet.displacementL).toBeCloseTo(sheet.displacementCi * 16.387064 / 1000, 9)
    expect(sheet.version).toBe(1)
    const again = await writer.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { version: 0, ...SHEET } })
    expect(again.status).toBe(409)
    expect(again.body.data.currentVersion).toBe(1)
    const updated = expectOk(await writer.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { ...SHEET, version: 1, compressionRatio: 11 } })).buildSheet
    expect(updated).toMatchObject({ compressionRatio: 11, version: 2 })
    const stale = await writer.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { ...SHEET, version: 1 } })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.compressionRatio).toBe(11)
    expect(expectOk(await writer.get(`/api/bench-tests/${bt.id}`)).buildSheet.version).toBe(2)
  })

  it('refuses implausible figures', async () => {
    const bt = await createBenchTest(writer)
    const res = await writer.request('PUT', `/api/bench-tests/${bt.id}/build-sheet`, { json: { ...SHEET, version: 0, boreIn: -1, cylinders: 2.5 } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toEqual(expect.arrayContaining(['boreIn', 'cylinders']))
  })
})

describe('setups', () => {
  it('keeps order and exactly one baseline: the first, or the one chosen', async () => {
    const bt = await createBenchTest(writer)
    const a = await createSetup(writer, bt.id, 'A')
    const b = await createSetup(writer, bt.id, 'B')
    const c = await createSetup(writer, bt.id, 'C', { baseline: true })
    expect([a.position, b.position, c.position]).toEqual([1, 2, 3])
    let setups = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups`)).setups
    expect(setups.filter((s: any) => s.isBaseline).map((s: any) => s.id)).toEqual([c.id])
    setups = expectOk(await writer.post(`/api/bench-tests/${bt.id}/setups/${a.id}/baseline`)).setups
    expect(setups.filter((s: any) => s.isBaseline).map((s: any) => s.id)).toEqual([a.id])
    setups = expectOk(await writer.request('PUT', `/api/bench-tests/${bt.id}/setups/order`, { json: { setupIds: [c.id, a.id, b.id] } })).setups
    expect(setups.map((s: any) => s.label)).toEqual(['C', 'A', 'B'])
    const partial = await writer.request('PUT', `/api/bench-tests/${bt.id}/setups/order`, { json: { setupIds: [c.id, a.id] } })
    expect(partial.status).toBe(400)
    // Deleting the baseline hands the role to the first one left; restoring does not take it back.
    expectOk(await writer.delete(`/api/bench-tests/${bt.id}/setups/${a.id}`))
    setups = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups`)).setups
    expect(setups.map((s: any) => [s.label, s.isBaseline])).toEqual([['C', true], ['B', false]])
    const deleted = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups?deleted=only`)).setups
    expect(deleted.map((s: any) => s.id)).toEqual([a.id])
    const restored = expectOk(await writer.post(`/api/bench-tests/${bt.id}/setups/${a.id}/restore`)).setup
    expect(restored.isBaseline).toBe(false)
    setups = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups`)).setups
    expect(setups.map((s: any) => s.label)).toEqual(['C', 'B', 'A'])
    const live = await testDb()('setups').where({ bench_test_id: bt.id, is_baseline: true }).whereNull('deleted_at').count({ n: '*' }).first()
    expect(Number(live?.n)).toBe(1)
  })

  it('refuses two live baselines even at the database (unique marker)', async () => {
    const bt = await createBenchTest(writer)
    await createSetup(writer, bt.id, 'A')
    const b = await createSetup(writer, bt.id, 'B')
    await expect(testDb()('setups').where({ id: b.id }).update({ is_baseline: true })).rejects.toThrow(/Duplicate entry/)
  })

  it('validates part cards per category, with the path of each field', async () => {
    const bt = await createBenchTest(writer)
    const res = await writer.post(`/api/bench-tests/${bt.id}/setups`, {
      label: 'Bad parts',
      parts: [
        { ...CAM, lsaDeg: 150, intakeAdvertisedDeg: 200 },
        { category: 'headers', style: 'long-tube', primaryDiameterIn: 1.75 },
        { category: 'carburetor' },
        { category: 'supercharger', boostPsi: 8 },
      ],
    })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: any) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['parts.0.lsaDeg', 'parts.1.primaryLengthIn', 'parts.1.collectorDiameterIn', 'parts.2.airflowCfm', 'parts.3.category']))
  })

  it('stores typed part cards and replaces them with the version read', async () => {
    const bt = await createBenchTest(writer)
    const parts = [CAM, { category: 'intake-manifold', type: 'single-plane', runnerNotes: 'Tall runners' }, { category: 'throttle-body', boreMm: 90 }, { category: 'headers', style: 'cast-manifold' }, { category: 'cylinder-heads', intakePortCc: 210, intakeValveIn: 2.08, exhaustValveIn: 1.6 }, { category: 'ignition-timing', totalAdvanceDeg: 32 }, { category: 'other', title: 'Electric water pump' }]
    const setup = await createSetup(writer, bt.id, 'Cam swap', { parts, description: 'Invented parts' })
    expect(setup.parts).toEqual(parts)
    const edited = expectOk(await writer.patch(`/api/bench-tests/${bt.id}/setups/${setup.id}`, { version: setup.version, parts: [CAM], label: 'Cam only' })).setup
    expect(edited).toMatchObject({ label: 'Cam only', parts: [CAM], version: setup.version + 1 })
    const stale = await writer.patch(`/api/bench-tests/${bt.id}/setups/${setup.id}`, { version: setup.version, label: 'Late' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.label).toBe('Cam only')
  })

  it('deleting a setup with pulls asks first, then is soft and restorable with its pulls', async () => {
    const bt = await createBenchTest(writer)
    const a = await createSetup(writer, bt.id, 'A')
    const b = await createSetup(writer, bt.id, 'B')
    expectOk(await importFiles(writer, bt.id, [pullFile('b1.csv', b.id, { seed: 3 })]), 201)
    const ask = await writer.delete(`/api/bench-tests/${bt.id}/setups/${b.id}`)
    expect(ask.status).toBe(409)
    expect(ask.body.data.pulls).toBe(1)
    expectOk(await writer.delete(`/api/bench-tests/${bt.id}/setups/${b.id}?confirm=true`))
    expect(expectOk(await writer.get(`/api/bench-tests/${bt.id}/pulls`)).pulls).toHaveLength(0)
    expectOk(await writer.post(`/api/bench-tests/${bt.id}/setups/${b.id}/restore`))
    const pulls = expectOk(await writer.get(`/api/bench-tests/${bt.id}/pulls`)).pulls
    expect(pulls.map((p: any) => p.setupId)).toEqual([b.id])
    expect(a.isBaseline).toBe(true)
  })

  it('records idle checks and gives their mean', async () => {
    const bt = await createBenchTest(writer)
    const s = await createSetup(writer, bt.id, 'A')
    const one = expectOk(await writer.post(`/api/bench-tests/${bt.id}/setups/${s.id}/idle-checks`, { idleRpm: 750, vacuumInHg: 17 }), 201).idleCheck
    expectOk(await writer.post(`/api/bench-tests/${bt.id}/setups/${s.id}/idle-checks`, { idleRpm: 760, vacuumInHg: 18, note: 'warm' }), 201)
    expect((await writer.post(`/api/bench-tests/${bt.id}/setups/${s.id}/idle-checks`, { idleRpm: 100, vacuumInHg: 40 })).status).toBe(400)
    let setup = expectOk(await writer.get(`/api/bench-tests/${bt.id}`)).setups[0]
    expect(setup.idleChecks).toHaveLength(2)
    expect(setup.idleVacuumInHg).toBeCloseTo(17.5, 10)
    expectOk(await writer.delete(`/api/bench-tests/${bt.id}/setups/${s.id}/idle-checks/${one.id}`))
    setup = expectOk(await writer.get(`/api/bench-tests/${bt.id}`)).setups[0]
    expect(setup.idleVacuumInHg).toBe(18)
  })
})

describe('demo data', () => {
  it('seeds the fictional magazine\'s bench tests through the import path', async () => {
    const rows = await testDb()('bench_tests').whereIn('slug', ['long-tube-headers-on-a-6-3-l-pushrod-v8', 'intake-and-throttle-body-on-a-2-0-l-turbo-four']).select('id', 'notes', 'shop')
    expect(rows).toHaveLength(2)
    for (const row of rows) {
      expect(row.notes).toMatch(/invented/)
      expect(row.shop).toMatch(/\(fictional\)/)
      const pulls = await testDb()('pulls').where({ bench_test_id: row.id }).select('original_text', 'point_count')
      expect(pulls.length).toBeGreaterThanOrEqual(9)
      for (const p of pulls) expect(p.original_text).toMatch(/synthetic pull, invented data/)
    }
  })
})
