import { FLAG_SEVERITIES } from '../../lib/flags/types';
import { FLAG_KIND_WORDS } from '../../lib/flags/words';
import { SeverityChip } from './SeverityChip';
import type { ClientRow } from './types';

/** A client's open flags counted by severity, with the kinds in words; triage has the detail. */
export function FlagSummary({ row }: { row: ClientRow }) {
  if (!row.flags.length) {
    return (
      <span className="inline-flex items-center gap-1.5 text-ink-soft">
        <svg aria-hidden="true" width="16" height="16" viewBox="0 0 16 16" className="text-moss">
          <path d="m3 8.5 3 3 7-7" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        No open flags
      </span>
    );
  }
  return (
    <ul className="space-y-1.5">
      {FLAG_SEVERITIES.map((severity) => {
        const flags = row.flags.filter((f) => f.severity === severity);
        if (!flags.length) return null;
        return (
          <li key={severity} className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <SeverityChip severity={severity} count={flags.length} />
            <span>{[...new Set(flags.map((f) => FLAG_KIND_WORDS[f.kind]))].join(', ')}</span>
          </li>
        );
      })}
    </ul>
  );
}
