import { lazy, Suspense } from 'react';
import { useApi } from '../api';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { useOnProgramChange } from './changes';
import type { AdherenceData, TrendsData } from './types';

// chart.js comes with the charts, after the page's own scripts (ChartPanels.tsx).
const TrendCharts = lazy(() => import('./ChartPanels').then((m) => ({ default: m.TrendCharts })));
const WeeksChart = lazy(() => import('./ChartPanels').then((m) => ({ default: m.WeeksChart })));
const drawing = <p role="status" className="py-6 text-ink-soft">Drawing the charts…</p>;

const TREND_WEEKS = 26;

/** The four headline trends of the client's overview, each with its sentence and its numbers as a table. */
export default function ClientCharts({ clientId, locale, timeZone, currentIsoWeek, compact = false }: { clientId: string; locale: string; timeZone: string; currentIsoWeek: string; compact?: boolean }) {
  // Half a year of sessions: the charts stay readable and the answer the same size after years of riding.
  const [trends, reloadTrends] = useApi<TrendsData>(`/api/clients/${clientId}/trends?weeks=${TREND_WEEKS}`);
  const [adherence, reloadAdherence] = useApi<AdherenceData>(`/api/clients/${clientId}/adherence?weeks=12`);
  useOnProgramChange(reloadTrends);
  useOnProgramChange(reloadAdherence);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Loaded value={trends} reload={reloadTrends} label="the session trends">
        {(t) =>
          t.sessions.length ? (
            <Suspense fallback={drawing}>
              <TrendCharts trends={t} locale={locale} timeZone={timeZone} compact={compact} />
            </Suspense>
          ) : (
            <div className="lg:col-span-2">
              <EmptyState title="No sessions yet">Power, session length and current per watt are charted here once ride files come in.</EmptyState>
            </div>
          )
        }
      </Loaded>
      <Loaded value={adherence} reload={reloadAdherence} label="the weekly sessions">
        {(a) => (
          <Suspense fallback={drawing}>
            <WeeksChart adherence={a} locale={locale} currentIsoWeek={currentIsoWeek} compact={compact} />
          </Suspense>
        )}
      </Loaded>
    </div>
  );
}
