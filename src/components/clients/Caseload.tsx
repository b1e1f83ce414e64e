import type { SortingState } from '@tanstack/react-table';
import { useCallback, useState } from 'react';
import { useApi } from '../api';
import { Button } from '../ui/Button';
import CautionBanner from '../ui/CautionBanner';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { ClientTable } from '../triage/ClientTable';
import { filterRows, NO_FILTER, type RowFilter } from '../triage/filter';
import { FlagFilters } from '../triage/FlagFilters';
import { FlagSummary } from '../triage/FlagSummary';
import type { ClientRow } from '../triage/types';

/** The staff caseload: every client of the clinic with their open flags and figures. */
export default function Caseload({ locale }: { locale: string }) {
  const [value, reload] = useApi<{ clients: ClientRow[] }>('/api/caseload');
  const [filter, setFilter] = useState<RowFilter>(NO_FILTER);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'client', desc: false }]);
  const renderFlags = useCallback((row: ClientRow) => <FlagSummary row={row} />, []);
  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="max-w-prose text-ink-soft">
          Everyone in your clinic’s home program. Open flags are counted here; <a href="/triage">Triage</a> lists each one with what to do about it.
        </p>
        <a href="/clients/new" className="btn btn-primary">
          Add a client
        </a>
      </div>
      <CautionBanner compact />
      <Loaded value={value} reload={reload} label="the caseload">
        {({ clients }) => {
          if (!clients.length) {
            return (
              <EmptyState title="No clients yet">
                <p>Clients appear here once they are added to your clinic.</p>
              </EmptyState>
            );
          }
          const visible = filterRows(clients, filter);
          return (
            <section aria-labelledby="caseload-list" className="space-y-4">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <h2 id="caseload-list" className="text-xl">
                  Caseload
                </h2>
                <p className="text-ink-soft" aria-live="polite">
                  {visible.length === clients.length ? `${clients.length} ${clients.length === 1 ? 'client' : 'clients'}` : `Showing ${visible.length} of ${clients.length} clients`}
                </p>
              </div>
              <FlagFilters rows={clients} filter={filter} onChange={setFilter} byFlag={false} />
              {visible.length ? (
                <ClientTable caption="Caseload" rows={visible} renderFlags={renderFlags} sorting={sorting} onSortingChange={setSorting} locale={locale} />
              ) : (
                <EmptyState title="No client matches that name">
                  <Button variant="secondary" className="mt-2" onClick={() => setFilter(NO_FILTER)}>
                    Show every client
                  </Button>
                </EmptyState>
              )}
            </section>
          );
        }}
      </Loaded>
    </div>
  );
}
