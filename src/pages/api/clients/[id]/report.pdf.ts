import type { APIRoute } from 'astro';
import { requestLocale } from '../../../../components/rides/format';
import { signedIn } from '../../../../lib/auth/context';
import { download } from '../../../../lib/http/download';
import { HttpError } from '../../../../lib/http/errors';
import { readJson } from '../../../../lib/http/request';
import { handle } from '../../../../lib/http/respond';
import { reportPdfFile } from '../../../../lib/reports/report-file';
import { reportPdfBodySchema, reportPeriodSchema } from '../../../../lib/reports/report-data';

const MAX_FORM_BYTES = 16 * 1024;

/** The report page's form posts the summary; a script may send it as JSON. */
async function readSummary(request: Request): Promise<string | undefined> {
  const type = request.headers.get('content-type') ?? '';
  if (type.includes('application/json')) return (await readJson(request, reportPdfBodySchema)).summary;
  if (Number(request.headers.get('content-length') ?? 0) > MAX_FORM_BYTES) throw new HttpError(413, 'too_large', 'The summary is too long: keep it under 2000 characters.');
  const text = await request.text();
  if (text.length > MAX_FORM_BYTES) throw new HttpError(413, 'too_large', 'The summary is too long: keep it under 2000 characters.');
  return reportPdfBodySchema.parse(Object.fromEntries(new URLSearchParams(text))).summary;
}

async function answer(request: Request, url: URL, params: Record<string, string | undefined>, locals: App.Locals, summary: () => Promise<string | undefined>) {
  const ctx = signedIn(locals);
  const period = reportPeriodSchema.parse(Object.fromEntries(url.searchParams));
  const file = await reportPdfFile(ctx, params.id!, period, await summary(), requestLocale(request.headers.get('accept-language')));
  return download(new Uint8Array(file.bytes), file.filename, 'application/pdf');
}

export const GET: APIRoute = ({ request, url, params, locals }) => handle(() => answer(request, url, params, locals, async () => undefined));

export const POST: APIRoute = ({ request, url, params, locals }) => handle(() => answer(request, url, params, locals, () => readSummary(request)));
