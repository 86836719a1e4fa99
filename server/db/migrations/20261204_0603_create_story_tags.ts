import type { Knex } from 'knex'

// Tags as rows, so readers can browse by tag with an index (issue 7).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_tags', (t) => {
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.string('tag', 40).notNullable()
    t.integer('position').unsigned().notNullable().defaultTo(0)
    t.primary(['story_id', 'tag'])
    t.index(['tag'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_tags')
}
