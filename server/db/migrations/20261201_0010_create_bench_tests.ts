import type { Knex } from 'knex'

// One test programme on one engine. Ids of engine family and part type come from
// shared/types/catalog.ts (validated there, stored as plain strings here).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bench_tests', (t) => {
    t.increments('id').primary()
    t.string('slug', 120).notNullable().unique()
    t.string('title', 200).notNullable()
    t.string('engine_family', 40).notNullable()
    t.string('part_type', 40).notNullable()
    t.string('shop', 200).notNullable().defaultTo('')
    t.string('dyno', 200).notNullable().defaultTo('')
    t.date('tested_from').nullable()
    t.date('tested_to').nullable()
    t.text('notes').notNullable().defaultTo('')
    t.integer('owner_id').unsigned().notNullable().references('users.id')
    t.string('default_standard', 20).notNullable().defaultTo('sae-j1349-1990')
    // Every save names the version it read; a stale one is refused (409), never overwritten.
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.timestamp('deleted_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
    t.index(['owner_id', 'deleted_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('bench_tests')
}
