import type { Knex } from 'knex';

// Supervising from a distance: versioned prescriptions, pauses, flags with
// their full history, therapists' notes, and the clinic's flag thresholds.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clinics', (t) => {
    t.jsonb('flag_thresholds').notNullable().defaultTo('{}');
  });

  await knex.schema.createTable('prescriptions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.integer('version').notNullable();
    t.date('effective_from').notNullable();
    t.integer('sessions_per_week').notNullable();
    t.integer('minutes_per_session').notNullable();
    t.integer('warmup_minutes');
    t.double('target_cadence_rpm');
    t.double('cadence_tolerance_rpm');
    t.double('resistance');
    t.jsonb('channels').notNullable().defaultTo('{}');
    t.text('notes');
    t.uuid('created_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['client_id', 'version']);
  });

  await knex.schema.createTable('pauses', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.date('starts_on').notNullable();
    t.date('ends_on').notNullable();
    t.text('reason').notNullable();
    t.uuid('created_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('ended_at', { useTz: true });
    t.uuid('ended_by').references('users.id');
    t.timestamp('cancelled_at', { useTz: true });
    t.index(['client_id', 'starts_on']);
  });
  await knex.raw('ALTER TABLE pauses ADD CONSTRAINT pauses_range_check CHECK (ends_on >= starts_on)');

  await knex.schema.createTable('flags', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.text('kind').notNullable();
    t.text('severity').notNullable();
    t.text('state').notNullable().defaultTo('open');
    t.text('anchor').notNullable();
    t.text('reason').notNullable();
    t.jsonb('evidence').notNullable();
    t.timestamp('raised_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('cleared_at', { useTz: true });
    t.date('snoozed_until');
    t.timestamp('closed_at', { useTz: true });
    t.index(['clinic_id', 'state']);
    t.index(['client_id', 'raised_at']);
  });
  await knex.raw(`ALTER TABLE flags
    ADD CONSTRAINT flags_kind_check CHECK (kind IN ('missed_sessions', 'power_drop', 'current_rise', 'short_session', 'bp_rise', 'bp_drop', 'skin_concern')),
    ADD CONSTRAINT flags_severity_check CHECK (severity IN ('urgent', 'review', 'info')),
    ADD CONSTRAINT flags_state_check CHECK (state IN ('open', 'acknowledged', 'resolved', 'withdrawn'))`);
  // One live flag per kind per client: new evidence updates it instead of stacking copies.
  await knex.raw(`CREATE UNIQUE INDEX flags_one_live_per_kind ON flags (client_id, kind) WHERE state IN ('open', 'acknowledged')`);

  await knex.schema.createTable('flag_events', (t) => {
    t.bigIncrements('id');
    t.uuid('flag_id').notNullable().references('flags.id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('actor_user_id').references('users.id');
    t.text('action').notNullable();
    t.text('note');
    t.jsonb('detail').notNullable().defaultTo('{}');
    t.index(['flag_id', 'at']);
  });

  await knex.schema.createTable('client_notes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('author_id').notNullable().references('users.id');
    t.text('body').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['client_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['client_notes', 'flag_events', 'flags', 'pauses', 'prescriptions']) await knex.schema.dropTableIfExists(table);
  await knex.schema.alterTable('clinics', (t) => t.dropColumn('flag_thresholds'));
}
