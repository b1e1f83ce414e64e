import type { APIRoute } from 'astro';
import { health } from '../../lib/health/health';
import { json } from '../../lib/http/respond';

const NAMES: Record<string, string> = { db: 'the database (PostgreSQL)', storage: 'the file store (S3)', mail: 'the mail server (SMTP)' };

export const GET: APIRoute = async () => {
  const status = await health();
  const down = Object.entries(status).filter(([, v]) => v !== 'ok').map(([k]) => k);
  if (!down.length) return json(status);
  return json({ ...status, down, message: `Not reachable: ${down.map((k) => NAMES[k]).join(', ')}.` }, 503);
};
