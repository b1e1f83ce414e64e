// The rider's own autonomic dysreflexia plan, as the clinic writes it: usual
// resting blood pressure, the signs this rider gets, their first steps, what
// their physician prescribed for an episode (the clinic's own free text:
// Kinloop never suggests medication), who to call and emergency contacts.
// Every save is a new version. Staff write it; the rider and carers read it.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import { line, paragraph } from '../validation/fields';

const text = (label: string, max: number) => paragraph(z.string().trim().max(max, `${label}: at most ${max} characters.`), label);
const required = (label: string, max: number, what: string) => paragraph(z.string().trim().min(1, `${label}: ${what}`).max(max, `${label}: at most ${max} characters.`), label);

// A phone number as people write it: digits with spaces, brackets, dots,
// dashes and a leading +; the tel: link keeps only + and the digits.
const phone = z
  .string()
  .trim()
  .min(1, 'Phone: enter the number to call.')
  .max(40, 'Phone: at most 40 characters.')
  .regex(/^\+?[0-9][0-9 ().-]*$/, 'Phone: use digits, spaces, brackets, dots or dashes, with + first for an international number.')
  .refine((v) => v.replace(/\D/g, '').length >= 3 && v.replace(/\D/g, '').length <= 20, 'Phone: 3 to 20 digits.');

const contactSchema = z
  .object({
    name: line(z.string().trim().min(1, 'Contact: enter a name.').max(120, 'Contact: at most 120 characters.'), 'Contact'),
    relationship: line(z.string().trim().max(80, 'Relationship: at most 80 characters.'), 'Relationship').nullish(),
    phone,
  })
  .strict();

const pressure = (label: string, min: number, max: number) =>
  z.number({ invalid_type_error: `${label}: enter a whole number of mmHg.` }).int(`${label}: enter a whole number of mmHg.`).min(min, `${label}: enter ${min}–${max} mmHg.`).max(max, `${label}: enter ${min}–${max} mmHg.`);

export const adPlanInputSchema = z
  .object({
    restingSystolic: pressure('Resting systolic', 60, 200).nullish(),
    restingDiastolic: pressure('Resting diastolic', 30, 130).nullish(),
    signs: required('Signs', 2000, 'list the signs this rider gets.'),
    firstSteps: required('First steps', 4000, 'write the first steps to take.'),
    physicianPrescribed: text('Prescribed by their physician', 2000).nullish(),
    whoToCall: required('Who to call', 1000, 'say who to call and when.'),
    contacts: z.array(contactSchema).max(6, 'Emergency contacts: at most 6.'),
  })
  .strict()
  .refine((p) => p.restingSystolic == null || p.restingDiastolic == null || p.restingDiastolic < p.restingSystolic, { path: ['restingDiastolic'], message: 'Resting diastolic: must be below the systolic.' });
export type AdPlanInput = z.infer<typeof adPlanInputSchema>;

export interface AdPlanContact {
  name: string;
  relationship: string | null;
  phone: string;
  /** "tel:+441234567890" */
  tel: string;
}

export const telOf = (phone: string) => `tel:${phone.trim().startsWith('+') ? '+' : ''}${phone.replace(/\D/g, '')}`;

export function adPlanView(row: {
  id: string;
  version: number;
  resting_systolic: number | null;
  resting_diastolic: number | null;
  signs: string;
  first_steps: string;
  physician_prescribed: string | null;
  who_to_call: string;
  contacts: { name: string; relationship?: string | null; phone: string }[];
  created_by: string;
  created_by_name?: string;
  created_at: Date;
}) {
  return {
    id: row.id,
    version: row.version,
    restingSystolic: row.resting_systolic,
    restingDiastolic: row.resting_diastolic,
    signs: row.signs,
    firstSteps: row.first_steps,
    physicianPrescribed: row.physician_prescribed,
    whoToCall: row.who_to_call,
    contacts: row.contacts.map((c): AdPlanContact => ({ name: c.name, relationship: c.relationship ?? null, phone: c.phone, tel: telOf(c.phone) })),
    writtenBy: { userId: row.created_by, name: row.created_by_name ?? null },
    writtenAt: row.created_at.toISOString(),
  };
}
export type AdPlanView = ReturnType<typeof adPlanView>;

async function versions(db: Db, clientId: string) {
  return db('ad_plans as p').join('users as u', 'u.id', 'p.created_by').where('p.client_id', clientId).orderBy('p.version', 'desc').select('p.*', 'u.name as created_by_name');
}

/** The current plan of a client, without an audit entry (for pages and answers that audit already). */
export async function currentAdPlan(db: Db, clientId: string): Promise<AdPlanView | null> {
  const row = await db('ad_plans as p').join('users as u', 'u.id', 'p.created_by').where('p.client_id', clientId).orderBy('p.version', 'desc').first('p.*', 'u.name as created_by_name');
  return row ? adPlanView(row) : null;
}

/** The rider, carers and staff read the plan; staff also see earlier versions. */
export async function readAdPlan(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'ad_plan.view');
  const rows = await versions(client.db, client.id);
  return { current: rows[0] ? adPlanView(rows[0]) : null, history: client.managed ? rows.map(adPlanView) : [] };
}

export async function saveAdPlan(ctx: RequestContext, clientId: string, input: AdPlanInput) {
  const client = await scope(ctx).client(clientId, 'manage', 'ad_plan.change');
  await client.transaction(async (tx) => {
    await tx.lock(`ad_plan:${client.id}`);
    const latest = await tx.db('ad_plans').max('version as v').first();
    const [created] = await tx.db('ad_plans')
      .insert({
        version: Number(latest?.v ?? 0) + 1,
        resting_systolic: input.restingSystolic ?? null,
        resting_diastolic: input.restingDiastolic ?? null,
        signs: input.signs,
        first_steps: input.firstSteps,
        physician_prescribed: input.physicianPrescribed || null,
        who_to_call: input.whoToCall,
        contacts: JSON.stringify(input.contacts.map((c) => ({ name: c.name, relationship: c.relationship || null, phone: c.phone }))),
        created_by: ctx.viewer.userId,
      })
      .returning(['id', 'version']);
    await tx.audit({ action: 'ad_plan.version_created', recordType: 'ad_plan', recordId: created.id, detail: { version: created.version } });
  });
  const rows = await versions(client.db, client.id);
  return { current: adPlanView(rows[0]), history: rows.map(adPlanView) };
}
