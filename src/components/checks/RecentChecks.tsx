import { useEffect, useState } from 'react';
import { AD_SYMPTOM_LABELS, joinList, OTHER_EVENT_LABELS, SKIN_STATE_LABELS, siteLabel } from '../../lib/checks/labels';
import { useApi } from '../api';
import { formatDateTime } from '../../lib/time/format';
import { EmptyState } from '../ui/EmptyState';
import { Loaded } from '../ui/Loading';
import type { RecentCheck } from './types';
import { capitalise } from '../../lib/format/words';
import { FLAG_KIND_WORDS, FLAG_SEVERITY_WORDS } from '../../lib/flags/words';
import type { FlagKind, FlagSeverity } from '../../lib/flags/types';
import { readingLine } from './words';

const FIRST_SHOWN = 5;

/** The client's latest checks, newest first; `version` changes after a save so the list reloads. */
export function RecentChecks({ clientId, clientName, self, timeZone, locale, version }: { clientId: string; clientName: string; self: boolean; timeZone: string; locale: string; version: number }) {
  const [checks, reload] = useApi<{ checks: RecentCheck[] }>(`/api/clients/${clientId}/checks`);
  const [showAll, setShowAll] = useState(false);
  useEffect(() => {
    if (version > 0) reload();
  }, [version, reload]);
  return (
    <Loaded value={checks} reload={reload} label="the recent checks">
      {({ checks }) => {
        if (!checks.length) return <EmptyState title="No checks recorded yet">{self ? 'Your checks will be listed here once you save one.' : `Checks recorded for ${clientName} will be listed here.`}</EmptyState>;
        const shown = showAll ? checks : checks.slice(0, FIRST_SHOWN);
        return (
          <div className="space-y-3">
            <ol className="space-y-3" data-testid="recent-checks">
              {shown.map((c) => (
                <CheckItem key={c.id} check={c} timeZone={timeZone} locale={locale} />
              ))}
            </ol>
            {checks.length > FIRST_SHOWN && (
              <button type="button" className="btn btn-secondary" onClick={() => setShowAll((v) => !v)} aria-expanded={showAll}>
                {showAll ? `Show the latest ${FIRST_SHOWN} only` : `Show all ${checks.length} checks`}
              </button>
            )}
          </div>
        );
      }}
    </Loaded>
  );
}

function CheckItem({ check, timeZone, locale }: { check: RecentCheck; timeZone: string; locale: string }) {
  const rows: { label: string; value: string }[] = [];
  const add = (label: string, value: string | null) => value && rows.push({ label, value });
  add('Before the ride', readingLine(check.bpBefore, check.heartRateBefore));
  add('During the ride', readingLine(check.bpDuring, null));
  add('After the ride', readingLine(check.bpAfter, check.heartRateAfter, check.bpAfterMinutes));
  add('Warning signs', check.adSymptoms.length ? capitalise(joinList(check.adSymptoms.map((s) => AD_SYMPTOM_LABELS[s]))) : null);
  add('Other events', check.otherEvents.length ? capitalise(joinList(check.otherEvents.map((e) => OTHER_EVENT_LABELS[e]))) : null);
  const skinIssues = check.skin.filter((s) => s.state !== 'normal');
  add(
    'Skin',
    check.skin.length
      ? skinIssues.length
        ? capitalise(joinList(skinIssues.map((s) => `${SKIN_STATE_LABELS[s.state]} at the ${siteLabel(s.site)} site`)))
        : `Normal at all ${check.skin.length} ${check.skin.length === 1 ? 'site' : 'sites'} checked`
      : null,
  );
  add('Effort', check.effort ? `${check.effort} of 10` : null);
  add('Comment', check.comment ?? null);
  const conditions = check.evaluation?.conditions ?? [];
  return (
    <li className="card space-y-2" data-testid="recent-check">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-lg">{formatDateTime(check.takenAt, locale, timeZone, 'weekdayDayMonth')}</h3>
        {check.recordedBy?.name && <p className="text-sm text-ink-soft">Recorded by {check.recordedBy.name}</p>}
      </div>
      {conditions.length > 0 && (
        <ul className="flex flex-wrap gap-2">
          {conditions.map((c) => (
            <li
              key={c.kind}
              className={`inline-flex items-center gap-1 rounded-full border px-3 py-1 text-sm font-semibold ${c.severity === 'urgent' ? 'border-brick bg-brick-tint text-brick' : 'border-ochre bg-ochre-tint text-ochre'}`}
            >
              <span aria-hidden="true">{c.severity === 'urgent' ? '▲' : '●'}</span>
              {FLAG_SEVERITY_WORDS[c.severity as FlagSeverity] ?? c.severity}: {FLAG_KIND_WORDS[c.kind as FlagKind] ?? c.kind}
            </li>
          ))}
        </ul>
      )}
      <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[12rem_1fr]">
        {rows.map((r) => (
          <div key={r.label} className="contents">
            <dt className="font-medium text-ink-soft">{r.label}</dt>
            <dd className="mb-1 whitespace-pre-line sm:mb-0">{r.value}</dd>
          </div>
        ))}
      </dl>
    </li>
  );
}
