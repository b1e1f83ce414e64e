import { forwardRef } from 'react';
import { AD_SAFETY_PANEL } from '../../lib/checks/safety-text';
import { Alert } from '../ui/Alert';
import type { EvaluationView } from './types';

export interface Outcome {
  clientName: string;
  self: boolean;
  evaluation: EvaluationView;
}

/**
 * What a saved check means, shown at once: the safety panel when the check
 * shows possible autonomic dysreflexia, and calmly, what the clinic will
 * review. The ref goes to the first heading so focus can be moved there.
 */
export const CheckOutcome = forwardRef<HTMLHeadingElement, { outcome: Outcome }>(function CheckOutcome({ outcome }, ref) {
  const { evaluation } = outcome;
  const urgent = evaluation.conditions.filter((c) => c.severity === 'urgent');
  const review = evaluation.conditions.filter((c) => c.severity !== 'urgent');
  return (
    <div className="space-y-4" data-testid="check-outcome">
      {evaluation.showSafetyPanel ? (
        <SafetyPanel ref={ref} reasons={urgent.map((c) => c.reason)} alerted={urgent.length > 0} />
      ) : (
        <div className="rounded-lg border-l-4 border-moss bg-moss-tint px-4 py-3" role="status">
          <h2 ref={ref} tabIndex={-1} className="text-lg">
            {outcome.self ? 'Thank you — your check is saved' : `Check saved for ${outcome.clientName}`}
          </h2>
          {!review.length && <p className="mt-1">Nothing in it needs the clinic’s attention.</p>}
        </div>
      )}
      {review.length > 0 && (
        <Alert tone="caution" title="The clinic will review:">
          <ul className="list-disc space-y-1 pl-6">
            {review.map((c) => (
              <li key={c.kind + c.reason}>{c.reason}</li>
            ))}
          </ul>
          <p className="mt-2">A therapist will look at this; there is nothing more to do now unless something changes.</p>
        </Alert>
      )}
      {evaluation.notes.length > 0 && (
        <Alert tone="info">
          <ul className="space-y-1">
            {evaluation.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </Alert>
      )}
    </div>
  );
});

const SafetyPanel = forwardRef<HTMLHeadingElement, { reasons: string[]; alerted: boolean }>(function SafetyPanel({ reasons, alerted }, ref) {
  return (
    <section role="alert" aria-labelledby="safety-panel-h" className="space-y-4 rounded-xl border-4 border-brick bg-brick-tint p-5" data-testid="safety-panel">
      <div className="flex items-start gap-3">
        <svg aria-hidden="true" width="40" height="40" viewBox="0 0 24 24" className="shrink-0 text-brick">
          <path d="M12 2.5 1.5 21h21z" fill="currentColor" />
          <path d="M12 9v6" stroke="#fff" strokeWidth="2.4" strokeLinecap="round" />
          <circle cx="12" cy="18" r="1.4" fill="#fff" />
        </svg>
        <h2 id="safety-panel-h" ref={ref} tabIndex={-1} className="text-2xl text-brick">
          {AD_SAFETY_PANEL.title}
        </h2>
      </div>
      <p className="text-lg">{AD_SAFETY_PANEL.intro}</p>
      <ol className="list-decimal space-y-2 pl-8 text-lg font-medium">
        {AD_SAFETY_PANEL.steps.map((step) => (
          <li key={step}>{step}</li>
        ))}
      </ol>
      <p>{AD_SAFETY_PANEL.closing}</p>
      <div className="space-y-2 rounded-lg border-2 border-brick/40 bg-surface p-4">
        {alerted ? (
          <>
            <p className="font-semibold">{AD_SAFETY_PANEL.alerted[0]}</p>
            <p>{AD_SAFETY_PANEL.alerted[1]}</p>
          </>
        ) : (
          <p className="font-semibold">{AD_SAFETY_PANEL.notAlerted}</p>
        )}
        {reasons.map((r) => (
          <p key={r}>
            <span className="font-semibold">What the check showed: </span>
            {r}
          </p>
        ))}
      </div>
    </section>
  );
});
