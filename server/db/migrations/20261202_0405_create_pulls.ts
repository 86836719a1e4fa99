import type { Knex } from 'knex'

// One pull: the original file as uploaded, its weather, and the parsed observed points
// as one JSON document (measured: 2.5x faster to fetch and 5x faster to insert than a
// row per point). bench_test_id is repeated from the setup so ownership checks and
// listings need no join.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('pulls', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id')
    t.integer('setup_id').unsigned().notNullable().references('setups.id')
    t.string('file_name', 255).notNullable()
    t.text('original_text', 'mediumtext').notNullable()
    t.integer('original_bytes').unsigned().notNullable()
    t.integer('uploaded_by_user_id').unsigned().nullable().references('users.id')
    t.integer('operator_link_id').unsigned().nullable().references('operator_links.id')
    t.timestamp('uploaded_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.double('baro_inhg').nullable()
    t.double('air_temp_f').nullable()
    t.double('humidity_pct').nullable()
    t.boolean('dyno_corrected').notNullable().defaultTo(false)
    t.boolean('included').notNullable().defaultTo(true)
    t.string('exclusion_reason', 500).notNullable().defaultTo('')
    t.text('problems', 'longtext').notNullable()
    t.text('points', 'longtext').notNullable()
    t.text('column_mapping', 'longtext').nullable()
    t.string('torque_unit', 8).nullable()
    t.string('power_unit', 8).nullable()
    t.string('vacuum_unit', 8).nullable()
    t.integer('row_count').unsigned().notNullable()
    t.integer('point_count').unsigned().notNullable()
    t.double('rpm_from').notNullable()
    t.double('rpm_to').notNullable()
    t.double('peak_power_hp').notNullable()
    t.double('peak_power_rpm').notNullable()
    t.double('peak_torque_lbft').notNullable()
    t.double('peak_torque_rpm').notNullable()
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
    t.index(['bench_test_id', 'setup_id'])
    t.index(['setup_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('pulls')
}
