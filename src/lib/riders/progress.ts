import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { personalBests } from '../rider/personal-bests';
import { weeklyProgress } from '../rider/weekly-progress';
import { loadHistory } from '../supervision/history';
import { localDate } from '../time/local-date';
import { programStartOf, riderSessions } from './sessions';

export async function riderProgress(ctx: RequestContext, clientId: string, now = new Date()) {
  const grant = await scope(ctx).client(clientId, 'read', 'progress.view');
  const client = grant.row;
  const h = await loadHistory(grant.db, client);
  const sessions = riderSessions(h);
  const start = programStartOf(h, localDate(now, client.time_zone));
  const weeks = weeklyProgress(sessions, client.time_zone, start, now);
  return {
    programStart: start,
    weeks,
    bests: personalBests(sessions, client.time_zone),
    totals: {
      sessions: sessions.length,
      activeMinutes: Math.round(sessions.reduce((s, r) => s + r.activeS, 0) / 60),
      distanceM: Math.round(sessions.reduce((s, r) => s + (r.distanceM ?? 0), 0)),
    },
  };
}
