// The test stack as scripts/test.ts brings it up (fresh test data, services on the
// test ports, migrations, seed, the built server on 3010), for the load benchmark
// and for running a few test files: `npx tsx bench/load/stack.ts vitest run --project api tests/api/x.test.ts`.
import { rmSync } from 'node:fs'
import { join } from 'node:path'
import { startApp } from '../../scripts/lib/app'
import { buildIfNeeded } from '../../scripts/lib/build'
import { migrate, seed } from '../../scripts/lib/database'
import { localEnv, ROOT, serverEnv } from '../../scripts/lib/env'
import { killGroup, runInherit } from '../../scripts/lib/proc'
import { startServices } from '../../scripts/lib/services'

export const SERVER_EXTRA = { MAIL_POLL_MS: '300', MAIL_RETRY_BASE_SECONDS: '1', TRUST_PROXY: '1' }

export async function withTestStack<T>(work: (vars: Record<string, string>, appPid: number) => Promise<T>): Promise<T> {
  rmSync(localEnv('test').dataDir, { recursive: true, force: true })
  const testEnv = localEnv('test')
  const settings = serverEnv(testEnv)
  await buildIfNeeded()
  const services = await startServices(testEnv)
  let app: Awaited<ReturnType<typeof startApp>> | undefined
  try {
    await migrate(settings.DATABASE_URL!)
    await seed(settings.DATABASE_URL!)
    app = await startApp(testEnv, SERVER_EXTRA)
    const vars = { ...settings, TEST_BASE_URL: testEnv.app.baseUrl, TEST_SERVER_EXTRA: JSON.stringify(SERVER_EXTRA), NODE_ENV: 'test' }
    return await work(vars, app.pid!)
  }
  finally {
    if (app) await killGroup(app)
    await services.stop()
  }
}

if (import.meta.filename === process.argv[1]) {
  const [cmd, ...args] = process.argv.slice(2)
  if (!cmd) throw new Error('usage: tsx bench/load/stack.ts <command> [args...]')
  const code = await withTestStack(vars => runInherit(cmd === 'vitest' ? join(ROOT, 'node_modules', '.bin', 'vitest') : cmd, args, { cwd: ROOT, env: { ...process.env, ...vars } }))
  process.exit(code)
}
