import type { Knex } from 'knex';

// What must follow when a client's sessions change (flags, adherence caches,
// reminders) registers here, so ingest does not depend on those areas.
type Listener = (knex: Knex, clientId: string) => Promise<void>;
const listeners: Listener[] = [];

export function onRidesChanged(listener: Listener): void {
  listeners.push(listener);
}

export async function notifyRidesChanged(knex: Knex, clientId: string): Promise<void> {
  for (const listener of listeners) await listener(knex, clientId);
}
