import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { staffUpdateSchema, updateStaff } from '../../../lib/staff/staff';

export const PATCH: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const input = await readJson(request, staffUpdateSchema);
    return json(await updateStaff(ctx, params.userId!, input));
  });
