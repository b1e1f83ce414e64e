import type { FlagSeverity } from '../../lib/flags/types';
import { FLAG_SEVERITY_WORDS } from '../../lib/flags/words';

// Severity is told by word and shape (triangle, circle, square), colour only adds to it.
const TONE: Record<FlagSeverity, string> = {
  urgent: 'border-brick bg-brick-tint text-brick',
  review: 'border-ochre bg-ochre-tint text-ochre',
  info: 'border-slate bg-slate-tint text-slate',
};

export function SeverityIcon({ severity }: { severity: FlagSeverity }) {
  return (
    <svg aria-hidden="true" width="16" height="16" viewBox="0 0 16 16" className="shrink-0">
      {severity === 'urgent' && (
        <>
          <path d="M8 1.5 15 14H1z" fill="currentColor" />
          <path d="M8 6v3.5M8 11.5v.5" stroke="#fff" strokeWidth="1.8" strokeLinecap="round" />
        </>
      )}
      {severity === 'review' && <circle cx="8" cy="8" r="6" fill="none" stroke="currentColor" strokeWidth="2.4" />}
      {severity === 'info' && <rect x="2.5" y="2.5" width="11" height="11" rx="1" fill="none" stroke="currentColor" strokeWidth="2" />}
    </svg>
  );
}

/** "Urgent", or with a count "2 urgent". */
export function SeverityChip({ severity, count }: { severity: FlagSeverity; count?: number }) {
  const word = FLAG_SEVERITY_WORDS[severity];
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap ${TONE[severity]}`}>
      <SeverityIcon severity={severity} />
      {count === undefined ? word : `${count} ${word.toLowerCase()}`}
    </span>
  );
}
