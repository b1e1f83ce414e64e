import { useApi } from '../api';
import { distance, minutes, watts } from '../../lib/format/numbers';
import { Loaded } from '../ui/Loading';
import { formatDateTime, formatInstantDate } from '../../lib/time/format';
import { localDate } from '../../lib/time/local-date';
import type { WeekData } from './types';
import { WeekDots } from './WeekDots';
import { nextDueWords, shortNote, streakWords, weekHeadline, type DueTone } from './week-words';

const DUE_TONE: Record<DueTone, string> = {
  done: 'border-l-moss bg-moss-tint',
  due: 'border-l-lagoon bg-lagoon-tint',
  paused: 'border-l-slate bg-slate-tint',
  none: 'border-l-line-strong bg-surface',
};

/** The rider's home: this week against the prescription, the streak, the next session and the latest one. */
export default function MyWeek({ clientId, locale }: { clientId: string; locale: string }) {
  const [week, reload] = useApi<WeekData>(`/api/clients/${clientId}/week`);
  return (
    <Loaded value={week} reload={reload} label="your week">
      {(data) => <WeekView week={data} locale={locale} />}
    </Loaded>
  );
}

function WeekView({ week, locale }: { week: WeekData; locale: string }) {
  const today = localDate(new Date(), week.timeZone);
  const due = nextDueWords(week, today, locale);
  const streak = streakWords(week.streakWeeks);
  const short = shortNote(week);
  return (
    <div className="space-y-6">
      <div className="grid gap-4 md:grid-cols-[3fr_2fr]">
        <section aria-labelledby="this-week-h" className="card space-y-4">
          <h2 id="this-week-h" className="text-base font-semibold tracking-wide text-ink-soft uppercase">
            This week
          </h2>
          <p className="text-3xl font-semibold sm:text-4xl" data-testid="week-headline">
            {weekHeadline(week)}
          </p>
          <WeekDots counted={week.counted} prescribed={week.prescribed} />
          {short && <p className="text-ink-soft">{short}</p>}
          {week.sessions.length > 0 && (
            <ul className="divide-y divide-line border-t border-line" aria-label="This week’s sessions">
              {week.sessions.map((s) => (
                <li key={s.id} className="flex flex-wrap items-baseline justify-between gap-x-4 py-2">
                  <a href={`/sessions/${s.id}`} className="inline-flex min-h-12 items-center font-semibold">
                    {s.startedAt ? formatInstantDate(s.startedAt, locale, week.timeZone, 'weekdayDayMonth') : 'Session without a start time'}
                  </a>
                  <span>
                    {minutes(s.activeS, locale)} active{s.counted ? '' : ', too short to count'}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </section>

        <div className="grid gap-4">
          <section aria-labelledby="next-h" className={`card border-l-8 ${DUE_TONE[due.tone]}`} data-testid="next-due">
            <h2 id="next-h" className="text-base font-semibold tracking-wide text-ink-soft uppercase">
              Coming up
            </h2>
            <p className="mt-2 text-2xl font-semibold">{due.headline}</p>
            {due.detail && <p className="mt-1 text-lg">{due.detail}</p>}
          </section>
          <section aria-labelledby="streak-h" className="card">
            <h2 id="streak-h" className="text-base font-semibold tracking-wide text-ink-soft uppercase">
              Streak
            </h2>
            <p className="mt-2 text-2xl font-semibold" data-testid="streak">
              {streak.headline}
            </p>
            <p className="mt-1">{streak.detail}</p>
          </section>
        </div>
      </div>

      {week.progressLine && (
        <p className="rounded-xl border border-moss/30 bg-moss-tint px-5 py-4 text-lg" data-testid="progress-line">
          {week.progressLine}
        </p>
      )}

      <section aria-labelledby="latest-h" className="card space-y-3">
        <h2 id="latest-h" className="text-xl">
          Your latest session
        </h2>
        {week.latest ? (
          <>
            {week.latest.startedAt && <p className="text-lg">{formatInstantDate(week.latest.startedAt, locale, week.timeZone, 'weekdayDayMonth')}</p>}
            <dl className="grid grid-cols-1 gap-3 min-[400px]:grid-cols-3">
              <Figure label="Active minutes" value={minutes(week.latest.activeS, locale)} />
              <Figure label="Mean power" value={watts(week.latest.meanPowerW, locale)} />
              <Figure label="Distance" value={distance(week.latest.distanceM, locale)} />
            </dl>
            <p>
              <a href={`/sessions/${week.latest.id}`} className="inline-flex min-h-12 items-center text-lg font-semibold">
                See this session in full
              </a>
            </p>
          </>
        ) : (
          <p>No sessions are in Kinloop yet. Once the ride files are uploaded, the latest one shows here.</p>
        )}
        {week.lastUploadAt && <p className="text-sm text-ink-soft">Ride files last uploaded {formatDateTime(week.lastUploadAt, locale, week.timeZone, 'weekdayDayMonth')}.</p>}
      </section>

      <nav aria-label="Things to do" className="grid gap-3 sm:grid-cols-3">
        <a href="/checks" className="btn btn-primary min-h-14 text-lg">
          Record how a ride went
        </a>
        <a href="/upload" className="btn btn-secondary min-h-14 text-lg">
          Upload rides
        </a>
        <a href="/my-prescription" className="btn btn-secondary min-h-14 text-lg">
          My prescription
        </a>
      </nav>
    </div>
  );
}

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <div className="rounded-lg bg-paper px-4 py-3">
      <dt className="text-sm text-ink-soft">{label}</dt>
      <dd className="text-2xl font-semibold">{value}</dd>
    </div>
  );
}
