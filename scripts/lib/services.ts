import type { ChildProcess } from 'node:child_process'
import { join } from 'node:path'
import type { LocalEnv } from './env'
import { ROOT } from './env'
import { startMariadb, stopMariadb } from './mariadb'
import { startRedis } from './redis'
import { killGroup, portOpen, startDetached, waitFor } from './proc'

export interface RunningServices { stop: () => Promise<void> }

/** Starts a TypeScript service file as its own process group, unless its port already answers. */
async function ensureTsService(name: string, file: string, port: number, env: Record<string, string>): Promise<ChildProcess | undefined> {
  if (await portOpen(port)) {
    console.log(`${name}: reusing what already listens on 127.0.0.1:${port}`)
    return undefined
  }
  const child = startDetached(process.execPath, ['--import', 'tsx', join(ROOT, 'scripts', 'services', file)], {
    cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'inherit', 'inherit'],
  })
  await waitFor(`${name} on port ${port}`, () => portOpen(port))
  return child
}

/** MariaDB, storage and mail; each is reused when already running and only what we started is stopped. */
export async function startServices(env: LocalEnv): Promise<RunningServices> {
  const startedDb = await startMariadb(env.db)
  console.log(`database: MariaDB on 127.0.0.1:${env.db.port} (${startedDb ? 'started' : 'reused'}), data in ${env.db.dataDir}`)
  const s3 = await ensureTsService('storage', 's3-server.ts', env.s3.port, {
    S3_PORT: String(env.s3.port), S3_DATA_DIR: env.s3.dataDir, S3_BUCKET: env.s3.bucket,
  })
  const mail = await ensureTsService('mail', 'mail-catcher.ts', env.smtp.port, {
    SMTP_PORT: String(env.smtp.port), MAIL_DIR: env.smtp.mailDir,
  })
  // PAGE_CACHE=redis: the page cache shared by app servers, in a private redis-server.
  const redis = process.env.PAGE_CACHE === 'redis' ? await startRedis(env) : undefined
  return {
    async stop() {
      if (redis) await killGroup(redis)
      if (mail) await killGroup(mail)
      if (s3) await killGroup(s3)
      if (startedDb) await stopMariadb(env.db)
    },
  }
}
