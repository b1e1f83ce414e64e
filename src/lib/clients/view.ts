import type { ClientRow } from '../db/tables';

/** A client record as the API shows it. */
export function clientView(row: ClientRow) {
  return {
    id: row.id,
    clinicId: row.clinic_id,
    name: row.display_name,
    dateOfBirth: row.date_of_birth,
    diagnosis: row.diagnosis,
    injuryLevel: row.injury_level,
    aisGrade: row.ais_grade,
    adRisk: row.ad_risk,
    timeZone: row.time_zone,
    bodyMassKg: row.body_mass_kg === null ? null : Number(row.body_mass_kg),
    programStart: row.program_start,
    volitionalControl: row.volitional_control ?? null,
    primaryTherapistId: row.primary_therapist_id,
    baselineSystolic: row.baseline_systolic,
    hasAccount: row.user_id !== null,
  };
}
export type ClientView = ReturnType<typeof clientView>;
