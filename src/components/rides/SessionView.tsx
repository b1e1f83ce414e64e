import { CadencePowerChart } from './CadencePowerChart';
import { ChannelChart } from './ChannelChart';
import { ChannelTable, SessionFigures } from './SessionFigures';
import type { SessionData } from './types';

/** One session: headline figures, the two charts with their tables, the channels and the import warnings. */
export default function SessionView({ session, startedLabel, timeZone }: { session: SessionData; startedLabel: string; timeZone: string }) {
  const { summary, series } = session;
  const endS = Math.max(series?.phases.at(-1)?.toS ?? 0, summary.durationS, 1);
  return (
    <div className="space-y-8">
      <section aria-labelledby="figures-h" className="space-y-3">
        <h2 id="figures-h" className="text-xl">
          Figures
        </h2>
        <SessionFigures summary={summary} startedLabel={startedLabel} timeZone={timeZone} startedAtSource={session.startedAtSource} />
      </section>

      {series ? (
        <>
          <section aria-labelledby="cadence-power-h" className="card space-y-3">
            <h2 id="cadence-power-h" className="text-xl">
              Cadence and power
            </h2>
            <CadencePowerChart series={series} endS={endS} />
          </section>
          <section aria-labelledby="current-h" className="card space-y-3">
            <h2 id="current-h" className="text-xl">
              Current per channel
            </h2>
            <ChannelChart series={series} endS={endS} />
          </section>
          {series.downsampled && (
            <p className="text-sm text-ink-soft">
              The charts draw a reduced set of points that keeps the peaks and dips; the figures above use all {summary.samples.toLocaleString()} samples.
            </p>
          )}
        </>
      ) : (
        <p className="text-ink-soft">The samples of this session are not stored, so there are no charts; the figures above still apply.</p>
      )}

      {/* Without channels the current chart already says so; say it once. */}
      {(Object.keys(summary.channels).length > 0 || !series) && (
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
