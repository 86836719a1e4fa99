// The dyno day over HTTP: test plans (version-checked, copied), the moves of the day,
// operator files filed into the current step, the day view's flags and verdicts, the
// operator's view of the plan, and the live event stream.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { createBenchTest, createSetup, expectOk, newWriter, pullCsv, uploadFiles, withCoolant } from '../support/workspace'

afterAll(closeTestDb)

let writer: Client
let bt: { id: number, title: string }
let baseline: number
let token: string

const acceptance = { rpmFrom: 3000, rpmTo: 6000, coolantF: { min: 170, max: 200 }, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 }
const plan = (bt: number) => `/api/bench-tests/${bt}/plan`

beforeAll(async () => {
  writer = (await newWriter()).client
  bt = await createBenchTest(writer, 'Dyno day bench test')
  baseline = (await createSetup(writer, bt.id, 'Baseline')).id
  token = expectOk(await writer.post(`/api/bench-tests/${bt.id}/operator-links`, { expiresInHours: 4 }), 201).token
})

describe('test plans', () => {
  it('answers version 0 with the default window before there is a plan', async () => {
    const body = expectOk(await writer.get(plan(bt.id)))
    expect(body.plan).toMatchObject({ version: 0, steps: [], currentStepId: null })
    expect(body.plan.acceptance.repeatPct).toBe(1)
  })

  it('saves steps on existing and planned setups, gives checklist items ids, and refuses a stale version', async () => {
    const saved = expectOk(await writer.request('PUT', plan(bt.id), { json: {
      version: 0,
      acceptance,
      notes: 'Two cams after the baseline.',
      steps: [
        { setupId: baseline, partsChange: 'As delivered', swapMinutes: null, plannedPulls: 2, checklist: [{ text: 'Warm up to 180 F' }] },
        { setupId: null, newSetupLabel: 'Cam B', partsChange: 'Swap to cam B', swapMinutes: 90, plannedPulls: 3, checklist: [{ text: 'Degree the cam' }, { text: 'Set the lash' }] },
      ],
    } })).plan
    expect(saved.version).toBe(1)
    expect(saved.steps.map((s: any) => s.setupLabel)).toEqual(['Baseline', 'Cam B'])
    expect(saved.steps[1].checklist.map((c: any) => c.id)).toEqual([expect.stringMatching(/^[a-f0-9]{12}$/), expect.stringMatching(/^[a-f0-9]{12}$/)])
    const setups = expectOk(await writer.get(`/api/bench-tests/${bt.id}/setups`)).setups
    expect(setups.map((s: any) => s.label)).toEqual(['Baseline', 'Cam B'])

    const stale = await writer.request('PUT', plan(bt.id), { json: { version: 0, acceptance, steps: [] } })
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ currentVersion: 1, current: { version: 1 } })
    expect((await testDb()('test_plan_steps').where({ bench_test_id: bt.id })).length).toBe(2)
  })

  it('names the field of a bad plan', async () => {
    const res = await writer.request('PUT', plan(bt.id), { json: { version: 1, acceptance: { ...acceptance, rpmTo: 2000 }, steps: [] } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toContainEqual(expect.objectContaining({ path: 'acceptance.rpmTo' }))
    const other = await createBenchTest(writer)
    const foreign = (await createSetup(writer, other.id, 'Elsewhere')).id
    const res2 = await writer.request('PUT', plan(bt.id), { json: { version: 1, acceptance, steps: [{ setupId: foreign, partsChange: '', swapMinutes: null, plannedPulls: 1, checklist: [] }] } })
    expect(res2.status).toBe(400)
    expect(res2.body.data.issues[0].path).toBe('steps.0.setupId')
  })

  it('keeps ticks and day state when the plan is edited, and copies a plan to another bench test', async () => {
    const before = expectOk(await writer.get(plan(bt.id))).plan
    const cam = before.steps[1]
    expectOk(await writer.post(`${plan(bt.id)}/day`, { action: 'tick', stepId: cam.id, itemId: cam.checklist[0].id, done: true }))
    const edited = expectOk(await writer.request('PUT', plan(bt.id), { json: {
      version: before.version,
      acceptance,
      steps: before.steps.map((s: any) => ({ id: s.id, setupId: s.setupId, partsChange: s.partsChange, swapMinutes: s.swapMinutes, plannedPulls: s.plannedPulls, checklist: [...s.checklist.map((c: any) => ({ id: c.id, text: c.text })), { text: 'Check for leaks' }] })),
    } })).plan
    expect(edited.steps[1].checklist.map((c: any) => c.done)).toEqual([true, false, false])

    const target = await createBenchTest(writer, 'Copy target')
    const copied = expectOk(await writer.post(`${plan(target.id)}/copy`, { fromBenchTestId: bt.id, version: 0 })).plan
    expect(copied.steps.map((s: any) => [s.setupLabel, s.plannedPulls, s.checklist.length, s.checklist.some((c: any) => c.done)])).toEqual([['Baseline', 2, 2, false], ['Cam B', 3, 3, false]])
    expect(copied.acceptance).toEqual(acceptance)
    const stranger = (await newWriter()).client
    const theirs = await createBenchTest(stranger)
    expect((await stranger.post(`${plan(theirs.id)}/copy`, { fromBenchTestId: bt.id, version: 0 })).status).toBe(404)
  })
})

