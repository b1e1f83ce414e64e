import type { AdRisk, Diagnosis } from '../db/tables';

export const DIAGNOSIS_LABELS: Record<Diagnosis, string> = {
  sci: 'Spinal cord injury',
  ms: 'Multiple sclerosis',
  stroke: 'Stroke',
  cerebral_palsy: 'Cerebral palsy',
  other: 'Other neurological condition',
};

export const AD_RISK_LABELS: Record<AdRisk, string> = {
  at_risk: 'At risk of autonomic dysreflexia',
  not_at_risk: 'Not at risk of autonomic dysreflexia',
  unknown: 'Autonomic dysreflexia risk not recorded',
};

/** "T4 AIS A", "C6", or null. */
export function levelLabel(level: string | null, ais: string | null): string | null {
  if (!level && !ais) return null;
  return [level, ais ? `AIS ${ais}` : null].filter(Boolean).join(' ');
}
