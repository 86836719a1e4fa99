import type { Knex } from 'knex'
import { join } from 'node:path'

/** One place that turns DATABASE_URL into Knex settings, for the server and the scripts. */
export function knexConfig(databaseUrl: string, migrationsDir?: string): Knex.Config {
  if (!databaseUrl) throw new Error('DATABASE_URL is not set')
  const url = new URL(databaseUrl)
  return {
    client: 'mysql2',
    connection: {
      host: url.hostname,
      port: Number(url.port || 3306),
      user: decodeURIComponent(url.username),
      password: decodeURIComponent(url.password),
      database: url.pathname.replace(/^\//, ''),
      charset: 'utf8mb4',
      timezone: 'Z',
      dateStrings: false,
      supportBigNumbers: true,
      connectTimeout: 5000,
    },
    pool: { min: 0, max: Number(process.env.DB_POOL_MAX ?? 10), acquireTimeoutMillis: 8000 },
    acquireConnectionTimeout: 8000,
    migrations: migrationsDir
      ? { directory: migrationsDir, loadExtensions: ['.ts'], tableName: 'knex_migrations' }
      : undefined,
    seeds: migrationsDir ? { directory: join(migrationsDir, '..', 'seeds'), loadExtensions: ['.ts'] } : undefined,
  }
}
