import type { Knex } from 'knex';

// Uploads that cannot be read end in a `failed` state instead of staying
// queued; the same bytes for one client share one stored object (so the key is
// no longer unique); the clinic's stored bytes are summed for its quota.
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE uploads DROP CONSTRAINT uploads_status_check');
  await knex.raw(`ALTER TABLE uploads ADD CONSTRAINT uploads_status_check CHECK (status IN ('queued', 'accepted', 'duplicate', 'rejected', 'failed'))`);
  await knex.raw('ALTER TABLE uploads DROP CONSTRAINT uploads_storage_key_unique');
  await knex.schema.alterTable('uploads', (t) => {
    t.index(['storage_key']);
    t.index(['clinic_id']);
    t.index(['duplicate_of_upload_id']);
  });
  // Copies of a file that was still queued when they arrived were recorded as
  // duplicates of nothing: they take their first copy's outcome now, or wait for it.
  await knex.raw(`
    UPDATE uploads c SET
      status = CASE WHEN o.status IN ('accepted', 'duplicate') THEN 'duplicate' ELSE o.status END,
      duplicate_of_ride_id = CASE WHEN o.status IN ('accepted', 'duplicate') THEN COALESCE(o.ride_id, o.duplicate_of_ride_id) END,
      error = CASE WHEN o.status = 'rejected' THEN o.error END,
      enqueued_at = CASE WHEN o.status = 'queued' THEN now() ELSE c.enqueued_at END
    FROM uploads o
    WHERE c.duplicate_of_upload_id = o.id AND c.status = 'duplicate' AND c.duplicate_of_ride_id IS NULL`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.dropIndex(['storage_key']);
    t.dropIndex(['clinic_id']);
    t.dropIndex(['duplicate_of_upload_id']);
  });
  await knex.raw('ALTER TABLE uploads ADD CONSTRAINT uploads_storage_key_unique UNIQUE (storage_key)');
  await knex.raw(`UPDATE uploads SET status = 'rejected' WHERE status = 'failed'`);
  await knex.raw('ALTER TABLE uploads DROP CONSTRAINT uploads_status_check');
  await knex.raw(`ALTER TABLE uploads ADD CONSTRAINT uploads_status_check CHECK (status IN ('queued', 'accepted', 'duplicate', 'rejected'))`);
}
