import { describe, it, expect } from 'vitest';
import { bodyFromDraft, emptyDraft, FORM_ERROR, NUMBER_FIELDS, type CheckDraft, type NumberKey } from '../../../src/components/checks/check-draft';
import { checkInputSchema } from '../../../src/lib/checks/check-input';

function draftWith(numbers: Partial<Record<NumberKey, string>>, rest: Partial<Omit<CheckDraft, 'numbers'>> = {}): CheckDraft {
  const d = emptyDraft();
  return { ...d, ...rest, numbers: { ...d.numbers, ...numbers } };
}

describe('emptyDraft', () => {
  it('has an empty text for every number field and nothing chosen', () => {
    const d = emptyDraft();
    expect(Object.keys(d.numbers).sort()).toEqual(Object.keys(NUMBER_FIELDS).sort());
    expect(Object.values(d.numbers).every((v) => v === '')).toBe(true);
    expect(d).toMatchObject({ adSymptoms: [], otherEvents: [], skin: {}, effort: null, comment: '' });
  });

  it('gives a fresh draft each time', () => {
    const a = emptyDraft();
    a.numbers.heartRateBefore = '70';
    expect(emptyDraft().numbers.heartRateBefore).toBe('');
  });
});

describe('bodyFromDraft', () => {
  it('asks for at least one thing in an empty draft, as a form-wide problem', () => {
    expect(bodyFromDraft(emptyDraft())).toEqual({
      body: null,
      errors: { [FORM_ERROR]: 'Fill in at least one thing before saving: a reading, a warning sign, the skin, the effort or a comment.' },
    });
  });

  it('builds the body from typed values, leaving out what was not filled in', () => {
    const { body, errors } = bodyFromDraft(
      draftWith(
        { 'bpBefore.systolic': ' 118 ', 'bpBefore.diastolic': '76', heartRateBefore: '70', 'bpAfter.systolic': '116', 'bpAfter.diastolic': '74', bpAfterMinutes: '5' },
        { adSymptoms: ['goose_bumps'], skin: { quadriceps_left: 'redness_fades_30min', hamstrings_left: '' }, effort: 6, comment: '  Legs tired  ' },
      ),
    );
    expect(errors).toEqual({});
    expect(body).toEqual({
      bpBefore: { systolic: 118, diastolic: 76 },
      bpAfter: { systolic: 116, diastolic: 74 },
      bpAfterMinutes: 5,
      heartRateBefore: 70,
      adSymptoms: ['goose_bumps'],
      otherEvents: [],
      skin: [{ site: 'quadriceps_left', state: 'redness_fades_30min' }],
      effort: 6,
      comment: 'Legs tired',
    });
    // Absent, not present as undefined: the server refuses unknown keys, and the body is what it checks.
    expect(Object.keys(body!)).not.toContain('bpDuring');
    expect(Object.keys(body!)).not.toContain('heartRateAfter');
    expect(checkInputSchema.safeParse(body).success).toBe(true);
  });

  it('counts a comment alone as enough, and a comment of spaces as nothing', () => {
    expect(bodyFromDraft(draftWith({}, { comment: 'All fine' })).body).toMatchObject({ comment: 'All fine' });
    expect(bodyFromDraft(draftWith({}, { comment: '   ' })).errors).toHaveProperty([FORM_ERROR]);
  });

  describe('a half-entered blood pressure', () => {
    it('is caught beside the missing diastolic before sending', () => {
      expect(bodyFromDraft(draftWith({ 'bpBefore.systolic': '120' }))).toEqual({
        body: null,
        errors: { 'bpBefore.diastolic': 'Diastolic pressure before the ride is missing.' },
      });
    });

    it('is caught beside the missing systolic before sending', () => {
      expect(bodyFromDraft(draftWith({ 'bpDuring.diastolic': '80' }))).toEqual({
        body: null,
        errors: { 'bpDuring.systolic': 'Systolic pressure during the ride is missing.' },
      });
    });

    it('is caught even when other readings are complete', () => {
      const { body, errors } = bodyFromDraft(draftWith({ heartRateBefore: '70', 'bpAfter.systolic': '130', bpAfterMinutes: '3' }));
      expect(body).toBeNull();
      expect(errors).toEqual({ 'bpAfter.diastolic': 'Diastolic pressure after the ride is missing.' });
    });

    it('has its error key named after a form field, so the message lands beside an input', () => {
      const { errors } = bodyFromDraft(draftWith({ 'bpBefore.diastolic': '80', 'bpAfter.systolic': '120' }));
      // Both halves are missing, each beside its own input.
      expect(Object.keys(errors).sort()).toEqual(['bpAfter.diastolic', 'bpBefore.systolic']);
      for (const key of Object.keys(errors)) expect(Object.keys(NUMBER_FIELDS)).toContain(key);
    });
  });

  it('catches a swapped blood pressure beside the diastolic', () => {
    expect(bodyFromDraft(draftWith({ 'bpBefore.systolic': '70', 'bpBefore.diastolic': '120' })).errors).toEqual({
      'bpBefore.diastolic': 'Systolic pressure before the ride must be higher than diastolic; check whether the two were swapped.',
    });
  });

  it('reads a decimal comma, then refuses a reading that is not whole', () => {
    expect(bodyFromDraft(draftWith({ 'bpBefore.systolic': '120,5', 'bpBefore.diastolic': '80' })).errors).toEqual({
      'bpBefore.systolic': 'Systolic pressure before the ride must be a whole number.',
    });
  });

  it('refuses text that is not a number with the field’s own example, before the schema', () => {
    const { body, errors } = bodyFromDraft(draftWith({ 'bpBefore.systolic': '120', heartRateBefore: 'seventy' }));
    expect(body).toBeNull();
    expect(errors).toEqual({ heartRateBefore: 'Heart rate before: enter a number, for example 70.' });
  });

  it('gives the schema’s range messages', () => {
    expect(bodyFromDraft(draftWith({ heartRateAfter: '300' }, { effort: 11 })).errors).toEqual({
      heartRateAfter: 'Heart rate after the ride must be between 20 and 250 beats per minute.',
      effort: 'Effort must be between 1 and 10.',
    });
  });

  it('refuses minutes after the ride without a blood pressure after the ride', () => {
    const { errors } = bodyFromDraft(draftWith({ bpAfterMinutes: '5', heartRateBefore: '70' }));
    expect(errors).toEqual({ bpAfterMinutes: 'Minutes after the ride only make sense with a blood pressure after the ride.' });
  });

  it('refuses a symptom listed twice', () => {
    expect(bodyFromDraft(draftWith({}, { adSymptoms: ['pounding_headache', 'pounding_headache'] })).errors).toEqual({ adSymptoms: 'Each symptom may be listed once.' });
  });
});
