import type { Knex } from 'knex'

// The content of a story at a point in time (JSON of StoryContent). State-change
// revisions are kept for ever; of the others the newest 50 (pruned on insert).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_revisions', (t) => {
    t.bigIncrements('id').primary()
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.enum('kind', ['created', 'save', 'autosave', 'state', 'restore']).notNullable()
    t.integer('story_version').unsigned().notNullable()
    t.string('state', 20).notNullable()
    t.integer('author_id').unsigned().nullable().references('users.id')
    t.string('note', 300).notNullable().defaultTo('')
    t.text('content', 'longtext').notNullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['story_id', 'id'])
    t.index(['story_id', 'kind'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_revisions')
}
