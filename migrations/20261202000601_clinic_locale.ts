import type { Knex } from 'knex';

// The locale a clinic's dates are written in (BCP 47, e.g. 'en-GB'); null
// means the default from the clinic's time zone (src/lib/time/locale.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clinics', (t) => {
    t.text('locale');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('clinics', (t) => {
    t.dropColumn('locale');
  });
}
