import type { SortingState } from '@tanstack/react-table';
import { useCallback, useMemo, useRef, useState } from 'react';
import { isFiltering, NO_FILTER, type RowFilter } from './filter';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { ClientTable } from './ClientTable';
import { FlagActionDialog, type ActionTarget } from './FlagActionDialog';
import { FlagFilters } from './FlagFilters';
import { firstPage, usePagedRows } from './paged';
import { ShowMore } from './ShowMore';
import { TriageFlags } from './TriageFlags';
import type { ClientRow, FlagItem } from './types';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The therapist's home: every client with open flags, and what to do about each flag. */
export default function Triage({ locale }: { locale: string }) {
  const [filter, setFilter] = useState<RowFilter>(NO_FILTER);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'flags', desc: false }]);
  const list = usePagedRows('/api/triage', filter, sorting);
  const [target, setTarget] = useState<ActionTarget | null>(null);
  const [message, setMessage] = useState('');
  const opener = useRef<HTMLElement | null>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  const now = useMemo(() => new Date(), [list.rows]);

  const onAct = useCallback(
    (row: ClientRow) => (flag: FlagItem) => {
      opener.current = document.activeElement as HTMLElement | null;
      setTarget({ flag, clientName: row.clientName, timeZone: row.timeZone });
    },
    [],
  );
  const renderFlags = useCallback((row: ClientRow) => <TriageFlags row={row} now={now} locale={locale} onAct={onAct(row)} />, [now, locale, onAct]);

  function cancelled() {
    setTarget(null);
    opener.current?.focus();
  }
  function done(text: string) {
    setTarget(null);
    setMessage(text);
    list.reload();
    // The button that opened the dialog leaves with its flag; the list heading stays.
    heading.current?.focus();
  }

  const value = firstPage(list);
  return (
    <div className="space-y-4">
      <div role="status" aria-live="polite">
        {message && (
          <p className="rounded-lg border-l-4 border-moss bg-moss-tint px-4 py-3" data-testid="triage-message">
            {message}
          </p>
        )}
      </div>
      <Loaded value={value} reload={list.reload} label="the flagged clients">
        {(page) => (
          <section aria-labelledby="triage-list" className="space-y-4">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="triage-list" ref={heading} tabIndex={-1} className="text-xl">
                Clients with open flags
              </h2>
              <p className="text-ink-soft" aria-live="polite">
                {isFiltering(filter)
                  ? `${plural(page.total, 'client matches', 'clients match')} of ${page.all.clients}`
                  : `${plural(page.all.clients, 'client', 'clients')}, ${plural(page.all.flags, 'open flag', 'open flags')}`}
              </p>
            </div>
            {page.all.clients === 0 ? (
              <EmptyState title="No flags to review">
                <p>
                  No client has an open flag right now. Kinloop can only judge the ride files and checks it has received, and snoozed flags come back on their date. The whole
                  caseload is on <a href="/clients">Clients</a>.
                </p>
              </EmptyState>
            ) : (
              <>
                <FlagFilters counts={page.all} filter={filter} onChange={setFilter} byFlag />
                {list.rows.length ? (
                  <>
                    <ClientTable caption="Clients with open flags, most urgent first" rows={list.rows} renderFlags={renderFlags} sorting={sorting} onSortingChange={setSorting} locale={locale} />
                    <ShowMore list={list} noun="clients" />
                  </>
                ) : (
                  <EmptyState title="No flags match these filters">
                    <Button variant="secondary" className="mt-2" onClick={() => setFilter(NO_FILTER)}>
                      Show all flags
                    </Button>
                  </EmptyState>
                )}
              </>
            )}
          </section>
        )}
      </Loaded>
      <FlagActionDialog target={target} locale={locale} onDone={done} onCancel={cancelled} />
    </div>
  );
}
