import { useApi } from '../api';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { AdherenceChart } from './AdherenceChart';
import { useOnProgramChange } from './changes';
import { CurrentPerWattChart } from './CurrentPerWattChart';
import { DurationChart } from './DurationChart';
import { PowerChart } from './PowerChart';
import type { AdherenceData, TrendsData } from './types';

/** The four headline trends of the client's overview, each with its sentence and its numbers as a table. */
export default function ClientCharts({ clientId, locale, timeZone, currentIsoWeek, compact = false }: { clientId: string; locale: string; timeZone: string; currentIsoWeek: string; compact?: boolean }) {
  const [trends, reloadTrends] = useApi<TrendsData>(`/api/clients/${clientId}/trends`);
  const [adherence, reloadAdherence] = useApi<AdherenceData>(`/api/clients/${clientId}/adherence?weeks=12`);
  useOnProgramChange(reloadTrends);
  useOnProgramChange(reloadAdherence);
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Loaded value={trends} reload={reloadTrends} label="the session trends">
        {(t) =>
          t.sessions.length ? (
            <>
              <PowerChart trends={t} locale={locale} timeZone={timeZone} compact={compact} />
              <DurationChart trends={t} locale={locale} timeZone={timeZone} compact={compact} />
              <CurrentPerWattChart trends={t} locale={locale} timeZone={timeZone} compact={compact} />
            </>
          ) : (
            <div className="lg:col-span-2">
              <EmptyState title="No sessions yet">Power, session length and current per watt are charted here once ride files come in.</EmptyState>
            </div>
          )
        }
      </Loaded>
      <Loaded value={adherence} reload={reloadAdherence} label="the weekly sessions">
        {(a) => <AdherenceChart adherence={a} locale={locale} currentIsoWeek={currentIsoWeek} compact={compact} />}
      </Loaded>
    </div>
  );
}
