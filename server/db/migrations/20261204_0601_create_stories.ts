import type { Knex } from 'knex'

// Stories written around a bench test's data. The state machine lives in
// shared/types/story-workflow.ts; the columns here only hold where a story is.
// FULLTEXT over headline, deck and body is for the readers' search (issue 7).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('stories', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id')
    t.string('slug', 120).notNullable().unique()
    t.string('headline', 200).notNullable()
    t.text('deck').notNullable()
    t.text('body', 'mediumtext').notNullable()
    t.integer('hero_photo_id').unsigned().nullable().references('photos.id').onDelete('SET NULL')
    t.string('engine_family', 40).notNullable()
    t.string('part_type', 40).notNullable()
    t.string('search_title', 120).notNullable().defaultTo('')
    t.string('search_description', 320).notNullable().defaultTo('')
    t.enum('state', ['draft', 'in_review', 'changes_requested', 'approved', 'scheduled', 'published', 'withdrawn']).notNullable().defaultTo('draft')
    t.timestamp('state_changed_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('scheduled_at', { precision: 3 }).nullable()
    t.timestamp('published_at', { precision: 3 }).nullable()
    // Every save names the version it read; a stale one is refused (409), never overwritten.
    t.integer('version').unsigned().notNullable().defaultTo(1)
    // Approval needs an editor to have opened the number check for the version approved.
    t.integer('number_check_seen_version').unsigned().nullable()
    t.integer('created_by').unsigned().notNullable().references('users.id')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
    t.index(['state', 'state_changed_at'])
    t.index(['state', 'published_at'])
    t.index(['bench_test_id'])
  })
  await knex.raw('ALTER TABLE stories ADD FULLTEXT INDEX stories_text (headline, deck, body)')
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('stories')
}
