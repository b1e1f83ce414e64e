import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { download } from '../../../../lib/http/download';
import { readForm, readJson } from '../../../../lib/http/request';
import { handle } from '../../../../lib/http/respond';
import { reportPdfFile } from '../../../../lib/reports/report-file';
import { reportPdfBodySchema, reportPeriodSchema } from '../../../../lib/reports/report-data';
import { pageLocale } from '../../../../lib/ui/locale';

/** The report page's form posts the summary; a script may send it as JSON. */
async function readSummary(request: Request): Promise<string | undefined> {
  const type = request.headers.get('content-type') ?? '';
  if (type.includes('application/json')) return (await readJson(request, reportPdfBodySchema)).summary;
  // Read with the form limit while it arrives, whatever the transfer encoding.
  return reportPdfBodySchema.parse(Object.fromEntries(await readForm(request))).summary;
}

async function answer(request: Request, url: URL, params: Record<string, string | undefined>, locals: App.Locals, summary: () => Promise<string | undefined>) {
  const ctx = signedIn(locals);
  const period = reportPeriodSchema.parse(Object.fromEntries(url.searchParams));
  // The client's clinic writes the dates and numbers, as on the report page.
  const { locale } = await pageLocale(ctx, params.id);
  const file = await reportPdfFile(ctx, params.id!, period, await summary(), locale);
  return download(new Uint8Array(file.bytes), file.filename, 'application/pdf');
}

export const GET: APIRoute = ({ request, url, params, locals }) => handle(() => answer(request, url, params, locals, async () => undefined));

export const POST: APIRoute = ({ request, url, params, locals }) => handle(() => answer(request, url, params, locals, () => readSummary(request)));
