import knex from 'knex'
import { join } from 'node:path'
import { knexConfig } from '../../server/db/knex-config'
import { ROOT } from './env'

const MIGRATIONS = join(ROOT, 'server', 'db', 'migrations')

export function scriptDb(databaseUrl: string) {
  return knex(knexConfig(databaseUrl, MIGRATIONS))
}

export async function migrate(databaseUrl: string): Promise<void> {
  const db = scriptDb(databaseUrl)
  try {
    const [, applied] = await db.migrate.latest()
    if (applied.length) console.log(`database: applied ${applied.length} migration(s)`)
  }
  finally { await db.destroy() }
}

/** Seeds the demo only into an empty database (no users yet). */
export async function seedIfEmpty(databaseUrl: string): Promise<boolean> {
  const db = scriptDb(databaseUrl)
  try {
    const row = await db('users').count({ n: '*' }).first()
    if (Number(row?.n ?? 0) > 0) return false
    await db.seed.run()
    return true
  }
  finally { await db.destroy() }
}

export async function seed(databaseUrl: string): Promise<void> {
  const db = scriptDb(databaseUrl)
  try { await db.seed.run() }
  finally { await db.destroy() }
}

export async function reset(databaseUrl: string): Promise<void> {
  const db = scriptDb(databaseUrl)
  try {
    const name = db.client.config.connection.database as string
    await db.raw('DROP DATABASE IF EXISTS ??', [name])
    await db.raw('CREATE DATABASE ?? CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci', [name])
  }
  finally { await db.destroy() }
  await migrate(databaseUrl)
  await seed(databaseUrl)
}
