import type { Knex } from 'knex';

// Ride files in: the stored files (uploads), the sessions made from them
// (rides, with the canonical summary as columns so therapists can sort and
// filter), each session's sample series (one compact row per session, chosen
// by the storage benchmark, see DEVELOPERS.md), devices and import profiles.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('import_profiles', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.text('name').notNullable();
    t.text('device_name');
    t.jsonb('mapping').notNullable();
    t.uuid('created_by').references('users.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('archived_at', { useTz: true });
    t.index(['clinic_id']);
  });

  await knex.schema.createTable('devices', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.text('serial').notNullable();
    t.text('name');
    t.uuid('import_profile_id').references('import_profiles.id');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['clinic_id', 'serial']);
  });

  await knex.schema.createTable('uploads', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('uploaded_by').notNullable().references('users.id');
    t.text('original_name').notNullable();
    t.bigInteger('byte_size').notNullable();
    t.text('sha256').notNullable();
    t.text('storage_key').notNullable().unique();
    t.text('status').notNullable();
    t.jsonb('error');
    t.jsonb('warnings').notNullable().defaultTo('[]');
    t.uuid('duplicate_of_upload_id').references('uploads.id');
    t.uuid('import_profile_id').references('import_profiles.id');
    t.timestamp('fallback_started_at', { useTz: true });
    t.timestamp('uploaded_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('enqueued_at', { useTz: true });
    t.timestamp('processed_at', { useTz: true });
    t.integer('attempts').notNullable().defaultTo(0);
    t.index(['client_id', 'sha256']);
    t.index(['client_id', 'uploaded_at']);
  });
  await knex.raw(`ALTER TABLE uploads ADD CONSTRAINT uploads_status_check CHECK (status IN ('queued', 'accepted', 'duplicate', 'rejected'))`);
  await knex.raw(`CREATE INDEX uploads_queued_idx ON uploads (enqueued_at) WHERE status = 'queued'`);

  await knex.schema.createTable('rides', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('upload_id').notNullable().unique().references('uploads.id');
    t.uuid('device_id').references('devices.id');
    t.timestamp('started_at', { useTz: true }).notNullable();
    t.text('started_at_source').notNullable();
    t.double('duration_s').notNullable();
    t.double('active_s').notNullable();
    t.double('passive_s').notNullable();
    t.double('cooldown_s').notNullable();
    t.double('distance_m');
    t.double('mean_power_w');
    t.double('peak_power_5s_w');
    t.double('work_kj');
    t.double('mean_cadence_rpm');
    t.double('current_per_watt_ma_per_w');
    t.double('pulse_width_us');
    t.double('frequency_hz');
    t.integer('samples').notNullable();
    t.jsonb('channels').notNullable().defaultTo('{}');
    t.jsonb('warnings').notNullable().defaultTo('[]');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['client_id', 'started_at']);
    t.index(['clinic_id', 'started_at']);
  });
  await knex.raw(`ALTER TABLE rides ADD CONSTRAINT rides_started_at_source_check CHECK (started_at_source IN ('file', 'file_modified', 'upload_time'))`);
  await knex.schema.alterTable('uploads', (t) => {
    t.uuid('ride_id').references('rides.id').onDelete('SET NULL');
    t.uuid('duplicate_of_ride_id').references('rides.id').onDelete('SET NULL');
  });

  await knex.schema.createTable('ride_series', (t) => {
    t.uuid('ride_id').primary().references('rides.id').onDelete('CASCADE');
    t.integer('format').notNullable();
    t.integer('samples').notNullable();
    t.specificType('data', 'bytea').notNullable();
  });
  // The data is compressed already; PostgreSQL's own compression would only cost time.
  await knex.raw('ALTER TABLE ride_series ALTER COLUMN data SET STORAGE EXTERNAL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('ride_series');
  await knex.schema.alterTable('uploads', (t) => {
    t.dropColumn('ride_id');
    t.dropColumn('duplicate_of_ride_id');
  });
  await knex.schema.dropTableIfExists('rides');
  await knex.schema.dropTableIfExists('uploads');
  await knex.schema.dropTableIfExists('devices');
  await knex.schema.dropTableIfExists('import_profiles');
}
