import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { addNote, listNotes, noteInputSchema } from '../../../../lib/clients/notes';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await listNotes(signedIn(locals), params.id!)));

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { body } = await readJson(request, noteInputSchema);
    return json(await addNote(ctx, params.id!, body), 201);
  });
