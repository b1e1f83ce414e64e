import { Button } from '../ui/Button';
import { FLAG_KIND_WORDS } from '../../lib/flags/words';
import { longDate, openFor } from './relative-time';
import { SeverityChip } from './SeverityChip';
import type { ClientRow, FlagAction, FlagItem } from './types';

const ACTIONS: { action: FlagAction; label: string }[] = [
  { action: 'acknowledge', label: 'Acknowledge' },
  { action: 'snooze', label: 'Snooze' },
  { action: 'resolve', label: 'Resolve' },
];

/** A client's open flags, each with its reason, age and the three actions. */
export function TriageFlags({ row, now, onAction }: { row: ClientRow; now: Date; onAction: (flag: FlagItem, action: FlagAction) => void }) {
  return (
    <ul className="space-y-3 lg:min-w-[22rem]" aria-label={`Open flags for ${row.clientName}`}>
      {row.flags.map((flag) => {
        const kind = FLAG_KIND_WORDS[flag.kind];
        return (
          <li key={flag.id} data-testid="flag" data-severity={flag.severity} data-kind={flag.kind} className="rounded-lg border border-line bg-surface p-3">
            <p className="flex flex-wrap items-center gap-x-2 gap-y-1">
              <SeverityChip severity={flag.severity} />
              <span className="font-semibold">{kind}</span>
              <time className="text-sm text-ink-soft" dateTime={flag.raisedAt} title={longDate(flag.raisedAt)}>
                {openFor(flag.raisedAt, now)}
              </time>
            </p>
            <p className="mt-1">{flag.reason}</p>
            {flag.clearedAt && (
              <p className="mt-1 text-sm text-ink-soft">
                The condition has not held since {longDate(flag.clearedAt)}; the flag stays open until you act on it.
              </p>
            )}
            <div className="mt-2 flex flex-wrap gap-2">
              {ACTIONS.map(({ action, label }) => (
                <Button key={action} variant="secondary" className="px-4" onClick={() => onAction(flag, action)}>
                  {label}
                  <span className="sr-only">
                    {' '}
                    {kind} flag for {row.clientName}
                  </span>
                </Button>
              ))}
              <a href={`/messages?clientId=${row.clientId}&flag=${flag.id}`} className="btn btn-secondary px-4">
                Contact the rider
                <span className="sr-only">
                  {' '}
                  about the {kind} flag of {row.clientName}
                </span>
              </a>
            </div>
          </li>
        );
      })}
    </ul>
  );
}
