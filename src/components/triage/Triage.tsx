import type { SortingState } from '@tanstack/react-table';
import { useCallback, useMemo, useRef, useState } from 'react';
import { useApi } from '../api';
import { Button } from '../ui/Button';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import { ClientTable } from './ClientTable';
import { filterRows, isFiltering, NO_FILTER, type RowFilter } from './filter';
import { FlagActionDialog, type ActionTarget } from './FlagActionDialog';
import { FlagFilters } from './FlagFilters';
import { TriageFlags } from './TriageFlags';
import type { ClientRow, FlagItem } from './types';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The therapist's home: every client with open flags, and what to do about each flag. */
export default function Triage({ locale }: { locale: string }) {
  const [value, reload] = useApi<ClientRow[]>('/api/triage');
  const [filter, setFilter] = useState<RowFilter>(NO_FILTER);
  const [sorting, setSorting] = useState<SortingState>([{ id: 'flags', desc: false }]);
  const [target, setTarget] = useState<ActionTarget | null>(null);
  const [message, setMessage] = useState('');
  const opener = useRef<HTMLElement | null>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  const rows = value.state === 'ready' ? value.data : null;
  const now = useMemo(() => new Date(), [rows]);

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
    reload();
    // The button that opened the dialog leaves with its flag; the list heading stays.
    heading.current?.focus();
  }

  return (
    <div className="space-y-4">
      <div role="status" aria-live="polite">
        {message && (
          <p className="rounded-lg border-l-4 border-moss bg-moss-tint px-4 py-3" data-testid="triage-message">
            {message}
          </p>
        )}
      </div>
      <Loaded value={value} reload={reload} label="the flagged clients">
        {(all) => {
          const visible = filterRows(all, filter);
          const flags = all.reduce((n, r) => n + r.flags.length, 0);
          return (
            <section aria-labelledby="triage-list" className="space-y-4">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <h2 id="triage-list" ref={heading} tabIndex={-1} className="text-xl">
                  Clients with open flags
                </h2>
                <p className="text-ink-soft" aria-live="polite">
                  {isFiltering(filter)
                    ? `Showing ${plural(visible.length, 'client', 'clients')} of ${all.length}`
                    : `${plural(all.length, 'client', 'clients')}, ${plural(flags, 'open flag', 'open flags')}`}
                </p>
              </div>
              {all.length === 0 ? (
                <EmptyState title="No flags to review">
                  <p>
                    No client has an open flag right now. Kinloop can only judge the ride files and checks it has received, and snoozed flags come back on their date. The whole
                    caseload is on <a href="/clients">Clients</a>.
                  </p>
                </EmptyState>
              ) : (
                <>
                  <FlagFilters rows={all} filter={filter} onChange={setFilter} byFlag />
                  {visible.length ? (
                    <ClientTable caption="Clients with open flags, most urgent first" rows={visible} renderFlags={renderFlags} sorting={sorting} onSortingChange={setSorting} locale={locale} />
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
          );
        }}
      </Loaded>
      <FlagActionDialog target={target} locale={locale} onDone={done} onCancel={cancelled} />
    </div>
  );
}
