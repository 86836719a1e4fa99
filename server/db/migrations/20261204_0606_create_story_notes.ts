import type { Knex } from 'knex'

// Notes between the desk and the writers, threaded one level: a reply points at
// the first note of its thread, and the thread is resolved on that first note.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_notes', (t) => {
    t.bigIncrements('id').primary()
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.bigInteger('parent_id').unsigned().nullable().references('story_notes.id').onDelete('CASCADE')
    t.integer('author_id').unsigned().notNullable().references('users.id')
    t.text('body').notNullable()
    t.string('anchor', 500).notNullable().defaultTo('')
    t.boolean('resolved').notNullable().defaultTo(false)
    t.integer('resolved_by').unsigned().nullable().references('users.id')
    t.timestamp('resolved_at', { precision: 3 }).nullable()
    t.timestamp('edited_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['story_id', 'parent_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_notes')
}
