import type { CareStatus } from '../../lib/care/care-status';
import { READINESS_LABELS, type Readiness } from '../../lib/care/readiness';
import { AD_PLAN_TEXT } from '../../lib/checks/safety-text';

// Each state has its own words and a shape as well as a colour, so no one needs the colour to tell them apart.
const TONE: Record<Readiness, string> = {
  not_screened: 'border-ochre bg-ochre-tint text-ochre',
  screened_concerns: 'border-ochre bg-ochre-tint text-ochre',
  awaiting_clearance: 'border-ochre bg-ochre-tint text-ochre',
  cleared: 'border-moss bg-moss-tint text-moss',
  clearance_due: 'border-slate bg-slate-tint text-slate',
  clearance_expired: 'border-brick bg-brick-tint text-brick',
};

export function ReadinessChip({ readiness }: { readiness: Readiness }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2.5 py-0.5 text-sm font-medium ${TONE[readiness]}`} data-testid="readiness">
      <span aria-hidden="true">{readiness === 'cleared' ? '✓' : readiness === 'clearance_expired' ? '!' : '•'}</span>
      {READINESS_LABELS[readiness]}
    </span>
  );
}

/** Readiness, "no plan on file" and a baseline to record, for a row of triage or the caseload. */
export function CareBadges({ care }: { care: CareStatus }) {
  return (
    <span className="flex flex-wrap gap-1.5">
      <ReadinessChip readiness={care.readiness} />
      {care.noPlanOnFile && (
        <span className="inline-flex items-center rounded-full border border-brick px-2.5 py-0.5 text-sm font-medium text-brick" data-testid="no-plan">
          {AD_PLAN_TEXT.noPlan}
        </span>
      )}
      {care.baselineNeeded && (
        <span className="inline-flex items-center rounded-full border border-slate px-2.5 py-0.5 text-sm font-medium text-slate" data-testid="baseline-needed">
          Record a baseline blood pressure
        </span>
      )}
    </span>
  );
}
