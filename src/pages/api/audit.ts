import type { APIRoute } from 'astro';
import { auditQuerySchema, readAuditLog } from '../../lib/audit/read';
import { signedIn } from '../../lib/auth/context';
import { handle, json } from '../../lib/http/respond';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const query = auditQuerySchema.parse(Object.fromEntries(url.searchParams));
    return json({ entries: await readAuditLog(ctx, query) });
  });