describe('the day', () => {
  it('files operator files into the current step, flags them against the window, and judges the repeat', async () => {
    const p = expectOk(await writer.get(plan(bt.id))).plan
    // Before the day starts the files wait in the inbox, as before.
    const early = await uploadFiles(token, [{ name: 'early.csv', text: pullCsv({ seed: 40 }).csv }])
    expect(early.body.received[0].filedTo).toBeUndefined()
    expect(expectOk(await writer.post(`${plan(bt.id)}/day`, { action: 'start', stepId: p.steps[0].id })).plan.currentStepId).toBe(p.steps[0].id)

    const res = await uploadFiles(token, [
      { name: 'base-1.csv', text: withCoolant(pullCsv({ seed: 41 }).csv, 185) },
      { name: 'base-2.csv', text: withCoolant(pullCsv({ seed: 42 }).csv, 212) },
      { name: 'no-weather.csv', text: pullCsv({ seed: 43 }).csv.split('\r\n').filter(l => !l.startsWith('#')).join('\r\n') },
    ])
    expect(res.status).toBe(201)
    expect(res.body.received.map((r: any) => r.filedTo ?? null)).toEqual(['Baseline', 'Baseline', null])
    const inbox = expectOk(await writer.get(`/api/bench-tests/${bt.id}/inbox?state=waiting`)).files.map((f: any) => f.fileName).sort()
    expect(inbox).toEqual(['early.csv', 'no-weather.csv'])

    const day = expectOk(await writer.get(`/api/bench-tests/${bt.id}/day`))
    const step = day.steps[0]
    expect(step.status).toBe('current')
    expect(step.pulls.map((d: any) => d.pull.fileName)).toEqual(['base-1.csv', 'base-2.csv'])
    expect(step.pulls[0].flags).toEqual([])
    expect(step.pulls[1].flags).toEqual(['coolant 212 F, above the window\'s 200 F'])
    // Two pulls of the same model with 0.3 % noise: the spread comes from repeatSpread through the pulls list.
    const spread = expectOk(await writer.get(`/api/bench-tests/${bt.id}/pulls`)).repeatability.find((r: any) => r.setupId === baseline).spreadPct
    expect(step.repeat.spreadPct).toBeCloseTo(spread, 6)
    expect(step.repeat.verdict).toBe(spread <= 1 ? `two pulls within ${spread.toFixed(1)} percent: enough` : `spread ${spread.toFixed(1)} percent: make another pull`)
    expect(day.seq).toBeGreaterThan(0)
    expect(day.report.summary).toMatch(/^1 of 2 planned setups tested, 2 pulls made of 5 planned\./)
  })

  it('moves on: the next step takes the files, a skipped step is reported, the writer can move a pull back', async () => {
    const p = expectOk(await writer.get(plan(bt.id))).plan
    expectOk(await writer.post(`${plan(bt.id)}/day`, { action: 'start', stepId: p.steps[1].id }))
    const res = await uploadFiles(token, [{ name: 'cam-1.csv', text: pullCsv({ seed: 50, toRpm: 5000 }).csv }])
    expect(res.body.received[0].filedTo).toBe('Cam B')
    const day = expectOk(await writer.get(`/api/bench-tests/${bt.id}/day`))
    const pull = day.steps[1].pulls[0]
    expect(pull.flags[0]).toMatch(/^rpm range short: 3000–5000 rpm, the plan wants 3000–6000/)
    expect(pull.flags).toContain('no coolant temperature in the file to check')
    expect(day.steps[1].swapMinutesActual).toBe(0)
    const moved = expectOk(await writer.patch(`/api/bench-tests/${bt.id}/pulls/${pull.pull.id}`, { version: pull.pull.version, setupId: baseline })).pull
    expect(moved.setupId).toBe(baseline)
    expectOk(await writer.post(`${plan(bt.id)}/day`, { action: 'skip', stepId: p.steps[1].id }))
    const after = expectOk(await writer.get(`/api/bench-tests/${bt.id}/day`))
    expect(after.plan.currentStepId).toBeNull()
    expect(after.report.rows.map((r: any) => r.outcome)).toEqual(['short', 'skipped'])
    expect(after.report.summary).toContain('1 setup was skipped: Cam B.')
    // With no current step, files wait in the inbox again.
    expect((await uploadFiles(token, [{ name: 'late.csv', text: pullCsv({ seed: 51 }).csv }])).body.received[0].filedTo).toBeUndefined()
  })

  it('shows the operator the steps and counts, and nothing that identifies anything', async () => {
    const res = await new Client().get(`/api/upload/${token}/plan`)
    expect(res.status).toBe(200)
    expect(res.body.plan.steps.map((s: any) => [s.setupLabel, s.received, s.status])).toEqual([['Baseline', 3, 'done'], ['Cam B', 0, 'skipped']])
    expect(res.body.plan.window[0]).toBe('Pull from 3000 to 6000 rpm or wider.')
    expect(JSON.stringify(res.body)).not.toMatch(/"id"|"setupId"|"benchTestId"/)
    expect((await new Client().get(`/api/upload/${'x'.repeat(43)}/plan`)).status).toBe(404)
  })
})

