// Codes for what a FHIR bundle from Kinloop says. LOINC where a code exists;
// LOINC has none for cycling power, cadence, distance ridden or stimulation
// current, so those live in a code system of Kinloop's own. Its URL is a
// canonical name that stays the same across installations (it need not
// resolve); the bundle carries the CodeSystem resource that defines it.
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../rides/types';
import { channelLabel } from '../../components/rides/format';

export const LOINC = 'http://loinc.org';
export const UCUM = 'http://unitsofmeasure.org';
export const OBSERVATION_CATEGORY = 'http://terminology.hl7.org/CodeSystem/observation-category';
export const KINLOOP_CODES = 'https://fhir.kinloop.app/CodeSystem/fes-cycling';
export const KINLOOP_IDS = 'https://fhir.kinloop.app/identifier';

// source: LOINC codes as PRODUCT.md lists them ("Sources for check values"): BP panel 85354-9,
// systolic 8480-6, diastolic 8462-4, heart rate 8867-4, exercise activity 73985-4,
// exercise duration 55411-3, calories burned 55424-6.
export const LOINC_CODES = {
  bpPanel: { code: '85354-9', display: 'Blood pressure panel with all children optional' },
  systolic: { code: '8480-6', display: 'Systolic blood pressure' },
  diastolic: { code: '8462-4', display: 'Diastolic blood pressure' },
  heartRate: { code: '8867-4', display: 'Heart rate' },
  exerciseActivity: { code: '73985-4', display: 'Exercise activity' },
  exerciseDuration: { code: '55411-3', display: 'Exercise duration' },
  caloriesBurned: { code: '55424-6', display: 'Calories burned' },
} as const;

/** UCUM codes of the units Kinloop writes. */
export const UNITS = {
  watt: { unit: 'W', code: 'W' },
  perMinute: { unit: '/min', code: '/min' },
  metre: { unit: 'm', code: 'm' },
  milliampere: { unit: 'mA', code: 'mA' },
  milliamperePerWatt: { unit: 'mA/W', code: 'mA/W' },
  kilojoule: { unit: 'kJ', code: 'kJ' },
  kilocalorie: { unit: 'kcal', code: 'kcal' },
  minute: { unit: 'min', code: 'min' },
  mmHg: { unit: 'mmHg', code: 'mm[Hg]' },
} as const;

export const KINLOOP_CONCEPTS = {
  session: { code: 'fes-leg-cycling', display: 'FES leg cycling session' },
  meanPower: { code: 'mean-power', display: 'Mean power over the stimulated phase' },
  peakPower5s: { code: 'peak-power-5s', display: 'Highest 5-second mean power' },
  meanCadence: { code: 'mean-cadence', display: 'Mean cadence over the stimulated phase' },
  distance: { code: 'distance', display: 'Distance ridden' },
  work: { code: 'work', display: 'Crank work' },
  stimulationCurrent: { code: 'stimulation-current', display: 'Mean stimulation current per channel over the stimulated phase' },
  currentPerWatt: { code: 'current-per-watt', display: 'Sum of mean channel currents per watt of mean power' },
  energyEstimate: { code: 'energy-estimate-fes-efficiency', display: 'Estimate: crank work divided by an assumed FES-cycling efficiency' },
} as const;

/** A component code per stimulation channel: "stimulation-current.quadriceps_left". */
export const channelConcept = (channel: string) => ({ code: `stimulation-current.${channel}`, display: `Mean stimulation current, ${channelLabel(channel).toLowerCase()}` });

/** The CodeSystem resource that defines Kinloop's codes, carried in every bundle. */
export function kinloopCodeSystem() {
  const concepts = [...Object.values(KINLOOP_CONCEPTS), ...[...NAMED_CHANNELS, ...NUMBERED_CHANNELS].map(channelConcept)];
  return {
    resourceType: 'CodeSystem' as const,
    id: 'kinloop-fes-cycling',
    url: KINLOOP_CODES,
    version: '1',
    name: 'KinloopFesCycling',
    title: 'Kinloop FES cycling measures',
    status: 'active' as const,
    content: 'complete' as const,
    caseSensitive: true,
    description: 'Measures of functional electrical stimulation (FES) leg cycling for which LOINC has no code, as Kinloop computes them from ride files.',
    count: concepts.length,
    concept: concepts.map((c) => ({ code: c.code, display: c.display })),
  };
}
