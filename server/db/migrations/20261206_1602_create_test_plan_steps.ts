import type { Knex } from 'knex'

// The ordered steps of a test plan, each bound to a setup (an existing one, or one the
// plan created). The checklist is a small JSON list of our own items, ticked on the day.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('test_plan_steps', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('test_plans.bench_test_id')
    t.integer('position').unsigned().notNullable()
    t.integer('setup_id').unsigned().notNullable().references('setups.id')
    t.string('parts_change', 500).notNullable().defaultTo('')
    t.integer('swap_minutes').unsigned().nullable()
    t.tinyint('planned_pulls').unsigned().notNullable()
    t.text('checklist', 'longtext').notNullable()
    t.timestamp('started_at', { precision: 3 }).nullable()
    t.timestamp('skipped_at', { precision: 3 }).nullable()
    t.index(['bench_test_id', 'position'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('test_plan_steps')
}
