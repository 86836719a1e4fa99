// Fixtures for the stories API tests: a bench test with a baseline and a camshaft
// setup, repeat pulls from shared/dyno's synthetic model (invented data), idle
// checks, and stories on it.
import type { Client } from './http'
import { createBenchTest, createSetup, expectOk, importFiles, pullFile } from './workspace'

export const BASELINE_MODEL = { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }
export const CAM_MODEL = { peakTorqueLbFt: 441, peakTorqueRpm: 4800, widthLowRpm: 2250, widthHighRpm: 2400 }

export interface StoryBench { benchTestId: number, baselineId: number, camId: number }

let seed = 7000

/** A bench test owned by `client` with two analysed setups (two pulls each) and idle checks. */
export async function storyBench(client: Client): Promise<StoryBench> {
  const bt = (await createBenchTest(client, `Story bench ${Math.random().toString(36).slice(2, 8)}`)).id as number
  const baseline = await createSetup(client, bt, 'Baseline')
  const cam = await createSetup(client, bt, 'Long-duration cam')
  for (const [setup, model, idle] of [[baseline, BASELINE_MODEL, 17.5], [cam, CAM_MODEL, 14]] as const) {
    expectOk(await client.post(`/api/bench-tests/${bt}/setups/${setup.id}/idle-checks`, { idleRpm: 800, vacuumInHg: idle }), 201)
    const files = [1, 2].map(n => pullFile(`setup-${setup.id}-pull-${n}.csv`, setup.id, { ...model, seed: seed++ }))
    expectOk(await importFiles(client, bt, files), 201)
  }
  return { benchTestId: bt, baselineId: baseline.id, camId: cam.id }
}

export function storyBody(bench: StoryBench, extra = ''): string {
  return [
    'The long-duration cam moves the torque peak up the rev range.',
    '',
    `::pull-graph{setups="${bench.baselineId},${bench.camId}" channel="power"}`,
    '::',
    '',
    `It gained :figure-value{of="peak-power-gain" setup=${bench.camId} vs=${bench.baselineId}} at the peak.`,
    extra,
  ].join('\n')
}

/**
 * A published story whose page carries every kind of thing a story page draws: two graphs
 * (their controls and summaries use ids), a results table, an inline value and the cautions.
 */
export async function publishedFullStory(editor: Client) {
  const bench = await storyBench(editor)
  const body = [storyBody(bench), '', `::gain-graph{baseline=${bench.baselineId} setups="${bench.camId}"}`, '::', '', '::results-table', '::'].join('\n')
  const story = await createStory(editor, bench.benchTestId, { body })
  await publishStory(editor, story.id)
  return story
}

export async function createStory(client: Client, benchTestId: number, fields: Record<string, unknown> = {}) {
  return expectOk(await client.post('/api/stories', { benchTestId, headline: `Cam swap ${Math.random().toString(36).slice(2, 8)}`, ...fields }), 201).story
}

export async function transition(client: Client, storyId: number, action: string, extra: Record<string, unknown> = {}) {
  const story = expectOk(await client.get(`/api/stories/${storyId}`)).story
  return client.post(`/api/stories/${storyId}/transitions`, { action, version: story.version, ...extra })
}

/** Submit, run the number check (approval needs it seen for this version), approve. */
export async function approveStory(editor: Client, storyId: number) {
  expectOk(await transition(editor, storyId, 'submit'))
  expectOk(await editor.get(`/api/stories/${storyId}/number-check`))
  expectOk(await transition(editor, storyId, 'approve'))
}

/** The whole desk path to readers: submit, number check, approve, publish now. */
export async function publishStory(editor: Client, storyId: number) {
  await approveStory(editor, storyId)
  expectOk(await transition(editor, storyId, 'publish_now'))
}
