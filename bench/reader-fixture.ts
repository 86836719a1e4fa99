// The running test-profile app with one published story that has three graphs,
// shared by the reader benchmarks. Synthetic pulls (invented data).
import { rmSync } from 'node:fs'
import { startApp } from '../scripts/lib/app'
import { buildIfNeeded } from '../scripts/lib/build'
import { migrate, seed } from '../scripts/lib/database'
import { localEnv, serverEnv } from '../scripts/lib/env'
import { killGroup } from '../scripts/lib/proc'
import { startServices } from '../scripts/lib/services'
import { Client, DEMO_PASSWORD } from '../tests/support/http'
import { expectOk } from '../tests/support/workspace'
import { createStory, storyBench, transition } from '../tests/support/stories'

export interface ReaderFixture {
  base: string
  /** The app server's process count (PULLSHEET_PROCESSES, server/cluster.mjs). */
  processes: number
  /** A second app server of the same build on the same database, for a same-run comparison. */
  other?: { base: string, processes: number }
  slug: string
  readerCookie: string
  stop: () => Promise<void>
}

/** `processes` for the app server; `otherProcesses` starts a second one beside it (port + 1). */
export async function readerFixture(opts: { processes?: number, otherProcesses?: number } = {}): Promise<ReaderFixture> {
  const processes = opts.processes ?? 1
  const env = localEnv('test')
  rmSync(env.dataDir, { recursive: true, force: true })
  const testEnv = localEnv('test')
  const settings = serverEnv(testEnv)
  await buildIfNeeded()
  const services = await startServices(testEnv)
  await migrate(settings.DATABASE_URL!)
  await seed(settings.DATABASE_URL!)
  const apps = [await startApp(testEnv, { MAIL_POLL_MS: '300', PULLSHEET_PROCESSES: String(processes) })]
  const otherPort = testEnv.app.port + 1
  if (opts.otherProcesses) apps.push(await startApp(testEnv, { MAIL_POLL_MS: '300', PULLSHEET_PROCESSES: String(opts.otherProcesses) }, otherPort))
  const stop = async () => {
    for (const app of apps) await killGroup(app)
    await services.stop()
  }
  try {
    // The test client's default address is read when it is imported: name this profile's.
    const signedIn = async (email: string) => {
      const client = new Client(testEnv.app.baseUrl)
      expectOk(await client.post('/api/auth/login', { email, password: DEMO_PASSWORD }))
      return client
    }
    const editor = await signedIn('editor@example.com')
    const bench = await storyBench(editor)
    const pair = `${bench.baselineId},${bench.camId}`
    const body = [
      'The long-duration cam moves the torque peak up the rev range (synthetic pulls, invented data).',
      '', `::pull-graph{setups="${pair}" channel="power"}`, '::',
      '', `::pull-graph{setups="${pair}" channel="torque"}`, '::',
      '', `::gain-graph{baseline=${bench.baselineId} setups="${bench.camId}"}`, '::',
      '', '::results-table', '::',
    ].join('\n')
    const story = await createStory(editor, bench.benchTestId, { body, deck: 'Three graphs and a table, for the benchmark.' })
    expectOk(await transition(editor, story.id, 'submit'))
    expectOk(await editor.get(`/api/stories/${story.id}/number-check`))
    expectOk(await transition(editor, story.id, 'approve'))
    expectOk(await transition(editor, story.id, 'publish_now'))
    const reader = await signedIn('reader@example.com')
    const other = opts.otherProcesses ? { base: `http://${testEnv.app.host}:${otherPort}`, processes: opts.otherProcesses } : undefined
    return { base: testEnv.app.baseUrl, processes, other, slug: story.slug, readerCookie: reader.cookie, stop }
  }
  catch (e) {
    await stop()
    throw e
  }
}
