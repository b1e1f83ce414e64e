// Turns one check into the conditions a therapist should see, and says when the
// safety panel must be shown. Thresholds:
// - autonomic dysreflexia: systolic more than 20 mmHg above the client's
//   baseline (Consortium for Spinal Cord Medicine clinical practice guideline;
//   International Standards for Autonomic Function after SCI);
// - low blood pressure: a fall of at least 20 mmHg systolic or 10 mmHg
//   diastolic (consensus definition of orthostatic hypotension). The consensus
//   window is 3 minutes after becoming upright; the minutes are kept as
//   evidence but do not gate the condition, because a later fall still
//   deserves a look and many riders stay seated throughout;
// - without a baseline, for a client at risk: a systolic at or above an
//   absolute level (clinic setting, default 150 mmHg, the level at which the
//   Consortium for Spinal Cord Medicine guideline on acute management of
//   autonomic dysreflexia has adults considered for drug treatment; recalled
//   from memory, see PRODUCT.md). It applies whatever the baseline: a high
//   baseline must not hide a dangerous reading.
import type { AdSymptom, BloodPressure, SkinEntry } from './check-input';
import { assessAdRisk, type AdRiskMarking } from './injury-level';
import { AD_SYMPTOM_LABELS, SKIN_STATE_LABELS, joinList, siteLabel } from './labels';

export const AD_RISE_ABOVE_BASELINE_MMHG = 20;
export const LOW_BP_SYSTOLIC_FALL_MMHG = 20;
export const LOW_BP_DIASTOLIC_FALL_MMHG = 10;
export const DEFAULT_AD_ABSOLUTE_SYSTOLIC_MMHG = 150;

export type ConditionSeverity = 'urgent' | 'review';
export type ReadingTime = 'before' | 'during' | 'after';

export interface EvaluableCheck {
  bpBefore?: BloodPressure;
  bpDuring?: BloodPressure;
  bpAfter?: BloodPressure;
  bpAfterMinutes?: number;
  adSymptoms: AdSymptom[];
  skin: SkinEntry[];
}

export interface ClientRiskProfile {
  injuryLevel: string | null;
  adRisk: AdRiskMarking;
  baselineSystolic: number | null;
  /** The clinic's absolute systolic level for a client at risk; Kinloop's default when absent. */
  absoluteSystolic?: number;
}

export interface BpRiseEvidence {
  atRisk: boolean;
  baselineSystolic: number | null;
  /** Readings strictly above baseline + 20 mmHg, highest first. */
  readingsAboveBaseline: { when: ReadingTime; systolic: number; aboveBaselineMmHg: number }[];
  /** For a client at risk: readings at or above the absolute level, highest first. */
  readingsAtOrAboveAbsolute?: { when: ReadingTime; systolic: number }[];
  absoluteSystolic?: number;
  symptoms: AdSymptom[];
}

export interface BpDropEvidence {
  before: BloodPressure;
  after: BloodPressure;
  afterMinutes: number | null;
  systolicFallMmHg: number;
  diastolicFallMmHg: number;
}

export interface SkinConcernEvidence {
  sites: SkinEntry[];
}

export interface BpRiseCondition {
  kind: 'bp_rise';
  severity: ConditionSeverity;
  reason: string;
  evidence: BpRiseEvidence;
}
export interface BpDropCondition {
  kind: 'bp_drop';
  severity: 'review';
  reason: string;
  evidence: BpDropEvidence;
}
export interface SkinConcernCondition {
  kind: 'skin_concern';
  severity: 'review';
  reason: string;
  evidence: SkinConcernEvidence;
}
export type CheckCondition = BpRiseCondition | BpDropCondition | SkinConcernCondition;

export interface CheckEvaluation {
  conditions: CheckCondition[];
  showSafetyPanel: boolean;
  adRiskReason: string;
  /** What could not be judged, e.g. readings without a baseline. */
  notes: string[];
  /** Blood pressure was recorded but the client has no baseline: the therapist is asked to record one. */
  baselineMissing: boolean;
}

export function evaluateCheck(check: EvaluableCheck, client: ClientRiskProfile): CheckEvaluation {
  const risk = assessAdRisk(client.injuryLevel, client.adRisk);
  const conditions: CheckCondition[] = [];
  const notes: string[] = [];

  const baseline = client.baselineSystolic;
  const baselineMissing = baseline === null && readings(check).length > 0;
  if (baselineMissing) {
    notes.push('No baseline systolic pressure is set, so the readings were not compared with one. The clinic is asked to record one.');
  }
  const absolute = client.absoluteSystolic ?? DEFAULT_AD_ABSOLUTE_SYSTOLIC_MMHG;
  const rise = bpRise(check, baseline, risk.atRisk, absolute);
  if (rise) conditions.push(rise);
  const drop = bpDrop(check);
  if (drop) conditions.push(drop);
  const skin = skinConcern(check.skin);
  if (skin) conditions.push(skin);

  const showSafetyPanel = check.adSymptoms.length > 0 || (risk.atRisk && rise !== null);
  return { conditions, showSafetyPanel, adRiskReason: risk.reason, notes, baselineMissing };
}

function readings(check: EvaluableCheck): { when: ReadingTime; bp: BloodPressure }[] {
  const out: { when: ReadingTime; bp: BloodPressure }[] = [];
  if (check.bpBefore) out.push({ when: 'before', bp: check.bpBefore });
  if (check.bpDuring) out.push({ when: 'during', bp: check.bpDuring });
  if (check.bpAfter) out.push({ when: 'after', bp: check.bpAfter });
  return out;
}

