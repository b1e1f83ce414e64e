// Kinloop's demo scenario: an invented outreach clinic and the people in its
// home cycling program. Every name here is made up for the demo.
import type { AdRisk, Diagnosis, StaffRole } from '../db/tables';

export const DEMO_CLINIC = { name: 'Larchfield Neuro Outreach', timeZone: 'Europe/London' };

export interface DemoStaff {
  key: string;
  email: string;
  name: string;
  role: StaffRole;
}
export const DEMO_STAFF: DemoStaff[] = [
  { key: 'admin', email: 'admin@kinloop.test', name: 'Priya Lindqvist', role: 'admin' },
  { key: 'therapist', email: 'therapist@kinloop.test', name: 'Tomás Whitcombe', role: 'therapist' },
  { key: 'therapist2', email: 'therapist2@kinloop.test', name: 'Ada Mbeki', role: 'therapist' },
];

export interface DemoClient {
  key: string;
  name: string;
  dateOfBirth: string;
  diagnosis: Diagnosis;
  injuryLevel: string | null;
  aisGrade: string | null;
  adRisk: AdRisk;
  timeZone: string;
  bodyMassKg: number;
  /** Pedals by their own effort too (reports then show the volitional-cycling figure for comparison). */
  volitionalControl: boolean;
  /** Days before the seed date that the program started. */
  startedDaysAgo: number;
  therapist: 'therapist' | 'therapist2';
  /** The rider's own sign-in, when they have one. */
  account?: { email: string };
}
export const DEMO_CLIENTS: DemoClient[] = [
  { key: 'jonah', name: 'Jonah Pryce', dateOfBirth: '1986-03-14', diagnosis: 'sci', injuryLevel: 'T4', aisGrade: 'A', adRisk: 'at_risk', timeZone: 'Europe/London', volitionalControl: false, bodyMassKg: 74, startedDaysAgo: 182, therapist: 'therapist', account: { email: 'client@kinloop.test' } },
  { key: 'dev', name: 'Dev Ramaswamy', dateOfBirth: '1979-11-02', diagnosis: 'sci', injuryLevel: 'C6', aisGrade: 'B', adRisk: 'at_risk', timeZone: 'Europe/London', volitionalControl: false, bodyMassKg: 68, startedDaysAgo: 175, therapist: 'therapist' },
  { key: 'mairi', name: 'Mairi Caldwell', dateOfBirth: '1971-06-25', diagnosis: 'ms', injuryLevel: null, aisGrade: null, adRisk: 'not_at_risk', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 61, startedDaysAgo: 168, therapist: 'therapist', account: { email: 'client2@kinloop.test' } },
  { key: 'hollis', name: 'Hollis Ferreira', dateOfBirth: '1958-01-30', diagnosis: 'stroke', injuryLevel: null, aisGrade: null, adRisk: 'not_at_risk', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 82, startedDaysAgo: 160, therapist: 'therapist' },
  { key: 'annika', name: 'Annika Brand', dateOfBirth: '1994-09-09', diagnosis: 'sci', injuryLevel: 'T10', aisGrade: 'C', adRisk: 'not_at_risk', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 57, startedDaysAgo: 150, therapist: 'therapist2' },
  { key: 'kofi', name: 'Kofi Mensah-Lowe', dateOfBirth: '1990-04-18', diagnosis: 'sci', injuryLevel: 'T6', aisGrade: 'A', adRisk: 'at_risk', timeZone: 'Europe/London', volitionalControl: false, bodyMassKg: 79, startedDaysAgo: 182, therapist: 'therapist' },
  { key: 'elsie', name: 'Elsie Varga', dateOfBirth: '1966-12-05', diagnosis: 'ms', injuryLevel: null, aisGrade: null, adRisk: 'unknown', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 66, startedDaysAgo: 120, therapist: 'therapist2' },
  { key: 'rafael', name: 'Rafael Quint', dateOfBirth: '2001-07-21', diagnosis: 'cerebral_palsy', injuryLevel: null, aisGrade: null, adRisk: 'not_at_risk', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 59, startedDaysAgo: 140, therapist: 'therapist2' },
  { key: 'wren', name: 'Wren Tallis', dateOfBirth: '1983-02-11', diagnosis: 'sci', injuryLevel: 'L1', aisGrade: 'D', adRisk: 'not_at_risk', timeZone: 'Europe/London', volitionalControl: true, bodyMassKg: 71, startedDaysAgo: 90, therapist: 'therapist' },
  { key: 'noor', name: 'Noor Haddad', dateOfBirth: '1962-08-03', diagnosis: 'stroke', injuryLevel: null, aisGrade: null, adRisk: 'not_at_risk', timeZone: 'Europe/Dublin', volitionalControl: true, bodyMassKg: 64, startedDaysAgo: 60, therapist: 'therapist2' },
];

export interface DemoCarer {
  key: string;
  email: string;
  name: string;
  links: { client: string; relationship: string }[];
}
export const DEMO_CARERS: DemoCarer[] = [
  { key: 'carer', email: 'carer@kinloop.test', name: 'Ruth Okafor', links: [{ client: 'jonah', relationship: 'partner' }, { client: 'dev', relationship: 'support worker' }] },
  { key: 'carer2', email: 'carer2@kinloop.test', name: 'Sam Forsyth', links: [{ client: 'kofi', relationship: 'brother' }] },
];

/** The sign-ins printed by `npm start` (which reads the JSON directly) and listed in README. */
export { default as DEMO_SIGN_INS } from './sign-ins.json';
