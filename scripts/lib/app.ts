import type { ChildProcess } from 'node:child_process'
import { join } from 'node:path'
import type { LocalEnv } from './env'
import { ROOT, serverEnv } from './env'
import { portOpen, startDetached, waitFor } from './proc'

/**
 * Runs the built server (.output) with the local services' settings, through
 * server/cluster.mjs: PULLSHEET_PROCESSES (from `extra`, else the environment, else 1)
 * processes sharing the port; with one it is the plain server in one process.
 */
export async function startApp(env: LocalEnv, extra: Record<string, string> = {}, port = env.app.port): Promise<ChildProcess> {
  if (await portOpen(port, env.app.host)) throw new Error(`Port ${port} is already in use: set PORT to another one.`)
  // APP_NODE_ARGS: flags for the server's own Node (e.g. --cpu-prof), which NODE_OPTIONS refuses.
  const nodeArgs = process.env.APP_NODE_ARGS?.split(/\s+/).filter(Boolean) ?? []
  const child = startDetached(process.execPath, [...nodeArgs, join(ROOT, '.output', 'server', 'cluster.mjs')], {
    cwd: ROOT,
    env: {
      ...process.env,
      ...serverEnv(env),
      PORT: String(port),
      NITRO_PORT: String(port),
      NODE_OPTIONS: [process.env.NODE_OPTIONS, '--max-semi-space-size=64'].filter(Boolean).join(' '),
      PULLSHEET_PROCESSES: process.env.PULLSHEET_PROCESSES ?? '1',
      ...extra,
    },
  })
  await waitFor(`the app on port ${port}`, () => portOpen(port, env.app.host), 60_000)
  return child
}
