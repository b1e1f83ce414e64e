// The safety wording shown beside checks, flags and prescriptions, and in the
// e-mails and page footers: the one source, kept as data so every screen and
// message says the same thing. Kinloop's own words; see PRODUCT.md "Safety".

export interface SafetyPanelText {
  title: string;
  intro: string;
  steps: string[];
  closing: string;
  /** After a check that raised an urgent flag. */
  alerted: [string, string];
  /** After one that did not (warning signs in a client not known to be at risk, say). */
  notAlerted: string;
}

export const AD_SAFETY_PANEL: SafetyPanelText = {
  title: 'Possible autonomic dysreflexia: what to do now',
  intro:
    'A sudden rise in blood pressure or these warning signs can mean autonomic dysreflexia, which needs prompt, calm action. Work through the steps in order.',
  steps: [
    'Stop the ride and switch off the stimulation.',
    'Sit the rider upright and lower the legs.',
    'Loosen anything tight: clothing, abdominal binder, leg straps and electrode straps.',
    'Check the bladder: look for a kinked or blocked catheter or a full leg bag, and empty or free it. Then consider the bowel.',
    'Measure blood pressure again every few minutes and note the readings.',
    "Follow the rider's own autonomic dysreflexia plan from their clinic.",
    'Call emergency services if the symptoms or the high blood pressure do not settle.',
  ],
  closing: 'Tell the clinic what happened once the rider is safe, and record the readings in a check.',
  alerted: [
    'The clinic has been alerted: this check is now an urgent flag on the clinic’s triage list.',
    'Kinloop is not a real-time monitor, so do not wait for a call from the clinic: work through the steps above now.',
  ],
  notAlerted: 'Kinloop is not a real-time monitor: work through the steps above now, then tell the clinic what happened.',
};

const NOT_A_MONITOR = 'Kinloop is not a real-time monitor and does not diagnose';
const FOLLOW_PROTOCOLS = 'follow your clinic’s own protocols and local regulations';

/** The full caution, where there is room for it (the rider's prescription card, the report). */
export const GENERAL_CAUTION =
  `${NOT_A_MONITOR}. If symptoms appear during a ride, stop the ride and ` +
  'follow the rider’s autonomic dysreflexia plan (sit upright, loosen tight clothing, check bladder and bowel, ' +
  'measure blood pressure every few minutes), and call emergency services if symptoms do not settle. Always ' +
  `${FOLLOW_PROTOCOLS}.`;

/** The same caution in two short lines, for pages where flags sit close by and for e-mails. */
export const SHORT_CAUTION: readonly string[] = [
  `${NOT_A_MONITOR}; ${FOLLOW_PROTOCOLS}.`,
  'If symptoms appear during a ride, stop the ride and follow the rider’s autonomic dysreflexia plan; call emergency services if symptoms do not settle.',
];

/** One line under every page and e-mail that says what Kinloop is and is not. */
export const FOOTER_LINE = `Kinloop helps clinics supervise home FES cycling. ${NOT_A_MONITOR}; ${FOLLOW_PROTOCOLS}.`;

export interface ScreeningItem {
  id: string;
  label: string;
}

export const PRE_PROGRAM_SCREENING: { title: string; intro: string; items: ScreeningItem[] } = {
  title: 'Before a home program starts',
  intro: 'The clinic screens each rider for these before FES cycling begins at home.',
  items: [
    { id: 'bone_health', label: 'Bone health and risk of fracture' },
    { id: 'heterotopic_ossification', label: 'Heterotopic ossification (bone forming in soft tissue)' },
    { id: 'electrode_site_skin', label: 'Skin where the electrodes will go' },
    { id: 'autonomic_dysreflexia', label: 'Risk of autonomic dysreflexia' },
    { id: 'implanted_devices', label: 'Implanted electronic devices, such as a pacemaker or a pump' },
    { id: 'epilepsy', label: 'Epilepsy' },
    { id: 'pregnancy', label: 'Pregnancy' },
    { id: 'active_thrombosis', label: 'Active thrombosis (a blood clot)' },
  ],
};

/** Printed on every page of a report that leaves Kinloop as a file. */
export const NOT_DIAGNOSTIC =
  'Kinloop is not a diagnostic device. These figures come from the cycle\u2019s ride files and the records kept in Kinloop; ' +
  'read them with the client\u2019s clinical picture and your clinic\u2019s own protocols.';
