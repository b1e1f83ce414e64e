import type { APIRoute } from 'astro';
import { health } from '../../lib/health/health';
import { json } from '../../lib/http/respond';

export const GET: APIRoute = async () => {
  const status = await health();
  const down = Object.entries(status).filter(([, v]) => v !== 'ok').map(([k]) => k);
  return json(down.length ? { ...status, down } : status, down.length ? 503 : 200);
};
