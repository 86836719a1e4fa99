// Stops and starts the test services behind the app's back, for the fault drills.
// The storage and mail services run as their own processes (scripts/lib/services.ts);
// a restarted one is started the same way, detached, on the same port and data folder.
import { execFileSync } from 'node:child_process'
import { join } from 'node:path'
import { localEnv, ROOT } from '../../scripts/lib/env'
import { portOpen, sleep, startDetached, waitFor } from '../../scripts/lib/proc'

type Service = 'storage' | 'mail'

function settings(service: Service) {
  const env = localEnv('test')
  return service === 'storage'
    ? { port: env.s3.port, file: 's3-server.ts', vars: { S3_PORT: String(env.s3.port), S3_DATA_DIR: env.s3.dataDir, S3_BUCKET: env.s3.bucket } }
    : { port: env.smtp.port, file: 'mail-catcher.ts', vars: { SMTP_PORT: String(env.smtp.port), MAIL_DIR: env.smtp.mailDir } }
}

/** The pid of the process listening on the loopback port (ss shows it for our own processes). */
export function listenerPid(port: number): number | undefined {
  const out = execFileSync('ss', ['-Hltnp', `sport = :${port}`], { encoding: 'utf8' })
  const match = /pid=(\d+)/.exec(out)
  return match ? Number(match[1]) : undefined
}

export async function stopService(service: Service): Promise<void> {
  const { port } = settings(service)
  const pid = listenerPid(port)
  if (!pid) throw new Error(`${service}: nothing listens on port ${port}`)
  process.kill(pid, 'SIGKILL')
  const until = Date.now() + 10_000
  while (await portOpen(port)) {
    if (Date.now() > until) throw new Error(`${service} on port ${port} did not stop`)
    await sleep(100)
  }
}

export async function startService(service: Service): Promise<void> {
  const { port, file, vars } = settings(service)
  if (await portOpen(port)) return
  // scripts/test.ts stops only the processes it started, so a restarted service would
  // outlive the run (and serve a deleted data folder to the next one). A small shell
  // keeps it only while the main app server it serves is alive, then ends it.
  const appPid = listenerPid(localEnv('test').app.port)
  if (!appPid) throw new Error('the main app server is not running')
  const command = `${JSON.stringify(process.execPath)} --import tsx ${JSON.stringify(join(ROOT, 'scripts', 'services', file))}`
  const watchdog = `${command} & svc=$!; while kill -0 ${appPid} 2>/dev/null && kill -0 $svc 2>/dev/null; do sleep 1; done; kill $svc 2>/dev/null`
  const child = startDetached('sh', ['-c', watchdog], { cwd: ROOT, env: { ...process.env, ...vars }, stdio: 'ignore' })
  child.unref()
  await waitFor(`${service} on port ${port}`, () => portOpen(port))
}
