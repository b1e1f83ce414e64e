import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { clinicSessionsCsv } from '../../../lib/exports/sessions';
import { download } from '../../../lib/http/download';
import { handle } from '../../../lib/http/respond';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const file = await clinicSessionsCsv(signedIn(locals), url.searchParams.get('clinicId') ?? undefined);
    return download(file.text, file.filename, 'text/csv; charset=utf-8');
  });
