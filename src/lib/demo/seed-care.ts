// The demo's care records (issue 12), all invented: screenings, clearance
// documents, the at-risk riders' own dysreflexia plans and a progression plan,
// so that every readiness state and a proposal to step up can be seen. Jonah's
// sessions can grow to 60 minutes in 5-minute steps; Dev is at risk and has no
// plan on file; Hollis's clearance is due for review; Elsie awaits her
// clearance; Wren, who started late, is not screened yet.
import type { Db } from '../data';
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { refreshProgression } from '../care/progression-service';
import { PRE_PROGRAM_SCREENING } from '../checks/safety-text';
import { putObjectStream } from '../storage/s3';
import { addDays, localDate } from '../time/local-date';
import type { SeededIds } from './seed';

/** A one-page PDF that says it is invented demo data. */
function demoPdf(text: string): Buffer {
  const stream = `BT /F1 14 Tf 72 720 Td (${text.replace(/[()\\]/g, '')}) Tj ET`;
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
    `<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`,
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
  ];
  let body = '%PDF-1.4\n';
  const offsets: number[] = [];
  objects.forEach((o, i) => {
    offsets.push(body.length);
    body += `${i + 1} 0 obj\n${o}\nendobj\n`;
  });
  const xref = body.length;
  body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n${offsets.map((o) => `${String(o).padStart(10, '0')} 00000 n \n`).join('')}`;
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(body, 'latin1');
}

const CLEARED = ['jonah', 'dev', 'mairi', 'annika', 'kofi', 'rafael', 'noor', 'hollis'];
const NOT_SCREENED = ['wren'];

export async function seedDemoCare(knex: Db, ids: SeededIds, now: Date): Promise<void> {
  const today = localDate(now, 'Europe/London');
  const therapist = ids.users.therapist;
  for (const [key, clientId] of Object.entries(ids.clients)) {
    if (NOT_SCREENED.includes(key)) continue;
    const assessedOn = addDays(today, -200);
    const items = PRE_PROGRAM_SCREENING.items.map((i) => ({
      id: i.id,
      status: key === 'kofi' && i.id === 'electrode_site_skin' ? 'concern' : 'no_concern',
      note: key === 'kofi' && i.id === 'electrode_site_skin' ? 'Healed pressure mark above the left knee: keep electrodes clear of it and check after each ride.' : null,
      lastScanOn: i.id === 'bone_health' ? addDays(today, -420) : null,
    }));
    await knex('screening_versions').insert({ clinic_id: ids.clinicId, client_id: clientId, version: 1, items: JSON.stringify(items), assessed_on: assessedOn, assessed_by: therapist });
    if (!CLEARED.includes(key)) continue;
    const clearedOn = addDays(today, key === 'hollis' ? -345 : -190);
    const bytes = demoPdf(`Invented demo clearance for FES cycling - ${key}`);
    const storageKey = `clearances/${ids.clinicId}/${clientId}/demo-${key}`;
    await putObjectStream(storageKey, Readable.from([bytes]), 'application/pdf');
    await knex('clearances').insert({
      clinic_id: ids.clinicId,
      client_id: clientId,
      storage_key: storageKey,
      sha256: createHash('sha256').update(bytes).digest('hex'),
      byte_size: bytes.length,
      content_type: 'application/pdf',
      original_name: `clearance-${key}.pdf`,
      cleared_on: clearedOn,
      clinician: key === 'hollis' ? 'Dr Imogen Castellane' : 'Dr Felix Ambrose-Tate',
      review_on: addDays(clearedOn, 365),
      uploaded_by: therapist,
    });
  }
  const plans: Record<string, { resting: [number, number]; signs: string; steps: string; prescribed: string; call: string; contacts: { name: string; relationship: string; phone: string }[] }> = {
    jonah: {
      resting: [104, 66],
      signs: 'Pounding headache, flushed face and neck, blocked nose, goosebumps above the chest.',
      steps: 'Stop the ride and sit up. Loosen the abdominal binder and leg straps. Check the catheter and leg bag first, then the bowel. Take blood pressure every 3 minutes.',
      prescribed: 'As written by his spinal physician (invented demo text): the medication named in his own letter, in the dose that letter gives.',
      call: 'Ruth first. If the pressure stays above 150 after the bladder check, call emergency services and say "autonomic dysreflexia".',
      contacts: [
        { name: 'Ruth Okafor', relationship: 'partner', phone: '+44 7700 900123' },
        { name: 'Larchfield spinal nurse line', relationship: 'clinic', phone: '+44 20 7946 0991' },
      ],
    },
    kofi: {
      resting: [110, 70],
      signs: 'Sweating above the injury, blurred vision, slow pulse.',
      steps: 'Stop the ride, sit him upright with legs down, free anything tight and check the bladder.',
      prescribed: '',
      call: 'Sam, then the clinic; emergency services if symptoms do not settle.',
      contacts: [{ name: 'Sam Forsyth', relationship: 'brother', phone: '+44 7700 900456' }],
    },
  };
  for (const [key, p] of Object.entries(plans)) {
    await knex('ad_plans').insert({
      clinic_id: ids.clinicId,
      client_id: ids.clients[key],
      version: 1,
      resting_systolic: p.resting[0],
      resting_diastolic: p.resting[1],
      signs: p.signs,
      first_steps: p.steps,
      physician_prescribed: p.prescribed || null,
      who_to_call: p.call,
      contacts: JSON.stringify(p.contacts),
      created_by: therapist,
    });
  }
  // Jonah's latest version grows in 5-minute steps up to 60 minutes.
  const latest = await knex('prescriptions').where({ client_id: ids.clients.jonah }).orderBy('version', 'desc').first('id');
  await knex('prescriptions').where({ id: latest.id }).update({ progression: JSON.stringify({ kind: 'minutes', step: 5, upTo: 60 }) });
  for (const clientId of Object.values(ids.clients)) await refreshProgression(knex, clientId, now);
}
