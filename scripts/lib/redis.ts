// A private redis-server (Debian package) for the shared page cache: loopback only,
// nothing written to disk (a page cache is rebuilt by rendering), never the system service.
import type { ChildProcess } from 'node:child_process'
import { existsSync, mkdirSync } from 'node:fs'
import type { LocalEnv } from './env'
import { portOpen, startDetached, waitFor } from './proc'

const BINARY = '/usr/bin/redis-server'

/** Starts redis-server on the profile's port unless one answers there; returns the process it started. */
export async function startRedis(env: LocalEnv, port = env.redis.port): Promise<ChildProcess | undefined> {
  if (await portOpen(port)) {
    console.log(`redis: reusing what already listens on 127.0.0.1:${port}`)
    return undefined
  }
  if (!existsSync(BINARY)) {
    console.error('PAGE_CACHE=redis needs redis-server: run `sudo apt-get install -y redis-server` and try again.')
    process.exit(1)
  }
  mkdirSync(env.redis.dataDir, { recursive: true })
  const child = startDetached(BINARY, ['--bind', '127.0.0.1', '--port', String(port), '--save', '', '--appendonly', 'no', '--dir', env.redis.dataDir, '--maxmemory', '256mb', '--maxmemory-policy', 'allkeys-lru'], { stdio: ['ignore', 'ignore', 'inherit'] })
  await waitFor(`redis on port ${port}`, () => portOpen(port))
  console.log(`redis: started on 127.0.0.1:${port} (shared page cache)`)
  return child
}
