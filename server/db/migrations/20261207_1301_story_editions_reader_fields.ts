import type { Knex } from 'knex'

// What readers see of a story outside its page is frozen with the edition too: the
// search title and description (the page's <title> and description) and the hero
// photo (the story's card in lists). Null on editions frozen before this: readers
// then get the story row's, as before.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('story_editions', (t) => {
    t.string('search_title', 120).nullable()
    t.string('search_description', 320).nullable()
    t.integer('hero_photo_id').unsigned().nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('story_editions', (t) => {
    t.dropColumn('search_title')
    t.dropColumn('search_description')
    t.dropColumn('hero_photo_id')
  })
}