describe('the live stream', () => {
  it('sends the counter on connect, a change when a file arrives, and what was missed on reconnect', async () => {
    const ctrl = new AbortController()
    const res = await fetch(`${writer.base}/api/bench-tests/${bt.id}/day/events`, { headers: { accept: 'text/event-stream', cookie: writer.cookie }, signal: ctrl.signal })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/text\/event-stream/)
    const reader = res.body!.getReader()
    const decoder = new TextDecoder()
    let buffer = ''
    const nextChange = async (): Promise<number> => {
      for (;;) {
        const m = /id: (\d+)\nevent: change\n/.exec(buffer)
        if (m) {
          buffer = buffer.slice(m.index + m[0].length)
          return Number(m[1])
        }
        const { value, done } = await reader.read()
        if (done) throw new Error('stream ended')
        buffer += decoder.decode(value)
      }
    }
    const first = await nextChange()
    const sent = Date.now()
    await uploadFiles(token, [{ name: 'live.csv', text: pullCsv({ seed: 60 }).csv }])
    const second = await nextChange()
    expect(second).toBeGreaterThan(first)
    expect(Date.now() - sent).toBeLessThan(2000)
    ctrl.abort()

    // Reconnecting with the last id seen gets nothing until something changes; an older id gets the current counter at once.
    const again = await fetch(`${writer.base}/api/bench-tests/${bt.id}/day/events`, { headers: { 'accept': 'text/event-stream', 'cookie': writer.cookie, 'last-event-id': String(first) } })
    const text = decoder.decode((await again.body!.getReader().read()).value)
    expect(text).toContain(`id: ${second}\nevent: change`)
    await again.body?.cancel().catch(() => {})
    expect((await writer.get(`/api/bench-tests/${bt.id}/day/events`)).status).toBe(406)
  })
})
