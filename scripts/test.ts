// npm test: lint, typecheck, unit and component tests; then its own services on other ports with
// throwaway data, one build, the built server, API and browser tests; then stop all.
import { existsSync, readFileSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { startApp } from './lib/app'
import { buildIfNeeded } from './lib/build'
import { migrate, seed } from './lib/database'
import { localEnv, ROOT, serverEnv } from './lib/env'
import { killGroup, runInherit } from './lib/proc'
import { startServices, type RunningServices } from './lib/services'

const bin = (name: string) => join(ROOT, 'node_modules', '.bin', name)
// `npm test -- api` runs one project without lint and typecheck; file filters may
// follow: `npm test -- api zz-faults` (vitest matches them against file paths).
const PROJECTS = ['unit', 'components', 'api', 'browser']
const only = process.argv.slice(2).filter(a => PROJECTS.includes(a))
const filters = process.argv.slice(2).filter(a => !PROJECTS.includes(a))
const failures: string[] = []
const totals = { passed: 0, failed: 0, skipped: 0 }

async function step(name: string, cmd: string, args: string[], env: Record<string, string> = {}) {
  console.log(`\n=== ${name} ===`)
  const code = await runInherit(cmd, args, { cwd: ROOT, env: { ...process.env, ...env } })
  if (code !== 0) failures.push(name)
}

async function vitest(project: string, env: Record<string, string> = {}) {
  if (only.length && !only.includes(project)) return
  const report = join(ROOT, '.data', 'test', `vitest-${project}.json`)
  rmSync(report, { force: true })
  const serial = project === 'unit' ? [] : ['--no-file-parallelism'] // they share one database and server
  await step(`${project} tests`, bin('vitest'), ['run', '--project', project, ...serial, ...filters, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`], env)
  if (existsSync(report)) {
    const r = JSON.parse(readFileSync(report, 'utf8')) as { numPassedTests: number, numFailedTests: number, numPendingTests: number, numTodoTests: number }
    totals.passed += r.numPassedTests
    totals.failed += r.numFailedTests
    totals.skipped += r.numPendingTests + r.numTodoTests
  }
}

const env = localEnv('test')
rmSync(env.dataDir, { recursive: true, force: true })
const testEnv = localEnv('test') // regenerates throwaway secrets
const settings = serverEnv(testEnv)
let services: RunningServices | undefined
let app: Awaited<ReturnType<typeof startApp>> | undefined

try {
  if (!only.length) {
    await step('lint', bin('eslint'), ['.'])
    await step('typecheck', bin('vue-tsc'), ['-b', '--noEmit'])
  }
  await vitest('unit')
  await vitest('components')
  if (!only.length || only.some(p => p === 'api' || p === 'browser')) {
    await buildIfNeeded()
    services = await startServices(testEnv)
    await migrate(settings.DATABASE_URL!)
    process.env.PULLSHEET_DEMO_STORIES = '0' // tests make their own stories
    await seed(settings.DATABASE_URL!)
    // One process unless PULLSHEET_PROCESSES says otherwise: some tests read one process's
    // counters (GET /api/admin/runtime); tests/api/zz-processes.test.ts runs two.
    const serverExtra = { MAIL_POLL_MS: '300', MAIL_RETRY_BASE_SECONDS: '1', TRUST_PROXY: '1', HOUSEKEEPING_DELAY_SECONDS: '2', HOUSEKEEPING_MINUTES: '0.05', PULLSHEET_PROCESSES: process.env.PULLSHEET_PROCESSES ?? '1' }
    app = await startApp(testEnv, serverExtra)
    const testVars = {
      ...settings,
      TEST_BASE_URL: testEnv.app.baseUrl,
      TEST_SERVER_EXTRA: JSON.stringify(serverExtra),
      NODE_ENV: 'test',
    }
    await vitest('api', testVars)
    await vitest('browser', testVars)
  }
}
catch (error) {
  failures.push((error as Error).message)
}
finally {
  if (app) await killGroup(app)
  await services?.stop()
}

console.log(`\n${failures.length ? `failed steps: ${failures.join(', ')}` : 'all steps passed'}`)
console.log(`tests: ${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ''}`)
process.exit(failures.length || totals.failed ? 1 : 0)
