// The figure cells shared by triage and the caseload: last session, adherence,
// streak and power trend, each readable without colour or icons.
import { longDate, relativeDay } from './relative-time';

const Missing = ({ why }: { why: string }) => (
  <>
    <span aria-hidden="true">—</span>
    <span className="sr-only">{why}</span>
  </>
);

export function LastSession({ at, now }: { at: string | null; now: Date }) {
  if (!at) return <span className="text-ink-soft">No sessions yet</span>;
  const date = longDate(at);
  return (
    <time dateTime={at} title={date}>
      {relativeDay(at, now)}
      <span className="sr-only">, {date}</span>
    </time>
  );
}

export function Adherence({ pct }: { pct: number | null }) {
  return pct === null ? <Missing why="Not known yet" /> : <>{Math.round(pct)} %</>;
}

export function Streak({ weeks }: { weeks: number }) {
  return <>{weeks === 1 ? '1 week' : `${weeks} weeks`}</>;
}

/** Trends within ±0.05 W a week round to 0.0 and read as steady. */
export function PowerTrend({ wPerWeek }: { wPerWeek: number | null }) {
  if (wPerWeek === null) return <Missing why="Not enough sessions for a trend" />;
  const direction = Math.abs(wPerWeek) < 0.05 ? 'steady' : wPerWeek > 0 ? 'rising' : 'falling';
  const value = direction === 'steady' ? '0.0' : `${wPerWeek > 0 ? '+' : '−'}${Math.abs(wPerWeek).toFixed(1)}`;
  return (
    <span className="inline-flex items-center gap-1 whitespace-nowrap">
      <svg role="img" aria-label={direction === 'steady' ? 'Steady' : direction === 'rising' ? 'Rising' : 'Falling'} width="18" height="18" viewBox="0 0 18 18" className="shrink-0">
        <path
          d={direction === 'steady' ? 'M2 9h12m-4-4 4 4-4 4' : direction === 'rising' ? 'M3 14 14 3m-7 0h7v7' : 'M3 4l11 11m-7 0h7V8'}
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
          strokeLinecap="round"
          strokeLinejoin="round"
        />
      </svg>
      {value} W/week
    </span>
  );
}
