import type { Knex } from 'knex'

// The engine of a bench test, one sheet per test. Displacement is derived (not stored)
// so it can never disagree with bore, stroke and cylinders.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('build_sheets', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().unique().references('bench_tests.id')
    t.double('bore_in').notNullable()
    t.double('stroke_in').notNullable()
    t.integer('cylinders').unsigned().notNullable()
    t.double('compression_ratio').nullable()
    t.string('heads', 500).notNullable().defaultTo('')
    t.string('induction', 500).notNullable().defaultTo('')
    t.string('fuel', 200).notNullable().defaultTo('')
    t.string('ignition', 500).notNullable().defaultTo('')
    t.string('exhaust', 500).notNullable().defaultTo('')
    t.text('notes').notNullable().defaultTo('')
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('build_sheets')
}
