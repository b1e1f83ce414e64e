import type { Knex } from 'knex';

// The platform's tables: clinics, people and their roles, clients, sign-in and
// the audit log. Rides, prescriptions, flags and checks come in later
// migrations and refer to `clients.id` and `users.id`.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('clinics', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('name').notNullable();
    t.text('time_zone').notNullable().defaultTo('UTC');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('password_hash');
    t.timestamp('disabled_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw('CREATE UNIQUE INDEX users_email_lower_key ON users (lower(email))');

  await knex.schema.createTable('memberships', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('clinic_id').notNullable().references('clinics.id').onDelete('CASCADE');
    t.text('role').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['user_id', 'clinic_id']);
    t.index(['clinic_id']);
  });
  await knex.raw("ALTER TABLE memberships ADD CONSTRAINT memberships_role_check CHECK (role IN ('admin', 'therapist'))");

  await knex.schema.createTable('clients', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.text('display_name').notNullable();
    t.date('date_of_birth');
    t.text('diagnosis').notNullable().defaultTo('other');
    t.text('injury_level');
    t.text('ais_grade');
    t.text('ad_risk').notNullable().defaultTo('unknown');
    t.text('time_zone').notNullable();
    t.decimal('body_mass_kg', 5, 1);
    t.date('program_start');
    t.uuid('user_id').unique().references('users.id');
    t.uuid('primary_therapist_id').references('users.id');
    t.timestamp('archived_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['clinic_id']);
  });
  await knex.raw(`ALTER TABLE clients
    ADD CONSTRAINT clients_diagnosis_check CHECK (diagnosis IN ('sci', 'ms', 'stroke', 'cerebral_palsy', 'other')),
    ADD CONSTRAINT clients_ais_check CHECK (ais_grade IS NULL OR ais_grade IN ('A', 'B', 'C', 'D', 'E')),
    ADD CONSTRAINT clients_ad_risk_check CHECK (ad_risk IN ('at_risk', 'not_at_risk', 'unknown'))`);

  await knex.schema.createTable('carer_links', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('carer_user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('client_id').notNullable().references('clients.id').onDelete('CASCADE');
    t.text('relationship').notNullable().defaultTo('carer');
    t.boolean('active').notNullable().defaultTo(true);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['carer_user_id', 'client_id']);
    t.index(['client_id']);
  });

  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable();
    t.text('name');
    t.text('role').notNullable();
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').references('clients.id');
    t.text('relationship');
    t.text('token_hash').notNullable().unique();
    t.uuid('invited_by').notNullable().references('users.id');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.uuid('accepted_user_id').references('users.id');
    t.timestamp('revoked_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['clinic_id']);
  });
  await knex.raw(`ALTER TABLE invitations
    ADD CONSTRAINT invitations_role_check CHECK (role IN ('admin', 'therapist', 'client', 'carer')),
    ADD CONSTRAINT invitations_client_check CHECK ((role IN ('client', 'carer')) = (client_id IS NOT NULL))`);

  await knex.schema.createTable('password_resets', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable('auth_sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_seen_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('revoked_at', { useTz: true });
    t.text('ip');
    t.text('user_agent');
    t.index(['user_id']);
  });

  await knex.schema.createTable('sign_in_attempts', (t) => {
    t.bigIncrements('id');
    t.text('email').notNullable();
    t.text('ip').notNullable();
    t.boolean('succeeded').notNullable();
    t.timestamp('attempted_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['email', 'attempted_at']);
    t.index(['ip', 'attempted_at']);
  });

  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.uuid('actor_user_id').references('users.id');
    t.text('action').notNullable();
    t.uuid('clinic_id').references('clinics.id');
    t.uuid('client_id').references('clients.id');
    t.text('record_type');
    t.text('record_id');
    t.text('ip');
    t.text('user_agent');
    t.jsonb('detail').notNullable().defaultTo('{}');
    t.index(['clinic_id', 'at']);
    t.index(['client_id', 'at']);
    t.index(['actor_user_id', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    'audit_log',
    'sign_in_attempts',
    'auth_sessions',
    'password_resets',
    'invitations',
    'carer_links',
    'clients',
    'memberships',
    'users',
    'clinics',
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
}
