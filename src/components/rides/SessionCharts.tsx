// The session page's two charts, loaded with chart.js only when the page
// draws them, with the series fetched by the browser (compressed, a few
// hundred points per line) instead of written into the page.
import { useApi } from '../api';
import { Loaded } from '../ui/Loading';
import { CadencePowerChart } from './CadencePowerChart';
import { ChannelChart } from './ChannelChart';
import type { SessionData } from './types';

/** Points per line: enough to keep every peak and dip a chart this wide can show. */
export const CHART_POINTS = 800;

export default function SessionCharts({ sessionId, durationS, samples }: { sessionId: string; durationS: number; samples: number }) {
  const [value, reload] = useApi<SessionData>(`/api/sessions/${sessionId}?points=${CHART_POINTS}`);
  return (
    <Loaded value={value} reload={reload} label="the charts">
      {({ series }) => {
        if (!series) return <p className="text-ink-soft">The samples of this session are not stored, so there are no charts; the figures above still apply.</p>;
        const endS = Math.max(series.phases.at(-1)?.toS ?? 0, durationS, 1);
        return (
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
              <p className="text-sm text-ink-soft">The charts draw a reduced set of points that keeps the peaks and dips; the figures above use all {samples.toLocaleString()} samples.</p>
            )}
          </>
        );
      }}
    </Loaded>
  );
}
