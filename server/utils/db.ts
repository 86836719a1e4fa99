import knex, { type Knex } from 'knex'
import { knexConfig } from '../db/knex-config'
import { appConfig } from './config'

/** A connection a service reads or writes through: the pool or a transaction. */
export type Db = Knex | Knex.Transaction

// One pool per process; created on first use so a build or a test can import this file freely.
let pool: Knex | undefined

export function useDb(): Knex {
  pool ??= knex(knexConfig(appConfig().databaseUrl))
  return pool
}

export async function closeDb(): Promise<void> {
  await pool?.destroy()
  pool = undefined
}
