import knex, { type Knex } from 'knex'
import { knexConfig } from '../../server/db/knex-config'

let db: Knex | undefined

/** Direct database access for tests that arrange or check rows (the same MariaDB the server uses). */
export function testDb(): Knex {
  db ??= knex(knexConfig(process.env.DATABASE_URL!))
  return db
}

export async function closeTestDb(): Promise<void> {
  await db?.destroy()
  db = undefined
}
