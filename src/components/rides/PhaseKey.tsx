import { PHASE_FILL } from './chart-setup';
import { PHASE_LABELS } from './format';
import type { ChartSeries } from './types';

/** What the shaded bands behind a chart mean; only the phases this session has. */
export function PhaseKey({ phases }: { phases: ChartSeries['phases'] }) {
  const present = Object.keys(PHASE_LABELS).filter((p) => phases.some((r) => r.phase === p));
  if (!present.length) return null;
  return (
    <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-ink-soft">
      <span>Shading shows the phases:</span>
      {present.map((p) => (
        <span key={p} className="inline-flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-4 w-6 rounded border border-line-strong" style={{ background: PHASE_FILL[p] }} />
          <span className="text-ink">{PHASE_LABELS[p]}</span>
        </span>
      ))}
    </p>
  );
}
