// power_drop and current_rise. Rules from the Kinloop supervision issue;
// thresholds are clinic settings. The usual level (baseline) is the median of
// the baselineSessions counted sessions before the latest two counted
// sessions, and at least baselineMinSessions of them are needed.
// - power_drop: both latest are more than powerDropReviewPct % below the
//   usual mean power (review), more than powerDropUrgentPct % (urgent).
// - current_rise: both latest are more than currentRiseReviewPct % above the
//   usual current per watt (review).
// Sessions without the metric, and sessions on paused days (the program is
// suspended), are left out.
import { median } from '../analytics/median';
import { sessionsAsOf, type Assessment, type FlagData } from './flag-data';
import { roundTo } from '../analytics/round';
import { milliampsPerWatt, percent, watts } from '../format/numbers';
import { REASON_LOCALE } from './words';
import type { FlagCondition, FlagSession, MetricShiftEvidence } from './types';

interface MetricRule {
  kind: 'power_drop' | 'current_rise';
  metric: MetricShiftEvidence['metric'];
  label: string;
  unit: (value: number) => string;
  /** +1 when a rise is the concern, −1 when a drop is. */
  direction: 1 | -1;
  reviewPct: (data: FlagData) => number;
  urgentPct: (data: FlagData) => number | null;
}

const RULES: Record<MetricRule['kind'], MetricRule> = {
  power_drop: {
    kind: 'power_drop',
    metric: 'meanPowerW',
    label: 'mean power',
    unit: (v) => watts(v, REASON_LOCALE),
    direction: -1,
    reviewPct: (data) => data.thresholds.powerDropReviewPct,
    urgentPct: (data) => data.thresholds.powerDropUrgentPct,
  },
  current_rise: {
    kind: 'current_rise',
    metric: 'currentPerWattMaPerW',
    label: 'current per watt',
    unit: (v) => milliampsPerWatt(v, REASON_LOCALE),
    direction: 1,
    reviewPct: (data) => data.thresholds.currentRiseReviewPct,
    urgentPct: () => null,
  },
};

/**
 * The sessions the usual level is the median of: up to `baselineSessions` of
 * the eligible ones (counted, unpaused, with the metric; oldest first) before
 * the latest two; null while fewer than `baselineMinSessions` come before them.
 * The client page's chart takes its baseline line from here too, so a
 * baseline reads the same in the flag and in the chart.
 */
export function usualLevel(eligibleValues: number[], thresholds: Pick<FlagData['thresholds'], 'baselineSessions' | 'baselineMinSessions'>): number | null {
  const before = eligibleValues.slice(0, -2).slice(-thresholds.baselineSessions);
  return before.length >= thresholds.baselineMinSessions ? median(before) : null;
}

function valueOf(session: FlagSession, metric: MetricRule['metric']): number | null {
  const value = session[metric];
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}

export function assessMetricShift(kind: MetricRule['kind'], data: FlagData, asOfMs: number): Assessment {
  const rule = RULES[kind];
  const eligible = sessionsAsOf(data, asOfMs).filter(
    (s) => s.status === 'counted' && !s.paused && valueOf(s.session, rule.metric) !== null,
  );
  if (eligible.length < 2) {
    return { condition: null, status: `there were fewer than two counted sessions with ${rule.label}` };
  }
  const latest = eligible.slice(-2);
  const before = eligible.slice(0, -2).slice(-data.thresholds.baselineSessions);
  if (before.length < data.thresholds.baselineMinSessions) {
    return {
      condition: null,
      status: `only ${before.length} counted sessions came before the last two, and ${data.thresholds.baselineMinSessions} are needed to know the usual ${rule.label}`,
    };
  }
  const baseline = usualLevel(eligible.map((s) => valueOf(s.session, rule.metric)!), data.thresholds)!;
  const values = latest.map((s) => valueOf(s.session, rule.metric)!);
  const shown = `${values.map(rule.unit).join(' and ')} in the last two sessions`;
  if (baseline <= 0) {
    return { condition: null, status: `${rule.label} was ${shown}, against a usual level of ${rule.unit(baseline)}` };
  }
  // Signed change in % of the baseline; multiplying first keeps exact inputs exact.
  const changes = values.map((v) => ((v - baseline) * 100) / baseline);
  const beyond = (pct: number) => changes.every((c) => c * rule.direction > pct);
  const reviewPct = rule.reviewPct(data);
  const urgentPct = rule.urgentPct(data);
  const side = rule.direction < 0 ? 'below' : 'above';
  if (!beyond(reviewPct)) {
    return {
      condition: null,
      status: `${rule.label} was ${shown}, against the usual ${rule.unit(baseline)} (not both more than ${reviewPct} % ${side})`,
    };
  }
  const severity = urgentPct !== null && beyond(urgentPct) ? 'urgent' : 'review';
  const condition: FlagCondition = {
    kind,
    severity,
    anchor: latest[1].session.id,
    reason: `${capitalise(rule.label)} was ${shown}, ${changes.map((c) => percent(c, REASON_LOCALE)).join(' and ')} ${side} the usual ${rule.unit(baseline)}.`,
    evidence: {
      metric: rule.metric,
      baseline,
      baselineSessionIds: before.map((s) => s.session.id),
      latest: latest.map((s, i) => ({
        id: s.session.id,
        startedAt: s.session.startedAt,
        value: values[i],
        changePct: roundTo(changes[i], 1),
      })),
      reviewPct,
      urgentPct,
    },
  };
  return { condition, status: condition.reason };
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
