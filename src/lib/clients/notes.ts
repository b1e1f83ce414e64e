import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { paragraph } from '../validation/fields';

export const noteInputSchema = z.object({ body: paragraph(z.string().trim().min(1, 'Write the note first.').max(5000, 'A note is at most 5000 characters.'), 'Note') }).strict();

/** Therapists' dated notes on a client: clinic staff only. */
export async function listNotes(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'notes.list');
  const rows = await client.db('client_notes as n').join('users as u', 'u.id', 'n.author_id').orderBy('n.created_at', 'desc').select('n.*', 'u.name as author_name');
  return { notes: rows.map((r) => ({ id: r.id, body: r.body, author: { userId: r.author_id, name: r.author_name }, createdAt: r.created_at.toISOString() })) };
}

export async function addNote(ctx: RequestContext, clientId: string, body: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'note.create');
  const [row] = await client.db('client_notes').insert({ author_id: ctx.viewer.userId, body }).returning('*');
  await client.audit({ action: 'note.create', recordType: 'client_note', recordId: row.id });
  return { id: row.id, body: row.body, author: { userId: ctx.viewer.userId, name: ctx.viewer.name }, createdAt: row.created_at.toISOString() };
}
