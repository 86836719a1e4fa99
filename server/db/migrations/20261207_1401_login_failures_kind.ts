import type { Knex } from 'knex'

// The sign-in limiter's table now counts every kind of account attempt (sign-in,
// registration, reset request, reset confirmation): one limiter, one table, a kind each.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('login_failures', (t) => {
    t.string('kind', 20).notNullable().defaultTo('login')
    t.index(['kind', 'email', 'failed_at'])
    t.index(['kind', 'ip', 'failed_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('login_failures', (t) => {
    t.dropIndex(['kind', 'email', 'failed_at'])
    t.dropIndex(['kind', 'ip', 'failed_at'])
    t.dropColumn('kind')
  })
}
