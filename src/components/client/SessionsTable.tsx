import { createColumnHelper } from '@tanstack/react-table';
import { useCallback, useEffect, useMemo, useState } from 'react';
import { api, ApiError } from '../api';
import { distance, milliampsPerWatt, minutes, number, watts } from '../../lib/format/numbers';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { DataTable } from '../ui/DataTable';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import type { Loadable } from '../api';
import { formatInstantDate, formatTime } from '../../lib/time/format';
import type { SessionRow, SessionsPage } from './types';

const col = createColumnHelper<SessionRow>();

/** The client's sessions, newest first, fifty at a time; the overview shows the latest few and links to the rest. */
export default function SessionsTable({ clientId, locale, timeZone, pageSize = 50, more = true }: { clientId: string; locale: string; timeZone: string; pageSize?: number; more?: boolean }) {
  const [first, setFirst] = useState<Loadable<null>>({ state: 'loading' });
  const [rows, setRows] = useState<SessionRow[]>([]);
  const [nextBefore, setNextBefore] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [moreError, setMoreError] = useState<ApiError | null>(null);

  const load = useCallback(
    async (before: string | null) => {
      const query = new URLSearchParams({ limit: String(pageSize), ...(before ? { before } : {}) });
      const page = await api<SessionsPage>('GET', `/api/clients/${clientId}/sessions?${query}`);
      setRows((r) => (before ? [...r, ...page.sessions] : page.sessions));
      setNextBefore(page.nextBefore);
    },
    [clientId, pageSize],
  );
  const loadFirst = useCallback(() => {
    load(null).then(
      () => setFirst({ state: 'ready', data: null }),
      (error: ApiError) => setFirst({ state: 'error', error }),
    );
  }, [load]);
  useEffect(loadFirst, [loadFirst]);

  async function loadOlder() {
    setBusy(true);
    setMoreError(null);
    try {
      await load(nextBefore);
    } catch (err) {
      setMoreError(err as ApiError);
    } finally {
      setBusy(false);
    }
  }

  const columns = useMemo(
    () => [
      col.accessor('startedAt', {
        header: 'Started',
        cell: (c) => (
          <a href={`/sessions/${c.row.original.id}`} className="inline-flex min-h-11 flex-col justify-center font-semibold whitespace-nowrap">
            <span>{formatInstantDate(c.getValue(), locale, timeZone, 'day')}</span>
            <span className="font-normal">{formatTime(c.getValue(), locale, timeZone)}</span>
          </a>
        ),
      }),
      col.accessor((s) => s.summary.durationS, { id: 'duration', header: 'Duration', cell: (c) => minutes(c.getValue(), locale) }),
      col.accessor((s) => s.summary.activeS, { id: 'active', header: 'Active', cell: (c) => minutes(c.getValue(), locale) }),
      col.accessor((s) => s.summary.meanPowerW, { id: 'power', header: 'Mean power', cell: (c) => watts(c.getValue(), locale) }),
      col.accessor((s) => s.summary.peakPower5sW, { id: 'peak', header: '5-s peak', cell: (c) => watts(c.getValue(), locale) }),
      col.accessor((s) => s.summary.distanceM, { id: 'distance', header: 'Distance', cell: (c) => distance(c.getValue(), locale) }),
      col.accessor((s) => s.summary.currentPerWattMaPerW, { id: 'cpw', header: 'Current per watt', cell: (c) => milliampsPerWatt(c.getValue(), locale) }),
    ],
    [locale, timeZone],
  );

  return (
    <Loaded value={first} reload={loadFirst} label="the sessions">
      {() => (
        <div className="space-y-3">
          <DataTable
            caption={more ? 'Sessions, newest first' : 'Latest sessions, newest first'}
            columns={columns}
            data={rows}
            rowKey={(s) => s.id}
            initialSort={[{ id: 'startedAt', desc: true }]}
            empty={<EmptyState title="No sessions yet">Sessions appear here once the client’s ride files are uploaded.</EmptyState>}
          />
          {more && (
            <p className="text-sm text-ink-soft" role="status">
              Showing {number(rows.length, 0, locale)} {rows.length === 1 ? 'session' : 'sessions'}
              {nextBefore ? '; older ones can be loaded below.' : rows.length ? ', all there are.' : '.'}
            </p>
          )}
          {moreError && (
            <Alert tone="danger" live>
              {moreError.message}
            </Alert>
          )}
          {more && nextBefore && (
            <Button variant="secondary" busy={busy} onClick={loadOlder}>
              Load older sessions
            </Button>
          )}
        </div>
      )}
    </Loaded>
  );
}
