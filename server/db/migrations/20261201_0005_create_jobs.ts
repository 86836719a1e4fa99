import type { Knex } from 'knex'

// Background work (photo processing, scheduled publishing) as rows, claimed with
// SELECT ... FOR UPDATE SKIP LOCKED and a lease, so several app servers share it
// and work left by a crashed process is taken up again when its lease runs out.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jobs', (t) => {
    t.bigIncrements('id').primary()
    t.string('kind', 40).notNullable()
    t.text('payload', 'longtext').notNullable()
    t.enum('status', ['pending', 'running', 'done', 'failed']).notNullable().defaultTo('pending')
    t.timestamp('run_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('lease_until', { precision: 3 }).nullable()
    t.integer('attempts').unsigned().notNullable().defaultTo(0)
    t.integer('max_attempts').unsigned().notNullable().defaultTo(3)
    t.string('last_error', 1000).nullable()
    t.timestamp('finished_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['status', 'run_at'])
    t.index(['kind', 'status'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('jobs')
}
