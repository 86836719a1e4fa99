import type { Knex } from 'knex'

// A story's editions: what an editor approved, frozen. The data its figures are drawn
// from (the setups it uses with their pulls, points and weather, the build sheet,
// the photos, the standard and rounding) as canonical JSON with its sha256, and the
// approved text. Rows are never updated except to mark when one went live.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('story_editions', (t) => {
    t.increments('id').primary()
    t.integer('story_id').unsigned().notNullable().references('stories.id').onDelete('CASCADE')
    t.integer('number').unsigned().notNullable()
    t.specificType('content_hash', 'CHAR(64)').notNullable()
    t.specificType('data', 'LONGTEXT').notNullable()
    t.string('headline', 300).notNullable()
    t.text('deck').notNullable()
    t.specificType('body', 'MEDIUMTEXT').notNullable()
    t.integer('approved_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('approved_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('published_at', { precision: 3 }).nullable()
    t.text('correction_note').notNullable()
    t.unique(['story_id', 'number'])
    t.index(['story_id', 'published_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('story_editions')
}
