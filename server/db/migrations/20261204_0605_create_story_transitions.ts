import type { Knex } from 'knex'

// The audit of every change of state: who (null for the publishing job), when,
// from, to and the note given. Rows are only ever added.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_transitions', (t) => {
    t.bigIncrements('id').primary()
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.string('action', 30).notNullable()
    t.string('from_state', 20).notNullable()
    t.string('to_state', 20).notNullable()
    t.integer('user_id').unsigned().nullable().references('users.id')
    t.text('note').notNullable()
    t.timestamp('scheduled_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['story_id', 'id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_transitions')
}
