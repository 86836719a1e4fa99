import type { Knex } from 'knex'

// The magazine's own settings (time zone, print column widths...), one row per key so a
// new setting needs no migration. The value is JSON checked by SiteSettingsSchema on the
// way in and out; a missing row means the default in shared/types/site-settings.ts.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('site_settings', (t) => {
    t.string('key', 64).primary()
    t.text('value').notNullable()
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('site_settings')
}
