// A story quotes its bench test's dyno day (issue 16, "the story editor can quote it"):
// ::day-report shows the plan against what happened (pulls made, setups skipped, time
// per swap). The editor's figures carry the live report, approval freezes it into the
// edition, and readers keep reading the frozen one after the bench test moves on.
// Stories that do not show the day keep data (and hashes) without it. Invented data.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, createBenchTest, createSetup, expectOk, pullCsv, uploadFiles, withCoolant } from '../support/workspace'
import { createStory, publishStory } from '../support/stories'

afterAll(closeTestDb)

let editor: Client
let bt: { id: number }
let token: string
let steps: { id: number }[]

const planPath = (id: number) => `/api/bench-tests/${id}/plan`

async function send(name: string, seed: number, peakTorqueLbFt = 430) {
  const res = await uploadFiles(token, [{ name, text: withCoolant(pullCsv({ seed, peakTorqueLbFt }).csv, 185) }])
  expect(res.status).toBe(201)
  return res.body.received[0].filedTo as string | undefined
}

async function approveAndPublish(storyId: number) {
  await publishStory(editor, storyId)
}

const DAY_BODY = [
  'We planned three cams and ran two of them.',
  '',
  '::pull-graph{channel="power"}',
  '::',
  '',
  '::day-report{caption="How the day went"}',
  '::',
  '',
  '::day-report{show="summary"}',
  '::',
].join('\n')

beforeAll(async () => {
  editor = await signedIn(DEMO.editor)
  bt = await createBenchTest(editor, 'Quoted dyno day (invented)')
  const baseline = await createSetup(editor, bt.id, 'Baseline')
  token = expectOk(await editor.post(`/api/bench-tests/${bt.id}/operator-links`, { expiresInHours: 4 }), 201).token
  steps = expectOk(await editor.request('PUT', planPath(bt.id), { json: {
    version: 0,
    acceptance: { rpmFrom: 3000, rpmTo: 6000, coolantF: { min: 170, max: 200 }, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 },
    steps: [
      { setupId: baseline.id, partsChange: 'As delivered', swapMinutes: null, plannedPulls: 2, checklist: [] },
      { setupId: null, newSetupLabel: 'Cam B', partsChange: 'Swap to cam B', swapMinutes: 90, plannedPulls: 2, checklist: [] },
      { setupId: null, newSetupLabel: 'Cam C', partsChange: 'Swap to cam C', swapMinutes: 90, plannedPulls: 2, checklist: [] },
    ],
  } })).plan.steps
  const day = (action: string, i: number) => editor.post(`${planPath(bt.id)}/day`, { action, stepId: steps[i]!.id })
  expectOk(await day('start', 0))
  expect(await send('base-1.csv', 601)).toBe('Baseline')
  expect(await send('base-2.csv', 602)).toBe('Baseline')
  expectOk(await day('start', 1))
  expect(await send('cam-b-1.csv', 603, 441)).toBe('Cam B')
  expectOk(await day('skip', 2))
}, 120_000)

describe('the test day in a story', () => {
  let story: { id: number, slug: string }
  let frozenSummary: string

  it('gives the editor the live report, the same as the day page', async () => {
    const live = expectOk(await editor.get(`/api/bench-tests/${bt.id}/day`)).report
    expect(live.summary).toMatch(/^2 of 3 planned setups tested, 3 pulls made of 6 planned\. 1 setup was skipped: Cam C\./)
    story = await createStory(editor, bt.id, { body: DAY_BODY })
    const figures = expectOk(await editor.get(`/api/stories/${story.id}/figures`))
    expect(figures.dayReport).toEqual(live)
    expect(figures.problems).toEqual([])
    // The draft's query (the editor asks with the setups and the day its text names).
    const drafted = expectOk(await editor.get(`/api/stories/${story.id}/figures?uses=all&sheet=0&day=1`))
    expect(drafted.dayReport.rows.map((r: any) => [r.setupLabel, r.plannedPulls, r.pullsMade, r.outcome])).toEqual([
      ['Baseline', 2, 2, 'done'], ['Cam B', 2, 1, 'short'], ['Cam C', 2, 0, 'skipped'],
    ])
    frozenSummary = live.summary
  })

  it('freezes the report with the edition; readers keep it after the day moves on, and the desk sees it move', async () => {
    await approveAndPublish(story.id)
    const edition = await testDb()('story_editions').where({ story_id: story.id }).first('data')
    expect(JSON.parse(edition.data).dayReport.summary).toBe(frozenSummary)

    const reader = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`))
    expect(reader.figures.dayReport.summary).toBe(frozenSummary)

    // The bench test goes on: Cam C is run after all.
    expectOk(await editor.post(`${planPath(bt.id)}/day`, { action: 'start', stepId: steps[2]!.id }))
    expect(await send('cam-c-1.csv', 604, 446)).toBe('Cam C')
    const moved = expectOk(await editor.get(`/api/bench-tests/${bt.id}/day`)).report.summary
    expect(moved).not.toBe(frozenSummary)

    const again = expectOk(await new Client().get(`/api/magazine/stories/${story.slug}`))
    expect(again.figures.dayReport.summary).toBe(frozenSummary)
    const status = expectOk(await editor.get(`/api/stories/${story.id}/edition`))
    expect(status.dataChanged).toBe(true)
    expect(status.moved).toContainEqual({ label: 'The test day, plan against what happened', figure: 'day-report', old: frozenSummary, new: moved })
  })

  it('leaves the data of stories that do not show the day as it was', async () => {
    const plain = await createStory(editor, bt.id, { body: 'No day here.\n\n::pull-graph\n::' })
    // The picker still shows the writer what the day would say.
    expect(expectOk(await editor.get(`/api/stories/${plain.id}/figures`)).dayReport.summary).toMatch(/^3 of 3 planned setups tested/)
    await approveAndPublish(plain.id)
    const edition = await testDb()('story_editions').where({ story_id: plain.id }).first('data')
    expect(JSON.parse(edition.data)).not.toHaveProperty('dayReport')
    expect(expectOk(await new Client().get(`/api/magazine/stories/${plain.slug}`)).figures).not.toHaveProperty('dayReport')
  })

  it('names a bad option, and says when the bench test has no plan', async () => {
    const bad = await createStory(editor, bt.id, { body: '::day-report{show="everything"}\n::' })
    const problems = expectOk(await editor.get(`/api/stories/${bad.id}/figures`)).problems
    expect(problems).toEqual([expect.objectContaining({ line: 1, message: 'show: Use one of "both", "summary", "table"' })])

    const other = await createBenchTest(editor, 'No plan here (invented)')
    const none = await createStory(editor, other.id, { body: '::day-report\n::' })
    expect(expectOk(await editor.get(`/api/stories/${none.id}/figures`)).dayReport).toBeNull()
  })
})