function whenPhrase(when: ReadingTime, afterMinutes: number | undefined): string {
  if (when === 'after' && afterMinutes !== undefined) {
    return `${afterMinutes} ${afterMinutes === 1 ? 'minute' : 'minutes'} after the ride`;
  }
  return `${when} the ride`;
}

function bpRise(check: EvaluableCheck, baseline: number | null, atRisk: boolean, absolute: number): BpRiseCondition | null {
  const overAbsolute = atRisk
    ? readings(check)
        .filter((r) => r.bp.systolic >= absolute)
        .map((r) => ({ when: r.when, systolic: r.bp.systolic }))
        .sort((a, b) => b.systolic - a.systolic)
    : [];
  const above =
    baseline === null
      ? []
      : readings(check)
          .filter((r) => r.bp.systolic - baseline > AD_RISE_ABOVE_BASELINE_MMHG)
          .map((r) => ({ when: r.when, systolic: r.bp.systolic, aboveBaselineMmHg: r.bp.systolic - baseline }))
          .sort((a, b) => b.systolic - a.systolic);
  const symptoms = check.adSymptoms;
  if (above.length === 0 && symptoms.length === 0 && overAbsolute.length === 0) return null;

  const symptomText = joinList(symptoms.map((s) => AD_SYMPTOM_LABELS[s]));
  const highest = above[0];
  const riseText = highest
    ? `systolic pressure reached ${highest.systolic} mmHg ${whenPhrase(highest.when, check.bpAfterMinutes)}, ${fmt(highest.aboveBaselineMmHg)} mmHg above the client's baseline of ${fmt(baseline as number)} mmHg`
    : '';

  const top = overAbsolute[0];
  const absoluteText = top
    ? `systolic pressure reached ${top.systolic} mmHg ${whenPhrase(top.when, check.bpAfterMinutes)}, at or above the clinic's level of ${absolute} mmHg for a client at risk of autonomic dysreflexia`
    : '';

  let reason: string;
  if (top && !highest) {
    const symptomPart = symptoms.length > 0 ? ` Possible signs of autonomic dysreflexia were ticked (${symptomText}).` : '';
    const baselinePart = baseline === null ? ' No baseline systolic pressure is set.' : '';
    reason = `${capitalise(absoluteText)}.${symptomPart}${baselinePart}`;
  } else if (symptoms.length > 0 && highest) {
    reason = `Possible signs of autonomic dysreflexia were ticked (${symptomText}) and ${riseText}.`;
  } else if (symptoms.length > 0) {
    const baselineText =
      baseline === null ? '; no baseline systolic pressure is set, so the readings were not compared with one' : '';
    reason = `Possible signs of autonomic dysreflexia were ticked: ${symptomText}${baselineText}.`;
  } else if (atRisk) {
    reason = `${capitalise(riseText)}, in a client at risk of autonomic dysreflexia.`;
  } else {
    reason = `${capitalise(riseText)}; the client is not known to be at risk of autonomic dysreflexia.`;
  }

  return {
    kind: 'bp_rise',
    severity: symptoms.length > 0 || atRisk ? 'urgent' : 'review',
    reason,
    evidence: {
      atRisk,
      baselineSystolic: baseline,
      readingsAboveBaseline: above,
      symptoms: [...symptoms],
      ...(overAbsolute.length ? { readingsAtOrAboveAbsolute: overAbsolute, absoluteSystolic: absolute } : {}),
    },
  };
}

function bpDrop(check: EvaluableCheck): BpDropCondition | null {
  const { bpBefore: before, bpAfter: after } = check;
  if (!before || !after) return null;
  const systolicFall = before.systolic - after.systolic;
  const diastolicFall = before.diastolic - after.diastolic;
  if (systolicFall < LOW_BP_SYSTOLIC_FALL_MMHG && diastolicFall < LOW_BP_DIASTOLIC_FALL_MMHG) return null;

  const afterText =
    check.bpAfterMinutes === undefined
      ? 'after it'
      : `${check.bpAfterMinutes} ${check.bpAfterMinutes === 1 ? 'minute' : 'minutes'} after it`;
  return {
    kind: 'bp_drop',
    severity: 'review',
    reason:
      `Blood pressure fell from ${before.systolic}/${before.diastolic} mmHg before the ride to ` +
      `${after.systolic}/${after.diastolic} mmHg ${afterText} (systolic ${change(systolicFall)}, ` +
      `diastolic ${change(diastolicFall)}), which may be low blood pressure after exercise.`,
    evidence: {
      before,
      after,
      afterMinutes: check.bpAfterMinutes ?? null,
      systolicFallMmHg: systolicFall,
      diastolicFallMmHg: diastolicFall,
    },
  };
}

// Broken skin is "review", not "urgent": it is not an emergency in itself, and
// whether to stimulate at that site is the therapist's call before the next ride.
function skinConcern(skin: SkinEntry[]): SkinConcernCondition | null {
  const sites = skin.filter((s) => s.state === 'redness_persists' || s.state === 'broken_skin');
  if (sites.length === 0) return null;
  const ordered = [...sites].sort((a, b) => Number(b.state === 'broken_skin') - Number(a.state === 'broken_skin'));
  const parts = ordered.map((s) => `${SKIN_STATE_LABELS[s.state]} at the ${siteLabel(s.site)} site`);
  return {
    kind: 'skin_concern',
    severity: 'review',
    reason: `${capitalise(joinList(parts))}; the skin needs checking before electrodes go on there again.`,
    evidence: { sites: ordered },
  };
}

function change(fall: number): string {
  if (fall > 0) return `down ${fall} mmHg`;
  if (fall < 0) return `up ${-fall} mmHg`;
  return 'unchanged';
}

function fmt(n: number): string {
  return Number.isInteger(n) ? String(n) : n.toFixed(1);
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}
