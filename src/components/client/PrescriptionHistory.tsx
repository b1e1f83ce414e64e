import { formatDate, formatDateTime } from '../../lib/time/format';
import { versionChanges } from './prescription-wording';
import type { PrescriptionData } from './types';

/** Every version, newest first, with who saved it and what it changed from the one before. */
export function PrescriptionHistory({ data, locale, timeZone }: { data: PrescriptionData; locale: string; timeZone: string }) {
  const { history, current } = data;
  const upcoming = new Set(data.upcoming.map((u) => u.id));
  return (
    <ol className="space-y-3" aria-label="Prescription versions, newest first">
      {history.map((v, i) => (
        <li key={v.id} className="rounded-lg border border-line bg-surface p-4">
          <p className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <span className="font-semibold">Version {v.version}</span>
            <span>from {formatDate(v.effectiveFrom, locale, 'day')}</span>
            {v.id === current?.id && <span className="rounded-full border border-lagoon bg-lagoon-tint px-3 py-0.5 text-sm font-semibold text-lagoon-dark">In effect</span>}
            {upcoming.has(v.id) && <span className="rounded-full border border-slate bg-slate-tint px-3 py-0.5 text-sm font-semibold text-slate">Starts later</span>}
          </p>
          <p className="text-sm text-ink-soft">
            Saved by {v.createdBy.name ?? 'a former staff member'} on {formatDateTime(v.createdAt, locale, timeZone, 'day')}
          </p>
          <ul className="mt-2 list-disc space-y-0.5 pl-6">
            {versionChanges(history[i + 1], v).map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </li>
      ))}
    </ol>
  );
}
