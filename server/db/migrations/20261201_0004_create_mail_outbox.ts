import type { Knex } from 'knex'

// Mail is written here inside the transaction of the change that causes it and
// sent later by a worker, so a mail server that is down never blocks the change.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.bigIncrements('id').primary()
    t.string('to_address', 254).notNullable()
    t.string('subject', 300).notNullable()
    t.text('body_text', 'mediumtext').notNullable()
    t.text('body_html', 'mediumtext').nullable()
    t.enum('status', ['pending', 'sent', 'failed']).notNullable().defaultTo('pending')
    t.integer('attempts').unsigned().notNullable().defaultTo(0)
    t.timestamp('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.string('last_error', 500).nullable()
    t.timestamp('sent_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.raw('CURRENT_TIMESTAMP(3)'))
    t.index(['status', 'next_attempt_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_outbox')
}
