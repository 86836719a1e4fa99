// Arrangements shared by the story browser tests: a fresh writer (so tests never
// share ownership), a bench test with a baseline and a cam setup, two synthetic
// pulls each (shared/dyno's documented model: invented data), and a story on it.
import { expect } from 'vitest'
import type { Page } from 'playwright-core'
import type { Story, StoryFigures } from '#shared/types/stories'
import { createBenchTest, createSetup, expectOk, importFiles, newWriter, pullFile } from '../support/workspace'
import type { Client } from '../support/http'

export interface StoryBench {
  writer: { client: Client, id: number, email: string, password: string }
  benchTestId: number
  baselineId: number
  camId: number
}

export const WRITER_PASSWORD = 'a-long-test-password'

export async function benchWithPulls(): Promise<StoryBench> {
  const writer = await newWriter('writer')
  const bt = await createBenchTest(writer.client, `Cam test on an invented V8 ${Math.random().toString(36).slice(2, 7)}`)
  const base = await createSetup(writer.client, bt.id, 'Stock cam (invented)')
  const cam = await createSetup(writer.client, bt.id, 'Long-duration cam (invented)', {
    parts: [{ category: 'camshaft', maker: 'Invented Cam Works', intakeDuration050Deg: 236, exhaustDuration050Deg: 242, intakeLiftIn: 0.58, exhaustLiftIn: 0.59, lsaDeg: 112, iclDeg: 108 }],
  })
  expectOk(await importFiles(writer.client, bt.id, [
    pullFile('stock-1.csv', base.id, { seed: 6101, peakTorqueLbFt: 430, peakTorqueRpm: 4400 }),
    pullFile('stock-2.csv', base.id, { seed: 6102, peakTorqueLbFt: 430, peakTorqueRpm: 4400 }),
    pullFile('cam-1.csv', cam.id, { seed: 6103, peakTorqueLbFt: 452, peakTorqueRpm: 4900 }),
    pullFile('cam-2.csv', cam.id, { seed: 6104, peakTorqueLbFt: 452, peakTorqueRpm: 4900 }),
  ]), 201)
  return { writer: { ...writer, password: WRITER_PASSWORD }, benchTestId: bt.id, baselineId: base.id, camId: cam.id }
}

export async function createStoryFor(client: Client, benchTestId: number, headline: string, body = ''): Promise<Story> {
  const story = expectOk(await client.post('/api/stories', { benchTestId, headline }), 201).story as Story
  if (!body) return story
  return expectOk(await client.patch(`/api/stories/${story.id}`, { version: story.version, body })).story as Story
}

export async function figuresOf(client: Client, storyId: number): Promise<StoryFigures> {
  return expectOk(await client.get(`/api/stories/${storyId}/figures`)) as StoryFigures
}

/** Waits for the editor's save state to read `state` (saved, offline, conflict ...). */
export async function saveStateIs(page: Page, state: string, timeout = 15_000) {
  await page.locator(`[data-testid="save-state"][data-state="${state}"]`).waitFor({ timeout })
}

/** Types at the end of the body textarea the way a person does. */
export async function typeInBody(page: Page, text: string) {
  const body = page.getByTestId('editor-body')
  await body.click()
  await page.keyboard.press('Control+End')
  await page.keyboard.type(text)
}

export async function poll<T>(what: string, fn: () => Promise<T | undefined>, timeoutMs = 60_000): Promise<T> {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const value = await fn()
    if (value !== undefined) return value
    await new Promise(r => setTimeout(r, 500))
  }
  expect.fail(`${what} did not happen within ${timeoutMs} ms`)
}

/**
 * Leaving the editor with unsaved text asks "leave the page?" (and keeps a copy);
 * the tests answer yes, as a person who means to leave does.
 */
export function acceptLeaving(page: Page) {
  page.on('dialog', async (d) => {
    if (d.type() === 'beforeunload') await d.accept()
  })
}

/** Inserts a figure through the editor's picker: open it, let `choose` fill it in, insert. */
export async function pick(page: Page, choose: (picker: ReturnType<Page['getByTestId']>) => Promise<void>): Promise<void> {
  await page.getByTestId('picker-open').click()
  const picker = page.getByTestId('picker')
  await picker.waitFor()
  await choose(picker)
  await picker.getByTestId('picker-insert').click()
  await picker.waitFor({ state: 'hidden' })
}
