import type { Knex } from 'knex'

// Idle speed and manifold vacuum measured per setup (drivability; brake booster vacuum).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('idle_checks', (t) => {
    t.increments('id').primary()
    t.integer('setup_id').unsigned().notNullable().references('setups.id')
    t.integer('idle_rpm').unsigned().notNullable()
    t.double('vacuum_inhg').notNullable()
    t.string('note', 500).notNullable().defaultTo('')
    t.integer('created_by').unsigned().nullable().references('users.id')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['setup_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('idle_checks')
}
