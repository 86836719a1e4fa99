import type { Knex } from 'knex'

// Who has a story open in the editor: one row per story, refreshed by a heartbeat.
// Soft: it tells others, it never blocks a save (the version check does that).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_locks', (t) => {
    t.integer('story_id').unsigned().primary().references('stories.id').onDelete('CASCADE')
    t.integer('user_id').unsigned().notNullable().references('users.id')
    t.timestamp('since', { precision: 3 }).notNullable()
    t.timestamp('heartbeat_at', { precision: 3 }).notNullable()
    t.timestamp('expires_at', { precision: 3 }).notNullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_locks')
}
