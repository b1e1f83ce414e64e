// A client's sessions and checks as a FHIR R4 Bundle of type "collection":
// a Patient, the clinic as an Organization, Kinloop's CodeSystem, and per
// session an "exercise activity" Observation whose members carry the duration,
// the energy estimate (marked as one) and the cycling measures; per check the
// blood-pressure panels and heart rates. Pure: ids are derived from Kinloop's
// own ids, so the same data gives the same bundle.
import { createHash } from 'node:crypto';
import type { Bundle, BundleEntry, CodeableConcept, Observation, ObservationComponent, Organization, Patient, Quantity, Reference } from 'fhir/r4';
import { orderedChannels } from '../../components/rides/channel-order';
import type { RideRow } from '../db/tables';
import { fesEnergyKcal, sessionWorkJ } from '../reports/energy';
import { roundTo } from '../analytics/round';
import { channelConcept, KINLOOP_CODES, KINLOOP_CONCEPTS, KINLOOP_IDS, kinloopCodeSystem, LOINC, LOINC_CODES, OBSERVATION_CATEGORY, UCUM, UNITS } from './fhir-codes';

export interface FhirClient {
  id: string;
  name: string;
  dateOfBirth: string | null;
}

export interface FhirCheck {
  id: string;
  takenAt: string;
  bpBefore: { systolic: number; diastolic: number } | null;
  bpDuring: { systolic: number; diastolic: number } | null;
  bpAfter: { systolic: number; diastolic: number } | null;
  heartRateBefore: number | null;
  heartRateAfter: number | null;
}

export interface FhirInput {
  client: FhirClient;
  clinic: { id: string; name: string };
  rides: RideRow[];
  checks: FhirCheck[];
  efficiencyPct: number;
  now: Date;
}

