import type { Knex } from 'knex'

// Failed sign-ins, kept in the database so the limit holds across app servers.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('login_failures', (t) => {
    t.bigIncrements('id').primary()
    t.string('email', 254).notNullable()
    t.string('ip', 64).notNullable()
    t.timestamp('failed_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['email', 'failed_at'])
    t.index(['ip', 'failed_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('login_failures')
}
