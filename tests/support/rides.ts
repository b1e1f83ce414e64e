import { randomInt } from 'node:crypto';
import type { Http } from './http';

/** A small valid ride file; `startedAt` and a random power offset make each one distinct. */
export function rideCsv({ startedAt = new Date().toISOString(), minutes = 2, powerW = 20 + randomInt(0, 1000) / 100, currentMa = 60 } = {}): string {
  const lines = ['Kinloop test rig', `Start time: ${startedAt}`, '', 'time (s),phase,cadence (rpm),power (W),quad L (mA),quad R (mA)'];
  for (let t = 0; t < minutes * 60; t++) {
    const phase = t < 20 ? 'passive' : t >= minutes * 60 - 10 ? 'cooldown' : 'active';
    const on = phase === 'active';
    lines.push(`${t},${phase},${on ? 42 : 30},${on ? powerW.toFixed(2) : '0.5'},${on ? currentMa : 0},${on ? currentMa + 2 : 0}`);
  }
  return lines.join('\n') + '\n';
}

export function formFor(clientId: string, files: { name: string; content: string | Uint8Array }[], extra: Record<string, string | string[]> = {}): FormData {
  const form = new FormData();
  form.set('clientId', clientId);
  for (const [k, v] of Object.entries(extra)) for (const value of [v].flat()) form.append(k, value);
  for (const f of files) form.append('files', new Blob([f.content as BlobPart], { type: 'text/csv' }), f.name);
  return form;
}

/** Uploads files and waits until none is queued; returns the final per-file results. */
export async function uploadAndWait(http: Http, clientId: string, files: { name: string; content: string | Uint8Array }[], extra: Record<string, string | string[]> = {}) {
  const res = await http.request('POST', '/api/uploads', formFor(clientId, files, extra));
  const body = await res.json();
  if (res.status >= 400) throw new Error(`upload failed: ${res.status} ${JSON.stringify(body)}`);
  const results = body.files as { uploadId: string; status: string; sessionId?: string; duplicateOf?: string; error?: { code: string; message: string; line?: number } }[];
  const deadline = Date.now() + 30_000;
  for (let i = 0; i < results.length; i++) {
    while (results[i].status === 'queued' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 200));
      const u = await http.json('GET', `/api/uploads/${results[i].uploadId}`);
      results[i] = { ...results[i], status: u.body.status, sessionId: u.body.sessionId ?? undefined, duplicateOf: u.body.duplicateOf ?? undefined, error: u.body.error ?? undefined };
    }
  }
  return results;
}
