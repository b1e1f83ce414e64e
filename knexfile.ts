// Used by the knex CLI (run under tsx, see DEVELOPERS.md); the app and scripts
// run migrations from code through src/lib/db/migrate.ts.
export default {
  client: 'pg',
  connection: process.env.DATABASE_URL,
  migrations: { directory: './migrations', extension: 'ts', loadExtensions: ['.ts'] },
};
