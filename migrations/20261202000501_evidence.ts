import type { Knex } from 'knex';

// Evidence that leaves Kinloop: the clinic's FES-cycling efficiency behind the
// energy estimate, whether a rider also pedals by their own effort (so the
// volitional-cycling equation may be shown beside it), and the minutes staff
// spend monitoring a client.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clinics', (t) => {
    // Null: Kinloop's default (src/lib/reports/energy.ts).
    t.decimal('fes_efficiency_pct', 4, 1);
  });
  await knex.schema.alterTable('clients', (t) => {
    // Null: not recorded.
    t.boolean('volitional_control');
  });

  await knex.schema.createTable('monitoring_entries', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('clinic_id').notNullable().references('clinics.id');
    t.uuid('client_id').notNullable().references('clients.id');
    t.uuid('staff_user_id').notNullable().references('users.id');
    t.text('activity').notNullable();
    t.text('source').notNullable();
    t.timestamp('started_at', { useTz: true }).notNullable();
    t.integer('seconds').notNullable();
    t.text('note');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['clinic_id', 'started_at']);
    t.index(['client_id', 'started_at']);
  });
  await knex.raw(`ALTER TABLE monitoring_entries ADD CONSTRAINT monitoring_activity CHECK (activity IN ('review', 'phone_call', 'message', 'report'))`);
  await knex.raw(`ALTER TABLE monitoring_entries ADD CONSTRAINT monitoring_source CHECK (source IN ('timer', 'manual'))`);
  await knex.raw(`ALTER TABLE monitoring_entries ADD CONSTRAINT monitoring_seconds CHECK (seconds > 0 AND seconds <= 28800)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('monitoring_entries');
  await knex.schema.alterTable('clients', (t) => t.dropColumn('volitional_control'));
  await knex.schema.alterTable('clinics', (t) => t.dropColumn('fes_efficiency_pct'));
}
