// The JSON of POST and GET /api/clients/:id/checks, as the check pages read it.
import type { AdSymptom, BloodPressure, OtherEvent, SkinEntry } from '../../lib/checks/check-input';

export interface ConditionView {
  kind: 'bp_rise' | 'bp_drop' | 'skin_concern' | string;
  severity: 'urgent' | 'review' | string;
  reason: string;
}

export interface EvaluationView {
  showSafetyPanel: boolean;
  conditions: ConditionView[];
  adRiskReason: string;
  notes: string[];
}

export interface SavedCheck {
  check: { id: string; takenAt: string };
  evaluation: EvaluationView;
  adPlan?: import('../care/AdPlanCard').AdPlanData | null;
}

export interface RecentCheck {
  id: string;
  takenAt: string;
  recordedBy: { name: string | null } | null;
  bpBefore?: BloodPressure | null;
  bpDuring?: BloodPressure | null;
  bpAfter?: BloodPressure | null;
  bpAfterMinutes?: number | null;
  heartRateBefore?: number | null;
  heartRateAfter?: number | null;
  adSymptoms: AdSymptom[];
  otherEvents: OtherEvent[];
  skin: SkinEntry[];
  effort?: number | null;
  comment?: string | null;
  evaluation: EvaluationView | null;
}

export interface CheckClient {
  id: string;
  name: string;
  timeZone: string;
}
