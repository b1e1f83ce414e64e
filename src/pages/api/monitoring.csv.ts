import type { APIRoute } from 'astro';
import { signedIn } from '../../lib/auth/context';
import { download } from '../../lib/http/download';
import { handle } from '../../lib/http/respond';
import { monitoringCsv, monitoringCsvQuerySchema } from '../../lib/monitoring/monitoring';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const file = await monitoringCsv(ctx, monitoringCsvQuerySchema.parse(Object.fromEntries(url.searchParams)));
    return download(file.text, file.filename, 'text/csv; charset=utf-8');
  });
