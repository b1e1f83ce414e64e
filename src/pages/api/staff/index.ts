import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { handle, json } from '../../../lib/http/respond';
import { listStaff } from '../../../lib/staff/staff';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => json({ staff: await listStaff(signedIn(locals), url.searchParams.get('clinicId') ?? undefined) }));
