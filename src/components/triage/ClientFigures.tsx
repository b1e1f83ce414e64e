// The figure cells shared by triage and the caseload: last session, adherence,
// streak and power trend, each readable without colour or icons.
import { number, wattsPerWeek, DIGITS } from '../../lib/format/numbers';
import { formatInstantDate, relativeDay } from '../../lib/time/format';

const Missing = ({ why }: { why: string }) => (
  <>
    <span aria-hidden="true">—</span>
    <span className="sr-only">{why}</span>
  </>
);

export function LastSession({ at, now, locale, timeZone }: { at: string | null; now: Date; locale: string; timeZone: string }) {
  if (!at) return <span className="text-ink-soft">No sessions yet</span>;
  const date = formatInstantDate(at, locale, timeZone, 'dayLong');
  return (
    <time dateTime={at} title={date}>
      {relativeDay(at, now, timeZone)}
      <span className="sr-only">, {date}</span>
    </time>
  );
}

export function Adherence({ pct }: { pct: number | null }) {
  return pct === null ? <Missing why="Not known yet" /> : <>{number(pct, DIGITS.percent)} %</>;
}

export function Streak({ weeks }: { weeks: number }) {
  return <>{weeks === 1 ? '1 week' : `${weeks} weeks`}</>;
}

/** The trend as the client's page says it ("−0.2 W a week"); one that rounds to 0.0 reads as steady. */
export function PowerTrend({ wPerWeek, locale }: { wPerWeek: number | null; locale: string }) {
  if (wPerWeek === null) return <Missing why="Not enough sessions for a trend" />;
  const text = wattsPerWeek(wPerWeek, locale);
  const direction = text.startsWith('+') ? 'rising' : text.startsWith('\u2212') ? 'falling' : 'steady';
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
      {text}
    </span>
  );
}
