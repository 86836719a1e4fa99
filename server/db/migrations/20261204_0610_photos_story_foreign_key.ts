import type { Knex } from 'knex'

// photos.story_id came before the stories table (issue 5); its key is added now.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('photos', (t) => {
    t.foreign('story_id').references('stories.id').onDelete('SET NULL')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('photos', (t) => {
    t.dropForeign(['story_id'])
  })
}
