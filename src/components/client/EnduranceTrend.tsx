import { useApi } from '../api';
import { Loaded } from '../ui/Loading';
import { useOnProgramChange } from './changes';
import { EnduranceChart } from './EnduranceChart';
import type { TrendsData } from './types';

/** Power held to the end of each session, on the record's sessions view (the overview keeps its four headline trends). */
export default function EnduranceTrend({ clientId, locale, timeZone }: { clientId: string; locale: string; timeZone: string }) {
  const [trends, reload] = useApi<TrendsData>(`/api/clients/${clientId}/trends`);
  useOnProgramChange(reload);
  return (
    <Loaded value={trends} reload={reload} label="power held to the end">
      {(t) => (t.sessions.length ? <EnduranceChart trends={t} locale={locale} timeZone={timeZone} /> : null)}
    </Loaded>
  );
}
