import type { Knex } from 'knex';

// E-mail goes through an outbox so that an unreachable mail server delays mail
// and loses none: a row is written with the change that causes it, and the
// worker delivers it, retrying with back-off.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox_emails', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('kind').notNullable();
    t.uuid('user_id').references('users.id').onDelete('SET NULL');
    t.text('to_address').notNullable();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('html_body').notNullable();
    t.jsonb('headers').notNullable().defaultTo('{}');
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('last_error');
    t.timestamp('sent_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw('CREATE INDEX outbox_emails_due_idx ON outbox_emails (next_attempt_at) WHERE sent_at IS NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('outbox_emails');
}
