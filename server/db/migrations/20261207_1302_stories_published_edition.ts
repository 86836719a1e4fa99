import type { Knex } from 'knex'

// The edition readers see, named on the story row, so the lists, search and feeds
// join it by key instead of looking for the newest published edition of each story.
// Set whenever an edition goes live (server/services/stories/editions.ts). No foreign key: the
// editions already cascade from their story, and a key back would make deleting a story a
// cascade that returns to the row being deleted; editions are never deleted on their own.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('stories', (t) => {
    t.integer('published_edition_id').unsigned().nullable()
  })
  await knex.raw(`UPDATE stories s SET s.published_edition_id = (
    SELECT e.id FROM story_editions e WHERE e.story_id = s.id AND e.published_at IS NOT NULL ORDER BY e.number DESC LIMIT 1)`)
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('stories', (t) => {
    t.dropColumn('published_edition_id')
  })
}
