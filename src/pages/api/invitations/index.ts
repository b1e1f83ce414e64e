import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { createInvitation, invitationInputSchema, listInvitations } from '../../../lib/auth/invitations';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ locals }) =>
  handle(async () => json({ invitations: await listInvitations(signedIn(locals)) }));

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const input = await readJson(request, invitationInputSchema);
    return json(await createInvitation(ctx, input), 201);
  });
