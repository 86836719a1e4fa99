import type { Knex } from 'knex'

// The readers' search index: each published story's words with a weight for where
// they stand (headline, part type/engine family/tags, deck, body). A FULLTEXT index
// drops short words and stop words ("V8", "5.7", "350", "and"); a plain index on the
// token answers "starts with" for any of them. story_search_docs says which version
// of the story the tokens were taken from, so the index can be caught up by comparing
// versions (server/services/magazine/search.ts), whoever wrote the story.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_search_docs', (t) => {
    t.integer('story_id').unsigned().primary().references('stories.id').onDelete('CASCADE')
    t.integer('story_version').unsigned().notNullable()
    t.timestamp('indexed_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
  })
  await knex.schema.createTable('story_search_terms', (t) => {
    // Tokens are lower-cased and stripped of accents before they are stored; a binary
    // collation keeps distinct tokens distinct ("strasse" and "straße" under unicode_ci).
    t.string('token', 48).notNullable().collate('utf8mb4_bin')
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.tinyint('weight').unsigned().notNullable()
    t.primary(['token', 'story_id'])
    t.index(['story_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_search_terms')
  await knex.schema.dropTable('story_search_docs')
}
