import type { Knex } from 'knex'

// One test plan per bench test: the acceptance window for a valid pull and the state of
// the dyno day (which step is current, when the day started). The steps are their own
// rows (next migration) so a tick on the day changes one row, not the whole plan.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('test_plans', (t) => {
    t.integer('bench_test_id').unsigned().primary().references('bench_tests.id')
    t.text('acceptance', 'longtext').notNullable()
    t.text('notes').notNullable()
    t.integer('current_step_id').unsigned().nullable()
    t.timestamp('day_started_at', { precision: 3 }).nullable()
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.integer('updated_by').unsigned().nullable().references('users.id')
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('test_plans')
}
