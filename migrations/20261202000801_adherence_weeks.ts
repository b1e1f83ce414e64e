import type { Knex } from 'knex';

// Each client's program week by week, worked out once and stored, so that
// triage, the caseload and the hourly mail read a few weeks per client
// instead of every session (src/lib/adherence/stored.ts).
//
// `adherence_state` says what the stored weeks were made from: `input_seq`
// goes up with every change to a client's sessions, prescriptions, pauses or
// time zone (triggers below, whatever code makes the change: ingest, the
// services, a bulk COPY), `source_seq` is the `input_seq` the stored weeks
// were computed at, `count_threshold_pct` the clinic setting they used. A
// reader uses the stored weeks only while both still match, and otherwise
// reads the whole history as before, so a stale store costs time, never a
// wrong answer.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('adherence_state', (t) => {
    t.uuid('client_id').primary().references('clients.id').onDelete('CASCADE');
    t.bigInteger('input_seq').notNullable().defaultTo(1);
    t.bigInteger('source_seq');
    t.double('count_threshold_pct');
    t.date('first_monday');
    t.date('through_monday');
    t.timestamp('refreshed_at', { useTz: true });
  });
  await knex.raw('CREATE INDEX adherence_state_stale ON adherence_state (client_id) WHERE source_seq IS DISTINCT FROM input_seq');

  await knex.schema.createTable('adherence_weeks', (t) => {
    t.uuid('client_id').notNullable().references('clients.id').onDelete('CASCADE');
    t.date('monday').notNullable();
    t.smallint('sessions').notNullable();
    t.smallint('counted').notNullable();
    t.smallint('short').notNullable();
    t.smallint('prescribed').notNullable();
    t.boolean('met').notNullable();
    t.boolean('paused').notNullable();
    t.boolean('has_prescription').notNullable();
    t.integer('run').notNullable();
    t.primary(['client_id', 'monday']);
  });

  // Statement-level triggers with transition tables: a COPY of 300,000 rides
  // bumps each client once, not once per row.
  await knex.raw(`
    CREATE FUNCTION adherence_inputs_changed() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'INSERT' THEN
        INSERT INTO adherence_state (client_id) SELECT DISTINCT client_id FROM new_rows
        ON CONFLICT (client_id) DO UPDATE SET input_seq = adherence_state.input_seq + 1;
      ELSIF TG_OP = 'DELETE' THEN
        INSERT INTO adherence_state (client_id) SELECT DISTINCT client_id FROM old_rows WHERE client_id IN (SELECT id FROM clients)
        ON CONFLICT (client_id) DO UPDATE SET input_seq = adherence_state.input_seq + 1;
      ELSE
        INSERT INTO adherence_state (client_id) SELECT client_id FROM new_rows UNION SELECT client_id FROM old_rows
        ON CONFLICT (client_id) DO UPDATE SET input_seq = adherence_state.input_seq + 1;
      END IF;
      RETURN NULL;
    END $$`);
  for (const table of ['rides', 'prescriptions', 'pauses']) {
    await knex.raw(`CREATE TRIGGER ${table}_adherence_insert AFTER INSERT ON ${table} REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION adherence_inputs_changed()`);
    await knex.raw(`CREATE TRIGGER ${table}_adherence_delete AFTER DELETE ON ${table} REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION adherence_inputs_changed()`);
    await knex.raw(
      `CREATE TRIGGER ${table}_adherence_update AFTER UPDATE ON ${table} REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION adherence_inputs_changed()`,
    );
  }
  await knex.raw(`
    CREATE FUNCTION adherence_zone_changed() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO adherence_state (client_id) VALUES (NEW.id)
      ON CONFLICT (client_id) DO UPDATE SET input_seq = adherence_state.input_seq + 1;
      RETURN NULL;
    END $$`);
  await knex.raw(
    'CREATE TRIGGER clients_adherence_zone AFTER UPDATE OF time_zone ON clients FOR EACH ROW WHEN (OLD.time_zone IS DISTINCT FROM NEW.time_zone) EXECUTE FUNCTION adherence_zone_changed()',
  );

  // Every client that has anything now starts out stale; the refresh after
  // migrating (scripts/db.ts) and the worker's sweep fill the weeks in.
  await knex.raw(`INSERT INTO adherence_state (client_id)
    SELECT id FROM clients WHERE id IN (SELECT client_id FROM rides UNION SELECT client_id FROM prescriptions UNION SELECT client_id FROM pauses)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS clients_adherence_zone ON clients');
  for (const table of ['rides', 'prescriptions', 'pauses']) {
    for (const op of ['insert', 'delete', 'update']) await knex.raw(`DROP TRIGGER IF EXISTS ${table}_adherence_${op} ON ${table}`);
  }
  await knex.raw('DROP FUNCTION IF EXISTS adherence_zone_changed()');
  await knex.raw('DROP FUNCTION IF EXISTS adherence_inputs_changed()');
  await knex.schema.dropTableIfExists('adherence_weeks');
  await knex.schema.dropTableIfExists('adherence_state');
}
