import type { Knex } from 'knex'

// Upload links for the dyno operator. Only the SHA-256 of the token is stored, so a
// database leak does not hand out working links.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('operator_links', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id')
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique()
    t.string('label', 120).notNullable().defaultTo('')
    t.integer('created_by').unsigned().notNullable().references('users.id')
    t.timestamp('expires_at', { precision: 3 }).notNullable()
    t.timestamp('revoked_at', { precision: 3 }).nullable()
    t.integer('max_files').unsigned().notNullable()
    t.integer('max_file_bytes').unsigned().notNullable()
    t.integer('files_received').unsigned().notNullable().defaultTo(0)
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['bench_test_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('operator_links')
}
