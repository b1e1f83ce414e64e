import { lazy, Suspense } from 'react';
import { ChannelTable, SessionFigures } from './SessionFigures';
import type { SessionData } from './types';

// chart.js and the series come only with the charts (SessionCharts.tsx).
const SessionCharts = lazy(() => import('./SessionCharts'));

/** One session: headline figures, the two charts with their tables, the channels and the import warnings. */
export default function SessionView({ session, hasSeries, startedLabel, timeZone }: { session: Omit<SessionData, 'series'>; hasSeries: boolean; startedLabel: string; timeZone: string }) {
  const { summary } = session;
  return (
    <div className="space-y-8">
      <section aria-labelledby="figures-h" className="space-y-3">
        <h2 id="figures-h" className="text-xl">
          Figures
        </h2>
        <SessionFigures summary={summary} startedLabel={startedLabel} timeZone={timeZone} startedAtSource={session.startedAtSource} />
      </section>

      {hasSeries ? (
        <Suspense fallback={<p role="status" className="py-6 text-ink-soft">Loading the charts…</p>}>
          <SessionCharts sessionId={session.id} durationS={summary.durationS} samples={summary.samples} />
        </Suspense>
      ) : (
        <p className="text-ink-soft">The samples of this session are not stored, so there are no charts; the figures above still apply.</p>
      )}

      {/* Without channels the current chart already says so; say it once. */}
      {(Object.keys(summary.channels).length > 0 || !hasSeries) && (
        <section aria-labelledby="channels-h" className="space-y-3">
          <h2 id="channels-h" className="text-xl">
            Channels
          </h2>
          <ChannelTable channels={summary.channels} />
        </section>
      )}

      <section aria-labelledby="warnings-h" className="space-y-3">
        <h2 id="warnings-h" className="text-xl">
          Import warnings
        </h2>
        {summary.warnings.length ? (
          <ul className="list-disc space-y-1 pl-6">
            {summary.warnings.map((w, i) => (
              <li key={i}>{w}</li>
            ))}
          </ul>
        ) : (
          <p className="text-ink-soft">None: every row of the ride file was read as it was written.</p>
        )}
      </section>
    </div>
  );
}
