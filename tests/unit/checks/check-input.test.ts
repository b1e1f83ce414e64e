import { describe, it, expect } from 'vitest';
import { checkInputSchema } from '../../../src/lib/checks/check-input';

function messages(body: unknown): string[] {
  const r = checkInputSchema.safeParse(body);
  return r.success ? [] : r.error.issues.map((i) => i.message);
}

describe('checkInputSchema', () => {
  it('accepts a full check and fills the defaults', () => {
    const r = checkInputSchema.parse({
      takenAt: '2026-10-05T09:30:00+13:00',
      bpBefore: { systolic: 110, diastolic: 70 },
      bpAfter: { systolic: 104, diastolic: 66 },
      bpAfterMinutes: 3,
      heartRateBefore: 72,
      skin: [{ site: 'quadriceps_left', state: 'normal' }],
      effort: 6,
      comment: '  felt good  ',
      sessionId: '6f1c1e0a-3b7e-4c7e-9a43-2c4b8d0f5e11',
    });
    expect(r.kind).toBe('pre_post');
    expect(r.adSymptoms).toEqual([]);
    expect(r.otherEvents).toEqual([]);
    expect(r.comment).toBe('felt good');
  });

  it('accepts a symptom alone', () => {
    expect(checkInputSchema.safeParse({ adSymptoms: ['pounding_headache'] }).success).toBe(true);
  });

  it('needs at least one measurement, symptom, skin entry or comment', () => {
    expect(messages({})).toEqual(['A check needs at least one measurement, symptom, skin entry or comment.']);
    expect(messages({ comment: '   ' })).toEqual([
      'A check needs at least one measurement, symptom, skin entry or comment.',
    ]);
  });

  it('gives plausibility limits in the message', () => {
    // common practice: plausibility limits catch typing mistakes, not clinical states
    expect(messages({ bpBefore: { systolic: 301, diastolic: 80 } })).toEqual([
      'Systolic pressure before the ride must be between 50 and 300 mmHg.',
    ]);
    expect(messages({ bpBefore: { systolic: 49, diastolic: 30 } })).toEqual([
      'Systolic pressure before the ride must be between 50 and 300 mmHg.',
    ]);
    expect(messages({ bpAfter: { systolic: 120, diastolic: 19 } })).toEqual([
      'Diastolic pressure after the ride must be between 20 and 200 mmHg.',
    ]);
    expect(messages({ heartRateAfter: 251 })).toEqual([
      'Heart rate after the ride must be between 20 and 250 beats per minute.',
    ]);
    expect(messages({ heartRateBefore: 19 })).toEqual([
      'Heart rate before the ride must be between 20 and 250 beats per minute.',
    ]);
    expect(messages({ effort: 11 })).toEqual(['Effort must be between 1 and 10.']);
    expect(messages({ effort: 0 })).toEqual(['Effort must be between 1 and 10.']);
    expect(checkInputSchema.safeParse({ bpBefore: { systolic: 300, diastolic: 200 }, heartRateBefore: 250 }).success).toBe(true);
    expect(checkInputSchema.safeParse({ bpBefore: { systolic: 50, diastolic: 20 }, heartRateBefore: 20 }).success).toBe(true);
  });

  it('wants systolic above diastolic', () => {
    expect(messages({ bpDuring: { systolic: 80, diastolic: 120 } })).toEqual([
      'Systolic pressure during the ride must be higher than diastolic; check whether the two were swapped.',
    ]);
    expect(messages({ bpDuring: { systolic: 90, diastolic: 90 } })).toHaveLength(1);
  });

  it('wants whole numbers', () => {
    expect(messages({ bpBefore: { systolic: 120.5, diastolic: 80 } })).toEqual([
      'Systolic pressure before the ride must be a whole number.',
    ]);
  });

  it('refuses minutes after the ride without an after reading', () => {
    expect(messages({ bpBefore: { systolic: 120, diastolic: 80 }, bpAfterMinutes: 5 })).toEqual([
      'Minutes after the ride only make sense with a blood pressure after the ride.',
    ]);
  });

  it('refuses unknown codes, repeats and unknown fields', () => {
    expect(messages({ adSymptoms: ['headache'] })[0]).toMatch(/^Unknown symptom; expected one of: pounding_headache/);
    expect(messages({ adSymptoms: ['goose_bumps', 'goose_bumps'] })).toEqual(['Each symptom may be listed once.']);
    expect(
      messages({
        skin: [
          { site: 'quadriceps_left', state: 'normal' },
          { site: 'quadriceps_left', state: 'broken_skin' },
        ],
      }),
    ).toEqual(['Each skin site may be listed once.']);
    expect(messages({ skin: [{ site: 'Left Quad', state: 'normal' }] })).toEqual([
      'A skin site is a short lower-case name such as quadriceps_left.',
    ]);
    expect(messages({ clientId: 'x', comment: 'hi' })[0]).toMatch(/clientId/);
  });

  it('limits the comment to 2000 characters and checks ids and instants', () => {
    expect(checkInputSchema.safeParse({ comment: 'a'.repeat(2000) }).success).toBe(true);
    expect(messages({ comment: 'a'.repeat(2001) })).toEqual(['The comment may be at most 2000 characters.']);
    expect(messages({ comment: 'x', sessionId: 'abc' })).toEqual(['sessionId must be a session id (a UUID).']);
    expect(messages({ comment: 'x', takenAt: '2026-10-05 09:30' })[0]).toMatch(/^takenAt must be an ISO 8601/);
  });
});
