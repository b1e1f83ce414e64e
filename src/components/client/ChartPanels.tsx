// The client page's charts with chart.js: a module of their own, loaded when
// ClientCharts draws them, so the rest of the page does not wait for it.
import { AdherenceChart } from './AdherenceChart';
import { CurrentPerWattChart } from './CurrentPerWattChart';
import { DurationChart } from './DurationChart';
import { PowerChart } from './PowerChart';
import type { AdherenceData, TrendsData } from './types';

export function TrendCharts({ trends, locale, timeZone }: { trends: TrendsData; locale: string; timeZone: string }) {
  return (
    <>
      <PowerChart trends={trends} locale={locale} timeZone={timeZone} />
      <DurationChart trends={trends} locale={locale} timeZone={timeZone} />
      <CurrentPerWattChart trends={trends} locale={locale} timeZone={timeZone} />
    </>
  );
}

export function WeeksChart({ adherence, locale, currentIsoWeek }: { adherence: AdherenceData; locale: string; currentIsoWeek: string }) {
  return <AdherenceChart adherence={adherence} locale={locale} currentIsoWeek={currentIsoWeek} />;
}
