import { FLAG_KIND_WORDS } from '../../lib/flags/words';
import { flagReason } from '../../lib/flags/reason';
import { formatInstantDate, openFor } from '../../lib/time/format';
import { Button } from '../ui/Button';
import { SeverityChip } from './SeverityChip';
import type { ClientRow, FlagItem } from './types';

/**
 * A client's open flags, each with its reason, age and one button that opens
 * the choice of acknowledging, snoozing or resolving it. The button's visible
 * words name the flag and the client, so a voice user can say which one.
 */
export function TriageFlags({ row, now, locale, onAct }: { row: ClientRow; now: Date; locale: string; onAct: (flag: FlagItem) => void }) {
  return (
    <ul className="space-y-3 lg:min-w-[22rem]" aria-label={`Open flags for ${row.clientName}`}>
      {row.flags.map((flag) => {
        const kind = FLAG_KIND_WORDS[flag.kind];
        return (
          <li key={flag.id} data-testid="flag" data-severity={flag.severity} data-kind={flag.kind} className="rounded-lg border border-line bg-surface p-3">
            <p className="flex flex-wrap items-center gap-x-2 gap-y-1">
              <SeverityChip severity={flag.severity} />
              <span className="font-semibold">{kind}</span>
              <time className="text-sm text-ink-soft" dateTime={flag.raisedAt} title={formatInstantDate(flag.raisedAt, locale, row.timeZone, 'dayLong')}>
                {openFor(flag.raisedAt, now, row.timeZone)}
              </time>
            </p>
            <p className="mt-1">{flagReason(flag, locale)}</p>
            {flag.clearedAt && (
              <p className="mt-1 text-sm text-ink-soft">
                The condition has not held since {formatInstantDate(flag.clearedAt, locale, row.timeZone, 'dayLong')}; the flag stays open until you act on it.
              </p>
            )}
            <Button variant="secondary" className="mt-2 px-4 text-left" onClick={() => onAct(flag)}>
              Act on {kind.toLowerCase()} for {row.clientName}
            </Button>
          </li>
        );
      })}
    </ul>
  );
}
