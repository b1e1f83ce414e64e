import { AD_SAFETY_PANEL, GENERAL_CAUTION, SHORT_CAUTION } from '../../lib/checks/safety-text';

/**
 * The safety caution shown wherever flags, checks or prescriptions appear.
 * Rendered by React islands directly and by server pages through
 * CautionBanner.astro, so both say the same words.
 */
export default function CautionBanner({ compact = false }: { compact?: boolean }) {
  return (
    <div role="note" aria-label="Safety" className="rounded-lg border border-slate/40 border-l-4 border-l-slate bg-slate-tint px-4 py-3">
      <div className="flex gap-3">
        <svg aria-hidden="true" width="24" height="24" viewBox="0 0 24 24" className="mt-0.5 shrink-0 text-slate">
          <path d="M12 2 4 5v6c0 5 3.4 9.4 8 11 4.6-1.6 8-6 8-11V5z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
          <path d="M12 7v6M12 16.5v.5" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />
        </svg>
        <div className="min-w-0 space-y-1">
          {compact ? SHORT_CAUTION.map((line) => <p key={line}>{line}</p>) : <p>{GENERAL_CAUTION}</p>}
          <details className="group">
            <summary className="inline-flex min-h-12 cursor-pointer list-none items-center gap-2 rounded font-semibold text-lagoon-dark underline underline-offset-2 [&::-webkit-details-marker]:hidden">
              <svg aria-hidden="true" width="14" height="14" viewBox="0 0 14 14" className="shrink-0 transition-transform group-open:rotate-90">
                <path d="M4.5 2 9.5 7l-5 5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
              </svg>
              What to do if symptoms appear
            </summary>
            <div className="space-y-2 pb-1">
              <p className="font-semibold">{AD_SAFETY_PANEL.title}</p>
              <p>{AD_SAFETY_PANEL.intro}</p>
              <ol className="list-decimal space-y-1 pl-6">
                {AD_SAFETY_PANEL.steps.map((step) => (
                  <li key={step}>{step}</li>
                ))}
              </ol>
              <p>{AD_SAFETY_PANEL.closing}</p>
            </div>
          </details>
        </div>
      </div>
    </div>
  );
}
