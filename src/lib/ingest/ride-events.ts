import type { Db, Query } from '../data/db';

// What must follow when a client's sessions change (flags, adherence caches,
// reminders) registers here, so ingest does not depend on those areas.
type Listener = (knex: Db, clientId: string) => Promise<void>;
const listeners: Listener[] = [];

export function onRidesChanged(listener: Listener): void {
  listeners.push(listener);
}

export async function notifyRidesChanged(knex: Db, clientId: string): Promise<void> {
  for (const listener of listeners) await listener(knex, clientId);
}
