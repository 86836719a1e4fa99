import type { Knex } from 'knex'

// The photos a story uses (hero, ::photo, ::gallery), rewritten on every save. A
// photo may serve more than one story of its bench test; it is public while any
// story using it is published (photoInPublishedStory in server/services/stories/photos.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_photos', (t) => {
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.integer('photo_id').unsigned().notNullable().references('photos.id').onDelete('CASCADE')
    t.primary(['story_id', 'photo_id'])
    t.index(['photo_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_photos')
}
