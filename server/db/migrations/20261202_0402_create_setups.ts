import type { Knex } from 'knex'

// Setups of a bench test in order; the parts that differ are typed specs stored as
// JSON (validated by PartSpecSchema in shared/types/workspace.ts before they get here).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('setups', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id')
    t.integer('position').unsigned().notNullable()
    t.boolean('is_baseline').notNullable().defaultTo(false)
    t.string('label', 120).notNullable()
    t.text('description').notNullable().defaultTo('')
    t.text('parts', 'longtext').notNullable()
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.timestamp('deleted_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
    t.index(['bench_test_id', 'deleted_at', 'position'])
  })
  // At most one live baseline per bench test, whatever a buggy or racing request does:
  // the marker is 1 only for the live baseline and NULL otherwise (NULLs never collide).
  await knex.raw(`ALTER TABLE setups
    ADD COLUMN baseline_marker TINYINT AS (IF(is_baseline = 1 AND deleted_at IS NULL, 1, NULL)) PERSISTENT,
    ADD UNIQUE INDEX setups_one_baseline (bench_test_id, baseline_marker)`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('setups')
}
