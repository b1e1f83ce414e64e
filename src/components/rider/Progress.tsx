import type { ReactNode } from 'react';
import { useApi } from '../api';
import { duration, number, watts } from '../../lib/format/numbers';
import { capitalise } from '../../lib/format/words';
import { Loaded } from '../ui/Loading';
import { PALETTE } from '../palette';
import { formatInstantDate, weekOf } from '../../lib/time/format';
import { km } from './goal-words';
import { GoalSummary } from './GoalSummary';
import { MEASURES } from './progress-words';
import type { Goal, ProgressData } from './types';
import { WeekChart } from './WeekChart';

/** The rider's progress since the program started: weekly charts, personal bests and the distance goal. */
export default function Progress({ clientId, timeZone, locale }: { clientId: string; timeZone: string; locale: string }) {
  const [progress, reload] = useApi<ProgressData>(`/api/clients/${clientId}/progress`);
  const [goal, reloadGoal] = useApi<{ goal: Goal | null }>(`/api/clients/${clientId}/goal`);
  return (
    <div className="space-y-8">
      <Loaded value={progress} reload={reload} label="your progress">
        {(data) => <ProgressView data={data} timeZone={timeZone} locale={locale} />}
      </Loaded>
      <section aria-labelledby="goal-h" className="card space-y-3">
        <h2 id="goal-h" className="text-xl">
          Distance goal
        </h2>
        <Loaded value={goal} reload={reloadGoal} label="your distance goal">
          {(data) => <GoalSummary goal={data.goal} locale={locale} />}
        </Loaded>
      </section>
    </div>
  );
}

function ProgressView({ data, timeZone, locale }: { data: ProgressData; timeZone: string; locale: string }) {
  const { totals, bests, weeks } = data;
  const { longestActive, highestPower5s, mostDistanceWeek } = bests;
  return (
    <div className="space-y-8">
      <p className="text-xl" data-testid="totals">
        {totals.sessions
          ? `Since your program started: ${totals.sessions} ${totals.sessions === 1 ? 'session' : 'sessions'}, ${number(totals.activeMinutes, 0, locale)} active minutes and ${km(totals.distanceM, locale)}.`
          : 'Your sessions will show here once their ride files are uploaded.'}
      </p>

      <section aria-labelledby="bests-h" className="space-y-3">
        <h2 id="bests-h" className="text-xl">
          Personal bests
        </h2>
        <ul className="grid gap-4 md:grid-cols-3">
          <Best title="Longest active session" value={longestActive ? duration(longestActive.activeS) : null}>
            {longestActive && <RideLink id={longestActive.sessionId} day={formatInstantDate(longestActive.startedAt, locale, timeZone, 'weekdayDayMonth')} />}
          </Best>
          <Best title="Highest 5-second power" value={highestPower5s ? watts(highestPower5s.peakPower5sW, locale) : null}>
            {highestPower5s && <RideLink id={highestPower5s.sessionId} day={formatInstantDate(highestPower5s.startedAt, locale, timeZone, 'weekdayDayMonth')} />}
          </Best>
          <Best title="Most distance in a week" value={mostDistanceWeek ? km(mostDistanceWeek.distanceM, locale) : null}>
            {mostDistanceWeek && (
              <p>
                {capitalise(weekOf(mostDistanceWeek.monday, locale, { year: true }))}, {mostDistanceWeek.sessions} {mostDistanceWeek.sessions === 1 ? 'session' : 'sessions'}
              </p>
            )}
          </Best>
        </ul>
      </section>

      <section aria-labelledby="weeks-h" className="space-y-3">
        <h2 id="weeks-h" className="text-xl">
          Week by week
        </h2>
        <div className="grid gap-4">
          <WeekChart id="power" title="Mean power" axis="Mean power (W)" kind="line" colour={PALETTE.lagoon} measure={MEASURES.power} weeks={weeks} locale={locale} />
          <WeekChart id="minutes" title="Active minutes" axis="Active minutes" kind="bar" colour={PALETTE.slate} measure={MEASURES.minutes} weeks={weeks} locale={locale} />
          <WeekChart id="distance" title="Distance" axis="Distance (km)" kind="bar" colour={PALETTE.ochre} measure={MEASURES.distance} weeks={weeks} locale={locale} />
        </div>
      </section>
    </div>
  );
}

function Best({ title, value, children }: { title: string; value: string | null; children: ReactNode }) {
  return (
    <li className="card space-y-1" data-testid="best">
      <h3 className="text-base font-semibold tracking-wide text-ink-soft uppercase">{title}</h3>
      {value ? (
        <>
          <p className="text-3xl font-semibold">{value}</p>
          {children}
        </>
      ) : (
        <p>Not yet: this fills in once sessions with this figure are uploaded.</p>
      )}
    </li>
  );
}

function RideLink({ id, day }: { id: string; day: string }) {
  return (
    <p>
      <a href={`/sessions/${id}`} className="inline-flex min-h-12 items-center font-semibold">
        {day}
      </a>
    </p>
  );
}