/** A UUID made from a name (SHA-1, version-5 layout), so each resource keeps its id from one export to the next. */
export function nameUuid(name: string): string {
  const h = createHash('sha1').update(`kinloop:${name}`).digest();
  h[6] = (h[6] & 0x0f) | 0x50;
  h[8] = (h[8] & 0x3f) | 0x80;
  const hex = h.subarray(0, 16).toString('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20, 32)}`;
}

const loinc = (c: { code: string; display: string }, text?: string): CodeableConcept => ({ coding: [{ system: LOINC, code: c.code, display: c.display }], text: text ?? c.display });
const kinloop = (c: { code: string; display: string }): CodeableConcept => ({ coding: [{ system: KINLOOP_CODES, code: c.code, display: c.display }], text: c.display });
const quantity = (value: number, unit: { unit: string; code: string }): Quantity => ({ value, unit: unit.unit, system: UCUM, code: unit.code });
const category = (code: 'activity' | 'vital-signs') => [{ coding: [{ system: OBSERVATION_CATEGORY, code, display: code === 'activity' ? 'Activity' : 'Vital Signs' }] }];

export function fhirBundle(input: FhirInput): Bundle {
  const patientId = input.client.id;
  const orgId = input.clinic.id;
  const subject: Reference = { reference: `urn:uuid:${patientId}`, display: input.client.name };
  const entries: BundleEntry[] = [];
  const add = (id: string, resource: BundleEntry['resource']) => entries.push({ fullUrl: `urn:uuid:${id}`, resource });

  const organization: Organization = { resourceType: 'Organization', id: orgId, identifier: [{ system: `${KINLOOP_IDS}/clinic`, value: orgId }], name: input.clinic.name };
  const patient: Patient = {
    resourceType: 'Patient',
    id: patientId,
    identifier: [{ system: `${KINLOOP_IDS}/client`, value: patientId }],
    name: [{ text: input.client.name }],
    ...(input.client.dateOfBirth ? { birthDate: input.client.dateOfBirth } : {}),
    managingOrganization: { reference: `urn:uuid:${orgId}`, display: input.clinic.name },
  };
  add(patientId, patient);
  add(orgId, organization);
  const codeSystem = kinloopCodeSystem();
  add(nameUuid('codesystem:fes-cycling:1'), codeSystem);

  for (const r of input.rides) {
    const start = r.started_at.toISOString();
    const end = new Date(r.started_at.getTime() + Math.round(r.duration_s * 1000)).toISOString();
    const base = (key: string, code: CodeableConcept, extra: Partial<Observation>): [string, Observation] => {
      const id = nameUuid(`session:${r.id}:${key}`);
      return [
        id,
        {
          resourceType: 'Observation',
          id,
          identifier: [{ system: `${KINLOOP_IDS}/session-measure`, value: `${r.id}/${key}` }],
          status: 'final',
          category: category('activity'),
          code,
          subject,
          effectivePeriod: { start, end },
          ...extra,
        },
      ];
    };
    const members: [string, Observation][] = [base('duration', loinc(LOINC_CODES.exerciseDuration), { valueQuantity: quantity(roundTo(r.duration_s / 60, 1), UNITS.minute) })];
    const work = sessionWorkJ({ workKj: r.work_kj, meanPowerW: r.mean_power_w, activeS: r.active_s });
    if (work !== null) {
      members.push(
        base('energy', loinc(LOINC_CODES.caloriesBurned, 'Calories burned (estimate)'), {
          valueQuantity: quantity(roundTo(fesEnergyKcal(work, input.efficiencyPct), 1), UNITS.kilocalorie),
          method: { ...kinloop(KINLOOP_CONCEPTS.energyEstimate), text: `Estimate: ${roundTo(work / 1000, 3)} kJ of crank work ÷ (${input.efficiencyPct} % assumed FES-cycling efficiency × 4184 J/kcal)` },
          note: [{ text: 'Estimated, not measured: FES cycling efficiency varies widely between riders (studies report 2–14 %).' }],
        }),
      );
    }
    const measure = (key: string, concept: { code: string; display: string }, value: number | null, unit: { unit: string; code: string }) => {
      if (value !== null) members.push(base(key, kinloop(concept), { valueQuantity: quantity(value, unit) }));
    };
    measure('mean-power', KINLOOP_CONCEPTS.meanPower, r.mean_power_w, UNITS.watt);
    measure('peak-power-5s', KINLOOP_CONCEPTS.peakPower5s, r.peak_power_5s_w, UNITS.watt);
    measure('mean-cadence', KINLOOP_CONCEPTS.meanCadence, r.mean_cadence_rpm, UNITS.perMinute);
    measure('distance', KINLOOP_CONCEPTS.distance, r.distance_m, UNITS.metre);
    measure('work', KINLOOP_CONCEPTS.work, r.work_kj, UNITS.kilojoule);
    measure('current-per-watt', KINLOOP_CONCEPTS.currentPerWatt, r.current_per_watt_ma_per_w, UNITS.milliamperePerWatt);
    const channels = orderedChannels(Object.keys(r.channels ?? {})).filter((c) => r.channels[c]?.meanCurrentMa !== null && r.channels[c]?.meanCurrentMa !== undefined);
    if (channels.length) {
      const component: ObservationComponent[] = channels.map((c) => ({ code: kinloop(channelConcept(c)), valueQuantity: quantity(r.channels[c].meanCurrentMa!, UNITS.milliampere) }));
      members.push(base('stimulation-current', kinloop(KINLOOP_CONCEPTS.stimulationCurrent), { component }));
    }
    const [panelId, panel] = base('activity', loinc(LOINC_CODES.exerciseActivity), {
      valueCodeableConcept: kinloop(KINLOOP_CONCEPTS.session),
      hasMember: members.map(([id, o]) => ({ reference: `urn:uuid:${id}`, display: o.code.text })),
    });
    add(panelId, panel);
    for (const [id, o] of members) add(id, o);
  }

  for (const c of input.checks) {
    const readings: [string, string, { systolic: number; diastolic: number } | null][] = [
      ['before', 'Before the ride', c.bpBefore],
      ['during', 'During the ride', c.bpDuring],
      ['after', 'After the ride', c.bpAfter],
    ];
    const vital = (key: string, code: CodeableConcept, when: string, extra: Partial<Observation>) => {
      const id = nameUuid(`check:${c.id}:${key}`);
      const o: Observation = {
        resourceType: 'Observation',
        id,
        identifier: [{ system: `${KINLOOP_IDS}/check-reading`, value: `${c.id}/${key}` }],
        status: 'final',
        category: category('vital-signs'),
        code,
        subject,
        effectiveDateTime: c.takenAt,
        note: [{ text: `${when}, as recorded in a Kinloop check.` }],
        ...extra,
      };
      add(id, o);
    };
    for (const [key, when, bp] of readings) {
      if (!bp) continue;
      vital(`bp-${key}`, loinc(LOINC_CODES.bpPanel), when, {
        component: [
          { code: loinc(LOINC_CODES.systolic), valueQuantity: quantity(bp.systolic, UNITS.mmHg) },
          { code: loinc(LOINC_CODES.diastolic), valueQuantity: quantity(bp.diastolic, UNITS.mmHg) },
        ],
      });
    }
    if (c.heartRateBefore !== null) vital('hr-before', loinc(LOINC_CODES.heartRate), 'Before the ride', { valueQuantity: quantity(c.heartRateBefore, UNITS.perMinute) });
    if (c.heartRateAfter !== null) vital('hr-after', loinc(LOINC_CODES.heartRate), 'After the ride', { valueQuantity: quantity(c.heartRateAfter, UNITS.perMinute) });
  }

  return {
    resourceType: 'Bundle',
    id: nameUuid(`bundle:${patientId}:${input.now.toISOString()}`),
    meta: { lastUpdated: input.now.toISOString() },
    identifier: { system: `${KINLOOP_IDS}/export`, value: nameUuid(`bundle:${patientId}:${input.now.toISOString()}`) },
    type: 'collection',
    timestamp: input.now.toISOString(),
    entry: entries,
  };
}
