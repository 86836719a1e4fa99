import type { Knex } from 'knex'

// One or more writers per story, in byline order. Being a byline is what gives a
// writer the story (ownership in the WHERE, as with bench tests).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_bylines', (t) => {
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.integer('user_id').unsigned().notNullable().references('users.id')
    t.integer('position').unsigned().notNullable().defaultTo(0)
    t.primary(['story_id', 'user_id'])
    t.index(['user_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_bylines')
}
