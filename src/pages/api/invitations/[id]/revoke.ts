import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { revokeInvitation } from '../../../../lib/auth/invitations';
import { handle, json } from '../../../../lib/http/respond';

export const POST: APIRoute = ({ params, locals }) =>
  handle(async () => {
    await revokeInvitation(signedIn(locals), params.id!);
    return json({ revoked: true });
  });
