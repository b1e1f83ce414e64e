// The check form's values as typed, and the request body they make. The body
// is checked with the server's own schema, so the form shows the same
// messages the server would send, beside the same fields.
import { checkInputSchema, type AdSymptom, type CheckInputBody, type OtherEvent, type SkinState } from '../../lib/checks/check-input';

export type NumberKey =
  | 'bpBefore.systolic'
  | 'bpBefore.diastolic'
  | 'heartRateBefore'
  | 'bpDuring.systolic'
  | 'bpDuring.diastolic'
  | 'bpAfter.systolic'
  | 'bpAfter.diastolic'
  | 'heartRateAfter'
  | 'bpAfterMinutes';

export interface NumberFieldSpec {
  key: NumberKey;
  label: string;
  unit: string;
  example: string;
}

export const NUMBER_FIELDS: Record<NumberKey, NumberFieldSpec> = {
  'bpBefore.systolic': { key: 'bpBefore.systolic', label: 'Systolic before', unit: 'mmHg', example: '118' },
  'bpBefore.diastolic': { key: 'bpBefore.diastolic', label: 'Diastolic before', unit: 'mmHg', example: '76' },
  heartRateBefore: { key: 'heartRateBefore', label: 'Heart rate before', unit: 'bpm', example: '70' },
  'bpDuring.systolic': { key: 'bpDuring.systolic', label: 'Systolic during', unit: 'mmHg', example: '120' },
  'bpDuring.diastolic': { key: 'bpDuring.diastolic', label: 'Diastolic during', unit: 'mmHg', example: '78' },
  'bpAfter.systolic': { key: 'bpAfter.systolic', label: 'Systolic after', unit: 'mmHg', example: '116' },
  'bpAfter.diastolic': { key: 'bpAfter.diastolic', label: 'Diastolic after', unit: 'mmHg', example: '74' },
  heartRateAfter: { key: 'heartRateAfter', label: 'Heart rate after', unit: 'bpm', example: '76' },
  bpAfterMinutes: { key: 'bpAfterMinutes', label: 'Minutes after the ride', unit: '', example: '5' },
};

export interface CheckDraft {
  numbers: Record<NumberKey, string>;
  adSymptoms: AdSymptom[];
  otherEvents: OtherEvent[];
  skin: Record<string, SkinState | ''>;
  effort: number | null;
  comment: string;
  /** The session the check belongs to, or '' for none. */
  sessionId: string;
}

export function emptyDraft(): CheckDraft {
  const numbers = Object.fromEntries(Object.keys(NUMBER_FIELDS).map((k) => [k, ''])) as Record<NumberKey, string>;
  return { numbers, adSymptoms: [], otherEvents: [], skin: {}, effort: null, comment: '', sessionId: '' };
}

/** Form-wide problems (not tied to one field) use this key. */
export const FORM_ERROR = '';

export type DraftErrors = Record<string, string>;

/** The body to send, or the problems to show first. */
export function bodyFromDraft(draft: CheckDraft): { body: CheckInputBody | null; errors: DraftErrors } {
  const errors: DraftErrors = {};
  const value = (key: NumberKey): number | undefined => {
    const text = draft.numbers[key].trim();
    if (text === '') return undefined;
    const n = Number(text.replace(',', '.'));
    if (!Number.isFinite(n)) {
      errors[key] = `${NUMBER_FIELDS[key].label}: enter a number, for example ${NUMBER_FIELDS[key].example}.`;
      return undefined;
    }
    return n;
  };
  const pressure = (when: 'bpBefore' | 'bpDuring' | 'bpAfter') => {
    const systolic = value(`${when}.systolic`);
    const diastolic = value(`${when}.diastolic`);
    if (systolic === undefined && diastolic === undefined) return undefined;
    return { ...(systolic !== undefined ? { systolic } : {}), ...(diastolic !== undefined ? { diastolic } : {}) };
  };
  const raw: Record<string, unknown> = {
    bpBefore: pressure('bpBefore'),
    bpDuring: pressure('bpDuring'),
    bpAfter: pressure('bpAfter'),
    bpAfterMinutes: value('bpAfterMinutes'),
    heartRateBefore: value('heartRateBefore'),
    heartRateAfter: value('heartRateAfter'),
    adSymptoms: draft.adSymptoms,
    otherEvents: draft.otherEvents,
    skin: Object.entries(draft.skin)
      .filter(([, state]) => state !== '')
      .map(([site, state]) => ({ site, state })),
    effort: draft.effort ?? undefined,
    comment: draft.comment.trim() || undefined,
    sessionId: draft.sessionId || undefined,
  };
  for (const key of Object.keys(raw)) if (raw[key] === undefined) delete raw[key];
  if (Object.keys(errors).length) return { body: null, errors };

  const parsed = checkInputSchema.safeParse(raw);
  if (parsed.success) return { body: raw as CheckInputBody, errors };
  for (const issue of parsed.error.issues) {
    const path = issue.path.join('.');
    const key = path === '' ? FORM_ERROR : path;
    errors[key] ??= key === FORM_ERROR ? 'Fill in at least one thing before saving: a reading, a warning sign, the skin, the effort or a comment.' : issue.message;
  }
  return { body: null, errors };
}
