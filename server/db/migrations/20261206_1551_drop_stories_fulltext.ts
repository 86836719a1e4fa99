import type { Knex } from 'knex'

// The readers' search moved to story_search_terms (20261206_1550); the FULLTEXT
// index has no reader left and only slowed every story save.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE stories DROP INDEX stories_text')
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE stories ADD FULLTEXT INDEX stories_text (headline, deck, body)')
}
