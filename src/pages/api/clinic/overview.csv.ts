import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { download } from '../../../lib/http/download';
import { handle } from '../../../lib/http/respond';
import { clinicOverviewCsv } from '../../../lib/overview/clinic-overview';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const file = await clinicOverviewCsv(signedIn(locals), url.searchParams.get('clinicId') ?? undefined);
    return download(file.text, file.filename, 'text/csv; charset=utf-8');
  });
