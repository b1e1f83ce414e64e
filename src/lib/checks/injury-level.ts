// Whether a client is at risk of autonomic dysreflexia. The guidelines define
// the population at risk by neurological level (T6 and above), so a level at
// or above T6 wins over a record marked "not at risk".
// source: Consortium for Spinal Cord Medicine, clinical practice guideline on
// autonomic dysreflexia; International Standards for Autonomic Function after SCI.

export type SpinalRegion = 'C' | 'T' | 'L' | 'S';
export type AdRiskMarking = 'at_risk' | 'not_at_risk' | 'unknown';

export interface InjuryLevel {
  region: SpinalRegion;
  segment: number;
  /** Canonical spelling, e.g. "T6". */
  label: string;
}

const SEGMENTS: Record<SpinalRegion, number> = { C: 8, T: 12, L: 5, S: 5 };
const REGION_ORDER: SpinalRegion[] = ['C', 'T', 'L', 'S'];

/**
 * Reads a neurological level such as "C6", "t10", "T4 AIS A" or "C5-C6".
 * When several levels appear, the most rostral is taken, because it is the
 * one that decides the autonomic risk. Returns null for text without a valid level.
 */
export function parseInjuryLevel(text: string | null | undefined): InjuryLevel | null {
  if (!text) return null;
  let best: InjuryLevel | null = null;
  for (const m of text.matchAll(/(?<![a-z])([ctls])-?(\d{1,2})(?!\d)/gi)) {
    const region = m[1].toUpperCase() as SpinalRegion;
    const segment = Number(m[2]);
    if (segment < 1 || segment > SEGMENTS[region]) continue;
    const level = { region, segment, label: `${region}${segment}` };
    if (best === null || rank(level) < rank(best)) best = level;
  }
  return best;
}

function rank(level: InjuryLevel): number {
  return REGION_ORDER.indexOf(level.region) * 100 + level.segment;
}

/** True for C1–C8 and T1–T6. */
export function isAtOrAboveT6(level: InjuryLevel): boolean {
  return level.region === 'C' || (level.region === 'T' && level.segment <= 6);
}

export interface AdRiskAssessment {
  atRisk: boolean;
  level: InjuryLevel | null;
  reason: string;
}

export function assessAdRisk(injuryLevel: string | null, marking: AdRiskMarking): AdRiskAssessment {
  const level = parseInjuryLevel(injuryLevel);
  if (level && isAtOrAboveT6(level)) {
    const reason =
      marking === 'not_at_risk'
        ? `Injury level ${level.label} is at or above T6, so the client is treated as at risk of autonomic dysreflexia even though the record says not at risk.`
        : `Injury level ${level.label} is at or above T6, so the client is at risk of autonomic dysreflexia.`;
    return { atRisk: true, level, reason };
  }
  if (marking === 'at_risk') {
    return { atRisk: true, level, reason: 'The client is marked at risk of autonomic dysreflexia.' };
  }
  if (level) {
    return {
      atRisk: false,
      level,
      reason: `Injury level ${level.label} is below T6 and the client is not marked at risk of autonomic dysreflexia.`,
    };
  }
  if (marking === 'not_at_risk') {
    return { atRisk: false, level: null, reason: 'The client is marked not at risk of autonomic dysreflexia.' };
  }
  const unread = injuryLevel && injuryLevel.trim() !== '' ? ` (the recorded level "${injuryLevel.trim()}" could not be read)` : '';
  return {
    atRisk: false,
    level: null,
    reason: `No injury level at or above T6${unread} and no risk marking are recorded, so the client is treated as not at risk of autonomic dysreflexia; set the risk on the client's record if this is wrong.`,
  };
}
