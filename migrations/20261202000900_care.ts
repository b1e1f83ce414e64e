import type { Knex } from 'knex';

// Before and between rides: screening and medical clearance, the rider's own
// autonomic dysreflexia plan, progression proposals, and messages between the
// clinic and the rider. Every record is versioned or appended; nothing here is
// updated in place except a proposal's decision and a reader's position.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clinics', (t) => {
    // Null: Kinloop's defaults (src/lib/care/care-settings.ts).
    t.integer('clearance_review_months');
    t.integer('ad_absolute_systolic');
  });

  await knex.schema.createTable('screening_versions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.integer('version').notNullable();
    t.jsonb('items').notNullable();
    t.date('assessed_on').notNullable();
    t.uuid('assessed_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['client_id', 'version']);
  });

  await knex.schema.createTable('clearances', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.text('storage_key').notNullable();
    t.text('sha256').notNullable();
    t.bigInteger('byte_size').notNullable();
    t.text('content_type').notNullable();
    t.text('original_name').notNullable();
    t.date('cleared_on').notNullable();
    t.text('clinician').notNullable();
    t.date('review_on').notNullable();
    t.uuid('uploaded_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['client_id', 'created_at']);
  });
  await knex.raw(`ALTER TABLE clearances ADD CONSTRAINT clearances_type CHECK (content_type IN ('application/pdf', 'image/jpeg', 'image/png'))`);

  await knex.schema.createTable('ad_plans', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.integer('version').notNullable();
    t.integer('resting_systolic');
    t.integer('resting_diastolic');
    t.text('signs').notNullable();
    t.text('first_steps').notNullable();
    t.text('physician_prescribed');
    t.text('who_to_call').notNullable();
    t.jsonb('contacts').notNullable();
    t.uuid('created_by').notNullable().references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['client_id', 'version']);
  });

  await knex.schema.alterTable('rides', (t) => {
    // Null for rides under 12 active minutes, and for rides read before the metric existed.
    t.double('endurance_ratio_pct');
  });

  await knex.schema.alterTable('prescriptions', (t) => {
    // Null: no progression. See src/lib/care/progression.ts for its shape.
    t.jsonb('progression');
    // Why the version was saved for a client who was not cleared.
    t.text('not_cleared_reason');
  });

  await knex.schema.createTable('progression_proposals', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('prescription_id').notNullable().references('prescriptions.id');
    t.text('iso_week').notNullable();
    t.jsonb('proposed').notNullable();
    t.jsonb('evidence').notNullable();
    t.text('state').notNullable().defaultTo('open');
    t.uuid('decided_by').references('users.id');
    t.timestamp('decided_at', { useTz: true });
    t.uuid('result_prescription_id').references('prescriptions.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['prescription_id', 'iso_week']);
    t.index(['clinic_id', 'state']);
  });
  await knex.raw(`ALTER TABLE progression_proposals ADD CONSTRAINT progression_state CHECK (state IN ('open', 'accepted', 'dismissed', 'superseded'))`);

  await knex.schema.createTable('messages', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('author_id').notNullable().references('users.id');
    t.text('body').notNullable();
    t.uuid('flag_id').references('flags.id');
    t.text('flag_quote');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['client_id', 'created_at']);
  });
  await knex.schema.createTable('message_reads', (t) => {
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('user_id').notNullable().references('users.id');
    t.timestamp('read_up_to', { useTz: true }).notNullable();
    t.primary(['client_id', 'user_id']);
  });

  await knex.schema.alterTable('notification_preferences', (t) => {
    t.boolean('messages').notNullable().defaultTo(true);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('notification_preferences', (t) => t.dropColumn('messages'));
  for (const table of ['message_reads', 'messages', 'progression_proposals', 'ad_plans', 'clearances', 'screening_versions']) await knex.schema.dropTableIfExists(table);
  await knex.schema.alterTable('prescriptions', (t) => {
    t.dropColumn('progression');
    t.dropColumn('not_cleared_reason');
  });
  await knex.schema.alterTable('rides', (t) => t.dropColumn('endurance_ratio_pct'));
  await knex.schema.alterTable('clinics', (t) => {
    t.dropColumn('clearance_review_months');
    t.dropColumn('ad_absolute_systolic');
  });
}
