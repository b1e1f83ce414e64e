import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { baselineSystolic } from '../checks/baseline';
import type { CheckInput } from '../checks/check-input';
import { evaluateCheck } from '../checks/evaluate-check';
import type { CheckRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { raiseCheckFlag } from '../supervision/flag-store';

const bp = (s: number | null, d: number | null) => (s === null || d === null ? null : { systolic: s, diastolic: d });

export function checkView(row: CheckRow & { recorded_by_name?: string }) {
  return {
    id: row.id,
    clientId: row.client_id,
    takenAt: row.taken_at.toISOString(),
    recordedBy: { userId: row.recorded_by, name: row.recorded_by_name ?? null },
    sessionId: row.ride_id,
    bpBefore: bp(row.bp_before_systolic, row.bp_before_diastolic),
    bpDuring: bp(row.bp_during_systolic, row.bp_during_diastolic),
    bpAfter: bp(row.bp_after_systolic, row.bp_after_diastolic),
    bpAfterMinutes: row.bp_after_minutes,
    heartRateBefore: row.heart_rate_before,
    heartRateAfter: row.heart_rate_after,
    adSymptoms: row.ad_symptoms,
    otherEvents: row.other_events,
    skin: row.skin,
    effort: row.effort,
    comment: row.comment,
    evaluation: row.evaluation,
  };
}

/**
 * Records a pre/post-ride check, judges it against the client's baseline
 * (the therapist's value, else the median of earlier pre-ride readings) and
 * raises bp_rise, bp_drop or skin_concern flags; urgent ones alert the
 * therapists at once (see alerts.ts).
 */
export async function recordCheck(ctx: RequestContext, clientId: string, input: CheckInput) {
  const grant = await scope(ctx).client(clientId, 'contribute', 'check.create');
  const client = grant.row;
  if (input.sessionId) {
    const ride = await grant.db('rides').where({ id: input.sessionId }).first('id');
    if (!ride) throw badRequest('That session is not one of this client’s sessions.', { fields: [{ path: 'sessionId', message: 'Choose one of the client’s sessions.' }] });
  }
  const priors: number[] = await grant.db('checks').whereNotNull('bp_before_systolic').orderBy('taken_at').pluck('bp_before_systolic');
  const baseline = baselineSystolic(client.baseline_systolic, priors);
  const evaluation = evaluateCheck(input, { injuryLevel: client.injury_level, adRisk: client.ad_risk, baselineSystolic: baseline.value });
  const stored = { ...evaluation, baseline };
  const [row] = await grant.db<CheckRow>('checks')
    .insert({
      recorded_by: ctx.viewer.userId,
      taken_at: input.takenAt ? new Date(input.takenAt) : new Date(),
      ride_id: input.sessionId ?? null,
      bp_before_systolic: input.bpBefore?.systolic ?? null,
      bp_before_diastolic: input.bpBefore?.diastolic ?? null,
      bp_during_systolic: input.bpDuring?.systolic ?? null,
      bp_during_diastolic: input.bpDuring?.diastolic ?? null,
      bp_after_systolic: input.bpAfter?.systolic ?? null,
      bp_after_diastolic: input.bpAfter?.diastolic ?? null,
      bp_after_minutes: input.bpAfterMinutes ?? null,
      heart_rate_before: input.heartRateBefore ?? null,
      heart_rate_after: input.heartRateAfter ?? null,
      ad_symptoms: JSON.stringify(input.adSymptoms) as never,
      other_events: JSON.stringify(input.otherEvents) as never,
      skin: JSON.stringify(input.skin) as never,
      effort: input.effort ?? null,
      comment: input.comment ?? null,
      evaluation: JSON.stringify(stored) as never,
    })
    .returning('*');
  await grant.audit({ action: 'check.record', recordType: 'check', recordId: row.id });
  // The flag is the clinic's record, which a carer or rider cannot see; raising it (and alerting the therapists) is what the check sets off.
  const consequences = grant.system('the flags a check raises');
  for (const c of evaluation.conditions) {
    await raiseCheckFlag(consequences, { clientId: client.id, clinicId: client.clinic_id, kind: c.kind, severity: c.severity, anchor: `check:${row.id}`, reason: c.reason, evidence: { ...c.evidence, checkId: row.id } });
  }
  return {
    check: checkView({ ...row, recorded_by_name: ctx.viewer.name }),
    evaluation: {
      showSafetyPanel: evaluation.showSafetyPanel,
      conditions: evaluation.conditions.map((c) => ({ kind: c.kind, severity: c.severity, reason: c.reason })),
      adRiskReason: evaluation.adRiskReason,
      notes: evaluation.notes,
      baseline,
    },
  };
}

export async function listChecks(ctx: RequestContext, clientId: string, limit = 50) {
  const client = await scope(ctx).client(clientId, 'read', 'checks.list');
  const rows = await client.db('checks as c').join('users as u', 'u.id', 'c.recorded_by').orderBy('c.taken_at', 'desc').limit(limit).select('c.*', 'u.name as recorded_by_name');
  return { checks: rows.map(checkView) };
}
