import type { Knex } from 'knex'

// Housekeeping deletes the limiter's rows past every window (server/services/accounts/housekeeping.ts)
// by their time alone.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('login_failures', (t) => {
    t.index(['failed_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('login_failures', (t) => {
    t.dropIndex(['failed_at'])
  })
}
