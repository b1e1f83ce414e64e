// The data layer: `scope(ctx)` for requests, named system accessors for work
// done on no one's behalf. See DEVELOPERS.md, "Data access".
export { lock, type Db, type Query } from './db';
export { scope, Scope, ClientGrant, ClinicGrant, OwnGrant, type ScopeAuditEntry } from './scope';
export { byNameSql, whereNameHasWords } from './name-search';
export { programRows, type ProgramRowsOptions } from './readings';
export { authDb, closeDatabase, databaseAnswers, maintenanceDb, maintenanceKnex, workerDb } from './system';
