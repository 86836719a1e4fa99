import type { Knex } from 'knex'

// What a reader with an account asked the graphs to remember: units and the
// correction standard. One row per user; no row means the site's defaults.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('user_preferences', (t) => {
    t.integer('user_id').unsigned().primary().references('users.id').onDelete('CASCADE')
    t.string('units', 20).nullable()
    t.string('correction_standard', 40).nullable()
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_preferences')
}
