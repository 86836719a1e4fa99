// A private MariaDB instance with its data under the project: never the system service.
import { existsSync, mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { run, sleep, waitFor } from './proc'
import type { LocalEnv } from './env'

const BIN_DIRS = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin']

function findBinary(name: string): string | undefined {
  for (const dir of BIN_DIRS) {
    const path = join(dir, name)
    if (existsSync(path)) return path
  }
  return undefined
}

export function mariadbBinaries() {
  const server = findBinary('mariadbd')
  const installDb = findBinary('mariadb-install-db')
  const admin = findBinary('mariadb-admin')
  const client = findBinary('mariadb')
  if (!server || !installDb || !admin || !client) {
    console.error('MariaDB is not installed: run `sudo apt-get install -y mariadb-server` and try again.')
    process.exit(1)
  }
  return { server, installDb, admin, client }
}

export async function mariadbAlive(db: LocalEnv['db']): Promise<boolean> {
  const { admin } = mariadbBinaries()
  try {
    await run(admin, ['--no-defaults', `--socket=${db.socket}`, '-uroot', '--connect-timeout=2', 'ping'], { quiet: true })
    return true
  }
  catch { return false }
}

/** Starts the instance unless it already runs; returns true when this call started it. */
export async function startMariadb(db: LocalEnv['db']): Promise<boolean> {
  const bin = mariadbBinaries()
  if (await mariadbAlive(db)) return false
  if (!existsSync(join(db.dataDir, 'mysql'))) {
    mkdirSync(db.dataDir, { recursive: true })
    await run(bin.installDb, ['--no-defaults', `--datadir=${db.dataDir}`, '--user=root',
      '--auth-root-authentication-method=socket', '--skip-test-db'], { quiet: true })
  }
  const { spawn } = await import('node:child_process')
  const child = spawn(bin.server, [
    '--no-defaults', `--datadir=${db.dataDir}`, `--socket=${db.socket}`,
    `--pid-file=${join(db.dataDir, 'mariadbd.pid')}`, `--port=${db.port}`,
    '--bind-address=127.0.0.1', '--user=root', '--skip-name-resolve',
    `--log-error=${join(db.dataDir, 'error.log')}`,
    '--character-set-server=utf8mb4', '--collation-server=utf8mb4_unicode_ci',
    '--innodb-buffer-pool-size=128M', '--max-connections=300',
  ], { detached: true, stdio: 'ignore' })
  child.unref()
  await waitFor(`MariaDB on port ${db.port} (log: ${join(db.dataDir, 'error.log')})`, () => mariadbAlive(db), 60_000)
  await ensureAppDatabase(db)
  return true
}

async function ensureAppDatabase(db: LocalEnv['db']): Promise<void> {
  const { client } = mariadbBinaries()
  const sql = `
    CREATE DATABASE IF NOT EXISTS \`${db.name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    CREATE USER IF NOT EXISTS '${db.user}'@'127.0.0.1' IDENTIFIED BY '${db.password}';
    ALTER USER '${db.user}'@'127.0.0.1' IDENTIFIED BY '${db.password}';
    GRANT ALL PRIVILEGES ON \`${db.name}\`.* TO '${db.user}'@'127.0.0.1';
    FLUSH PRIVILEGES;`
  await run(client, ['--no-defaults', `--socket=${db.socket}`, '-uroot'], { input: sql, quiet: true })
}

export async function stopMariadb(db: LocalEnv['db']): Promise<void> {
  const { admin } = mariadbBinaries()
  if (!(await mariadbAlive(db))) return
  await run(admin, ['--no-defaults', `--socket=${db.socket}`, '-uroot', 'shutdown'], { quiet: true })
  for (let i = 0; i < 100 && existsSync(join(db.dataDir, 'mariadbd.pid')); i++) await sleep(100)
}
