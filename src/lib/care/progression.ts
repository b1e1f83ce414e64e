// When a rider is ready for the next step of their program. Pure: the facts
// of the last finished week in, a judgement with its evidence out. The
// therapist decides; Kinloop only proposes.
//
// A prescription version may carry a progression plan: a step for minutes per
// session or for resistance, up to a target. Riders typically build from about
// 20 to 60 minutes over the first month (common practice, PRODUCT.md). The
// criteria for a step, all of them:
// - the version was in effect for the whole last finished week, which asked
//   for sessions and was not paused, and every prescribed session counted;
// - no urgent flag is open;
// - current per watt has not risen by more than the clinic's threshold (the
//   median of the week's sessions against the median of the sessions before
//   it): more current for the same power is the muscles tiring, not a rider
//   ready for more.
import { z } from 'zod';
import { median } from '../analytics/median';
import { roundTo } from '../analytics/round';
import { addDays, isoWeekday } from '../time/local-date';

export const PROGRESSION_KINDS = ['minutes', 'resistance'] as const;
export type ProgressionKind = (typeof PROGRESSION_KINDS)[number];

export interface ProgressionPlan {
  kind: ProgressionKind;
  /** Added when the criteria are met: minutes, or resistance levels. */
  step: number;
  /** Never beyond this. */
  upTo: number;
}

// Bounds: the minutes within the prescription's own range (10–60, the review
// PRODUCT.md cites), resistance within its 0–10 scale (Kinloop's own).
export const progressionPlanSchema = z
  .discriminatedUnion('kind', [
    z.object({
      kind: z.literal('minutes'),
      step: z.number({ invalid_type_error: 'Step: enter whole minutes.' }).int('Step: enter whole minutes.').min(1, 'Step: 1–15 minutes.').max(15, 'Step: 1–15 minutes.'),
      upTo: z.number({ invalid_type_error: 'Up to: enter whole minutes.' }).int('Up to: enter whole minutes.').min(10, 'Up to: 10–60 minutes, the range reported for FES cycling programmes.').max(60, 'Up to: 10–60 minutes, the range reported for FES cycling programmes.'),
    }).strict(),
    z.object({
      kind: z.literal('resistance'),
      step: z.number({ invalid_type_error: 'Step: enter a number.' }).min(0.5, 'Step: 0.5–5 levels.').max(5, 'Step: 0.5–5 levels.').multipleOf(0.5, 'Step: in halves.'),
      upTo: z.number({ invalid_type_error: 'Up to: enter a number.' }).min(0, 'Up to: 0–10 (Kinloop’s plausibility limit).').max(10, 'Up to: 0–10 (Kinloop’s plausibility limit).'),
    }).strict(),
  ], { errorMap: (issue, ctx) => (issue.code === 'invalid_union_discriminator' ? { message: 'Progression: minutes or resistance.' } : { message: ctx.defaultError }) });

export interface ProgressionFacts {
  version: { id: string; effectiveFrom: string; minutesPerSession: number; resistance: number | null; progression: ProgressionPlan | null };
  /** The last finished ISO week in the client's zone. */
  lastWeek: { isoWeek: string; monday: string; prescribed: number; counted: number; paused: boolean };
  openUrgentFlags: number;
  /** Current per watt (mA/W) of the last week's sessions, and of the sessions before that week (the latest few). */
  currentPerWatt: { lastWeek: number[]; before: number[] };
  currentRiseLimitPct: number;
}

export interface ProgressionEvidence {
  isoWeek: string;
  prescribed: number;
  counted: number;
  openUrgentFlags: number;
  currentPerWatt: { lastWeekMedian: number | null; beforeMedian: number | null; risePct: number | null; limitPct: number };
  kind: ProgressionKind;
  from: number;
  to: number;
}

export type ProgressionJudgement =
  | { ready: true; proposed: { minutesPerSession: number } | { resistance: number }; evidence: ProgressionEvidence }
  | { ready: false; reasons: string[] };


export function judgeProgression(f: ProgressionFacts): ProgressionJudgement {
  const plan = f.version.progression;
  if (!plan) return { ready: false, reasons: ['The prescription has no progression plan.'] };
  const from = plan.kind === 'minutes' ? f.version.minutesPerSession : (f.version.resistance ?? 0);
  if (from >= plan.upTo) return { ready: false, reasons: [`The ${plan.kind === 'minutes' ? 'minutes' : 'resistance'} already reached the plan's target of ${plan.upTo}.`] };
  const to = Math.min(from + plan.step, plan.upTo);

  const reasons: string[] = [];
  const w = f.lastWeek;
  if (f.version.effectiveFrom > w.monday) reasons.push(`The current version started after the week ${w.isoWeek} began.`);
  if (w.paused) reasons.push(`The week ${w.isoWeek} was paused.`);
  else if (w.prescribed <= 0) reasons.push(`The week ${w.isoWeek} asked for no sessions.`);
  else if (w.counted < w.prescribed) reasons.push(`${w.counted} of ${w.prescribed} prescribed sessions counted in the week ${w.isoWeek}.`);
  if (f.openUrgentFlags > 0) reasons.push(`${f.openUrgentFlags} urgent flag${f.openUrgentFlags === 1 ? ' is' : 's are'} open.`);

  const lastMedian = median(f.currentPerWatt.lastWeek);
  const beforeMedian = median(f.currentPerWatt.before);
  const risePct = lastMedian !== null && beforeMedian !== null && beforeMedian > 0 ? ((lastMedian - beforeMedian) / beforeMedian) * 100 : null;
  if (risePct !== null && risePct > f.currentRiseLimitPct) {
    reasons.push(`Current per watt rose ${roundTo(risePct, 1)} % in the week ${w.isoWeek}, more than the clinic's ${f.currentRiseLimitPct} %.`);
  }
  if (reasons.length) return { ready: false, reasons };

  return {
    ready: true,
    proposed: plan.kind === 'minutes' ? { minutesPerSession: to } : { resistance: to },
    evidence: {
      isoWeek: w.isoWeek,
      prescribed: w.prescribed,
      counted: w.counted,
      openUrgentFlags: f.openUrgentFlags,
      currentPerWatt: {
        lastWeekMedian: lastMedian === null ? null : roundTo(lastMedian, 3),
        beforeMedian: beforeMedian === null ? null : roundTo(beforeMedian, 3),
        risePct: risePct === null ? null : roundTo(risePct, 1),
        limitPct: f.currentRiseLimitPct,
      },
      kind: plan.kind,
      from,
      to,
    },
  };
}

/** The Monday after `today` (a local date): an accepted step starts with a whole week. */
export function nextMonday(today: string): string {
  return addDays(today, 8 - isoWeekday(today));
}
