import type { Knex } from 'knex'

// Photos of a bench test: the parts and the install. The original is kept
// privately in S3 under a generated prefix (never the file's name); web sizes are
// made by a job (kind 'photo.process') and listed in `variants` as JSON text.
//
// Stories come later (issue 6). A story uses the photos of its own bench test, so
// a photo belongs to at most one story: a nullable story_id column, without a
// foreign key until the stories table exists (issue 6 adds the key in its own
// migration). "Public" means linked to a published story.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('photos', (t) => {
    t.increments('id').primary()
    t.integer('bench_test_id').unsigned().notNullable().references('bench_tests.id').onDelete('CASCADE')
    t.integer('story_id').unsigned().nullable()
    t.enum('status', ['pending', 'processing', 'ready', 'failed']).notNullable().defaultTo('pending')
    t.string('failure_reason', 500).nullable()
    // Every S3 key of this photo starts with it: photos/<bench test>/<random id>.
    t.string('storage_prefix', 120).notNullable().unique()
    t.string('original_key', 160).notNullable()
    t.string('mime', 20).notNullable()
    t.string('original_name', 200).notNullable().defaultTo('')
    t.integer('bytes').unsigned().notNullable()
    t.string('sha256', 64).notNullable()
    // From the header at upload; replaced by the displayed size (orientation applied) when ready.
    t.integer('width').unsigned().notNullable()
    t.integer('height').unsigned().notNullable()
    t.tinyint('orientation').unsigned().notNullable().defaultTo(1)
    t.text('variants', 'longtext').nullable()
    t.text('caption').notNullable().defaultTo('')
    t.string('credit', 200).notNullable().defaultTo('')
    t.string('alt_text', 400).notNullable().defaultTo('')
    t.integer('position').unsigned().notNullable().defaultTo(0)
    t.boolean('is_hero').notNullable().defaultTo(false)
    // Covers the editable fields only; processing does not bump it, so an edit made
    // while a photo is being sized is not refused as stale.
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.integer('uploaded_by').unsigned().notNullable().references('users.id')
    t.timestamp('processed_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)'))
    // The same file uploaded twice to one bench test is found, also in a race.
    t.unique(['bench_test_id', 'sha256'])
    t.index(['bench_test_id', 'position'])
    t.index(['story_id'])
    t.index(['status'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('photos')
}
