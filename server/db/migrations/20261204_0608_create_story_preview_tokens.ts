import type { Knex } from 'knex'

// Preview links for a story before it goes live. Only the SHA-256 of the token is
// stored; publishing the story revokes them all.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_preview_tokens', (t) => {
    t.increments('id').primary()
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.specificType('token_hash', 'CHAR(64)').notNullable().unique()
    t.string('label', 120).notNullable().defaultTo('')
    t.integer('created_by').unsigned().notNullable().references('users.id')
    t.timestamp('expires_at', { precision: 3 }).notNullable()
    t.timestamp('revoked_at', { precision: 3 }).nullable()
    t.timestamp('last_used_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['story_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_preview_tokens')
}
