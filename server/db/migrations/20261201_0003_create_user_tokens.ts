import type { Knex } from 'knex'

// One-time tokens sent by e-mail (invitations, password resets); only a hash is stored.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('user_tokens', (t) => {
    t.increments('id').primary()
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE')
    t.enum('purpose', ['invite', 'reset']).notNullable()
    t.string('token_hash', 64).notNullable().unique()
    t.timestamp('expires_at', { precision: 3 }).notNullable()
    t.timestamp('used_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_tokens')
}
