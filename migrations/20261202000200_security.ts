import type { Knex } from 'knex';

// Security hardening:
// - reset links can be withdrawn (a newer link, a completed reset or a new
//   password withdraws every other outstanding link of the account);
// - sign-in attempts remember the trusted device they came from, so that the
//   limits can count an e-mail with a device instead of with an address;
// - the audit log refuses changes even from its owner's own code (the app's
//   role is refused UPDATE, DELETE and TRUNCATE by its privileges; see
//   src/lib/db/roles.ts), and list reads can be found by the clients they showed.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('password_resets', (t) => {
    t.timestamp('revoked_at', { useTz: true });
    t.index(['user_id']);
  });

  await knex.schema.alterTable('sign_in_attempts', (t) => {
    t.text('device');
    t.index(['email', 'ip', 'attempted_at']);
  });

  await knex.raw(`
    CREATE FUNCTION audit_log_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit_log is append-only: % is not allowed', TG_OP USING ERRCODE = 'insufficient_privilege';
    END
    $$`);
  await knex.raw('CREATE TRIGGER audit_log_no_change BEFORE UPDATE OR DELETE ON audit_log FOR EACH ROW EXECUTE FUNCTION audit_log_append_only()');
  await knex.raw('CREATE TRIGGER audit_log_no_truncate BEFORE TRUNCATE ON audit_log FOR EACH STATEMENT EXECUTE FUNCTION audit_log_append_only()');
  await knex.raw("CREATE INDEX audit_log_client_ids ON audit_log USING gin ((detail -> 'clientIds') jsonb_path_ops)");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP INDEX IF EXISTS audit_log_client_ids');
  await knex.raw('DROP TRIGGER IF EXISTS audit_log_no_truncate ON audit_log');
  await knex.raw('DROP TRIGGER IF EXISTS audit_log_no_change ON audit_log');
  await knex.raw('DROP FUNCTION IF EXISTS audit_log_append_only()');
  await knex.schema.alterTable('sign_in_attempts', (t) => {
    t.dropIndex(['email', 'ip', 'attempted_at']);
    t.dropColumn('device');
  });
  await knex.schema.alterTable('password_resets', (t) => {
    t.dropIndex(['user_id']);
    t.dropColumn('revoked_at');
  });
}
