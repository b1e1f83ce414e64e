import type { Knex } from 'knex';

// Lists ordered by name in PostgreSQL (triage, the caseload, the client list
// come a page at a time) in the order people expect: the cluster is made
// without a locale (C order: "Zoe" before "ada", accented letters after z),
// so an ICU collation of Unicode's root order, as the browsers' Intl.Collator
// uses, is made once here. A server without ICU fails here, at deploy time,
// rather than on the first list.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE COLLATION IF NOT EXISTS kinloop_names (provider = icu, locale = 'und')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP COLLATION IF EXISTS kinloop_names');
}
