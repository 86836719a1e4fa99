import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary()
    // utf8mb4_unicode_ci compares case-insensitively, so the unique key is too.
    t.string('email', 254).notNullable().unique()
    t.string('display_name', 120).notNullable()
    t.enum('role', ['reader', 'writer', 'editor', 'admin']).notNullable().defaultTo('reader')
    t.string('password_hash', 255).nullable()
    t.boolean('disabled').notNullable().defaultTo(false)
    t.integer('session_version').unsigned().notNullable().defaultTo(1)
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users')
}
