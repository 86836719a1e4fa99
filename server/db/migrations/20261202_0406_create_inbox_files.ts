import type { Knex } from 'knex'

// Files dropped through an operator link, waiting for the writer to assign them to a
// setup. Kept as bytes (it may not even be text); the preview is the parser's verdict
// at arrival, so the inbox lists without re-parsing.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('inbox_files', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id')
    t.integer('operator_link_id').unsigned().notNullable().references('operator_links.id')
    t.string('file_name', 255).notNullable()
    t.specificType('content', 'MEDIUMBLOB').notNullable()
    t.integer('size_bytes').unsigned().notNullable()
    t.text('preview', 'longtext').notNullable()
    t.boolean('ok').notNullable()
    t.enum('state', ['waiting', 'assigned', 'dismissed']).notNullable().defaultTo('waiting')
    t.integer('pull_id').unsigned().nullable().references('pulls.id')
    t.integer('handled_by').unsigned().nullable().references('users.id')
    t.timestamp('handled_at', { precision: 3 }).nullable()
    t.timestamp('received_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['bench_test_id', 'state'])
    // The rate limit counts a link's recent files.
    t.index(['operator_link_id', 'received_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('inbox_files')
}
