import type { RequestContext } from '../auth/context';
import { fileSlug } from '../http/download';
import { reportPdf } from './pdf';
import { loadReport, type ReportPeriod } from './report-data';

/** The progress report of a client and period as a PDF file, with its download name. */
export async function reportPdfFile(ctx: RequestContext, clientId: string, period: ReportPeriod, summary: string | undefined, locale: string) {
  const report = await loadReport(ctx, clientId, period, { action: 'report.pdf', summary });
  return {
    filename: `kinloop-report-${fileSlug(report.client.name)}-${report.period.from}-to-${report.period.to}.pdf`,
    bytes: await reportPdf(report, locale),
  };
}
