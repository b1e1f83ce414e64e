// Import profiles: a layout the built-in header words do not know is refused,
// then read through a profile chosen at upload or attached to the device serial.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { uploadAndWait } from '../support/rides';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('profiles');
});
afterAll(closeDb);

function foreignFile(serial: string, start: string) {
  const rows = ['Trainer X export', `Serial: ${serial}`, `Start time: ${start}`, 'Zeit;Modus;Tritt;Leistung;QL'];
  for (let t = 0; t < 90; t++) rows.push(`${t};${t < 10 ? 'passive' : 'active'};40;${t < 10 ? 0 : '18,5'};${t < 10 ? 0 : 55}`);
  return rows.join('\n') + '\n';
}

const mapping = { name: 'Trainer X', deviceName: 'Trainer X', columns: { Zeit: { field: 'time' }, Modus: { field: 'phase' }, Tritt: { field: 'cadence' }, Leistung: { field: 'power', unit: 'W' }, QL: { field: 'quadriceps_left', unit: 'mA' } } };

describe('import profiles', () => {
  it('a file in an unknown layout is refused, and read through the profile chosen at upload', async () => {
    const carer = await world.as('carer');
    const admin = await world.as('admin');
    const [refused] = await uploadAndWait(carer, world.clientId, [{ name: 'x.csv', content: foreignFile('TX-1', '2026-05-04T09:00:00Z') }]);
    expect(refused.status).toBe('rejected');

    const preview = await admin.json('POST', '/api/import-profiles/preview', { sampleBase64: Buffer.from(foreignFile('TX-1', '2026-05-04T09:00:00Z')).toString('base64'), profile: mapping });
    expect(preview.body).toMatchObject({ ok: true, deviceSerial: 'TX-1', decimalComma: true });
    expect(preview.body.columns.map((c: { field: string }) => c.field)).toEqual(['time', 'phase', 'cadence', 'power', 'quadriceps_left']);
    expect(preview.body.rows[11]).toEqual([11, 'active', 40, 18.5, 55]);

    const created = await admin.json('POST', '/api/import-profiles', mapping);
    expect(created.status).toBe(201);
    // The same bytes again, with the profile: read again rather than given the old refusal.
    const [accepted] = await uploadAndWait(carer, world.clientId, [{ name: 'x.csv', content: foreignFile('TX-1', '2026-05-04T09:00:00Z') }], { importProfileId: created.body.id });
    expect(accepted.status).toBe('accepted');
    const session = await carer.json('GET', `/api/sessions/${accepted.sessionId}`);
    expect(session.body.summary).toMatchObject({ meanPowerW: 18.5, activeS: 80, passiveS: 10 });
  });

  it('a profile attached to a device serial reads that device’s files without being chosen', async () => {
    const carer = await world.as('carer');
    const admin = await world.as('admin');
    const profile = await admin.json('POST', '/api/import-profiles', { ...mapping, name: 'Trainer X by serial' });
    expect((await admin.json('POST', '/api/devices', { serial: 'TX-2', name: 'Loan trainer', importProfileId: profile.body.id })).status).toBe(201);
    const [r] = await uploadAndWait(carer, world.clientId, [{ name: 'y.csv', content: foreignFile('TX-2', '2026-05-06T09:00:00Z') }]);
    expect(r.status).toBe('accepted');
  });
});
