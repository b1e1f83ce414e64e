import type { SortingState } from '@tanstack/react-table';
import { useCallback, useState } from 'react';
import { NO_FILTER, type RowFilter } from '../triage/filter';
import { Button } from '../ui/Button';
import CautionBanner from '../ui/CautionBanner';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { ClientTable } from '../triage/ClientTable';
import { FlagFilters } from '../triage/FlagFilters';
import { FlagSummary } from '../triage/FlagSummary';
import { firstPage, usePagedRows } from '../triage/paged';
import { ShowMore } from '../triage/ShowMore';
import type { ClientRow } from '../triage/types';

/** The staff caseload: every client of the clinic with their open flags and figures. */
export default function Caseload({ locale }: { locale: string }) {
  const [filter, setFilter] = useState<RowFilter>(NO_FILTER);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'client', desc: false }]);
  const list = usePagedRows('/api/caseload', filter, sorting);
  const renderFlags = useCallback((row: ClientRow) => <FlagSummary row={row} />, []);
  const value = firstPage(list);
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
      <Loaded value={value} reload={list.reload} label="the caseload">
        {(page) => {
          if (!page.all.clients) {
            return (
              <EmptyState title="No clients yet">
                <p>Clients appear here once they are added to your clinic.</p>
              </EmptyState>
            );
          }
          return (
            <section aria-labelledby="caseload-list" className="space-y-4">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <h2 id="caseload-list" className="text-xl">
                  Caseload
                </h2>
                <p className="text-ink-soft" aria-live="polite">
                  {page.total === page.all.clients ? `${page.all.clients} ${page.all.clients === 1 ? 'client' : 'clients'}` : `${page.total} of ${page.all.clients} clients match`}
                </p>
              </div>
              <FlagFilters counts={page.all} filter={filter} onChange={setFilter} byFlag={false} />
              {list.rows.length ? (
                <>
                  <ClientTable caption="Caseload" rows={list.rows} renderFlags={renderFlags} sorting={sorting} onSortingChange={setSorting} locale={locale} />
                  <ShowMore list={list} noun="clients" />
                </>
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
