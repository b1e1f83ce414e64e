import type { Knex } from 'knex';

// Riders and carers: pre/post-ride checks, each client's baseline blood
// pressure, distance goals, e-mail preferences with an unsubscribe token, and
// a key on outbox mail so that one reminder, digest or alert is never queued twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clients', (t) => {
    t.integer('baseline_systolic');
  });

  await knex.schema.createTable('checks', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('recorded_by').notNullable().references('users.id');
    t.timestamp('taken_at', { useTz: true }).notNullable();
    t.uuid('ride_id').references('rides.id').onDelete('SET NULL');
    t.integer('bp_before_systolic');
    t.integer('bp_before_diastolic');
    t.integer('bp_during_systolic');
    t.integer('bp_during_diastolic');
    t.integer('bp_after_systolic');
    t.integer('bp_after_diastolic');
    t.integer('bp_after_minutes');
    t.integer('heart_rate_before');
    t.integer('heart_rate_after');
    t.jsonb('ad_symptoms').notNullable().defaultTo('[]');
    t.jsonb('other_events').notNullable().defaultTo('[]');
    t.jsonb('skin').notNullable().defaultTo('[]');
    t.integer('effort');
    t.text('comment');
    t.jsonb('evaluation').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['client_id', 'taken_at']);
  });

  await knex.schema.createTable('distance_goals', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.text('builtin_route_id');
    t.jsonb('custom_route');
    t.date('count_from').notNullable();
    t.uuid('chosen_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('replaced_at', { useTz: true });
  });
  await knex.raw('CREATE UNIQUE INDEX distance_goals_one_current ON distance_goals (client_id) WHERE replaced_at IS NULL');
  await knex.raw('ALTER TABLE distance_goals ADD CONSTRAINT distance_goals_route_check CHECK ((builtin_route_id IS NULL) <> (custom_route IS NULL))');

  await knex.schema.createTable('notification_preferences', (t) => {
    t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
    t.boolean('reminders').notNullable().defaultTo(true);
    t.boolean('weekly_summary').notNullable().defaultTo(true);
    t.boolean('daily_digest').notNullable().defaultTo(true);
    t.boolean('urgent_alerts').notNullable().defaultTo(true);
    t.text('unsubscribe_token').notNullable().unique();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.alterTable('outbox_emails', (t) => {
    t.text('dedupe_key').unique();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox_emails', (t) => t.dropColumn('dedupe_key'));
  for (const table of ['notification_preferences', 'distance_goals', 'checks']) await knex.schema.dropTableIfExists(table);
  await knex.schema.alterTable('clients', (t) => t.dropColumn('baseline_systolic'));
}
