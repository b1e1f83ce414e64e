// The client page's charts with chart.js: a module of their own, loaded when
// ClientCharts draws them, so the rest of the page does not wait for it.
import { AdherenceChart } from './AdherenceChart';
import { CurrentPerWattChart } from './CurrentPerWattChart';
import { DurationChart } from './DurationChart';
import { PowerChart } from './PowerChart';
import type { AdherenceData, TrendsData } from './types';

export function TrendCharts({ trends, locale, timeZone, compact }: { trends: TrendsData; locale: string; timeZone: string; compact: boolean }) {
  return (
    <>
      <PowerChart trends={trends} locale={locale} timeZone={timeZone} compact={compact} />
      <DurationChart trends={trends} locale={locale} timeZone={timeZone} compact={compact} />
      <CurrentPerWattChart trends={trends} locale={locale} timeZone={timeZone} compact={compact} />
    </>
  );
}

export function WeeksChart({ adherence, locale, currentIsoWeek, compact }: { adherence: AdherenceData; locale: string; currentIsoWeek: string; compact: boolean }) {
  return <AdherenceChart adherence={adherence} locale={locale} currentIsoWeek={currentIsoWeek} compact={compact} />;
}
