import type { Knex } from 'knex'

// A change counter per bench test, bumped in the same transaction as any change the
// live day view shows (pulls, inbox files, the plan). Every app server polls it for the
// bench tests its watchers follow, so no signal has to travel between servers.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('live_marks', (t) => {
    t.integer('bench_test_id').unsigned().primary().references('bench_tests.id')
    t.bigInteger('seq').unsigned().notNullable()
    t.timestamp('changed_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('live_marks')
}
