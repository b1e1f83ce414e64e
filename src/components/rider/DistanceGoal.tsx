import { useRef, useState, type FormEvent } from 'react';
import { api, ApiError, useApi } from '../api';
import { Alert } from '../ui/Alert';
import { Button } from '../ui/Button';
import { Loaded } from '../ui/Loading';
import { CustomRouteFields } from './CustomRouteFields';
import { formatDate } from '../../lib/time/format';
import { localDate } from '../../lib/time/local-date';
import { km, routeEnds, nextMilestoneText, percent, remainingText, travelledText } from './goal-words';
import { ProgressBar } from './ProgressBar';
import { draftFromPoints, routeFromDraft, type RouteDraft } from './route-draft';
import { RouteDrawing } from './RouteDrawing';
import type { Goal, RouteChoice } from './types';

const CUSTOM = 'custom';

/** The rider's distance goal: where they are on the route, and the form to choose or draw one. */
export default function DistanceGoal({ clientId, programStart, timeZone, locale }: { clientId: string; programStart: string | null; timeZone: string; locale: string }) {
  const [routes, reloadRoutes] = useApi<{ routes: RouteChoice[] }>('/api/routes');
  const [loaded, reloadGoal] = useApi<{ goal: Goal | null }>(`/api/clients/${clientId}/goal`);
  const [saved, setSaved] = useState<Goal | null>(null);
  return (
    <Loaded value={loaded} reload={reloadGoal} label="your distance goal">
      {(data) => {
        const goal = saved ?? data.goal;
        return (
          <div className="space-y-8">
            {goal ? <GoalProgressView goal={goal} locale={locale} /> : <p className="text-lg">You have no distance goal yet. Choose a route below, and every ride’s distance carries you along it.</p>}
            <Loaded value={routes} reload={reloadRoutes} label="the routes">
              {({ routes }) => (
                <GoalForm clientId={clientId} routes={routes} goal={goal} programStart={programStart} today={localDate(new Date(), timeZone)} locale={locale} onSaved={setSaved} />
              )}
            </Loaded>
          </div>
        );
      }}
    </Loaded>
  );
}

function GoalProgressView({ goal, locale }: { goal: Goal; locale: string }) {
  const p = goal.progress;
  const milestones = goal.route.points.filter((pt, i) => pt.milestone || i === goal.route.points.length - 1).length;
  const description = `${p.passed.length} of ${milestones} milestones passed. ${nextMilestoneText(p, locale)} ${remainingText(p, locale)}`;
  return (
    <section aria-labelledby="where-h" className="card space-y-4" data-testid="goal-progress">
      <h2 id="where-h" className="text-xl">
        Where you are on {goal.route.name}
      </h2>
      <div className="grid gap-6 lg:grid-cols-[3fr_2fr]">
        <RouteDrawing goal={goal} description={description} />
        <div className="space-y-4">
          <ProgressBar id="goal-bar" label="Travelled so far" percent={percent(p.fraction, p.finished)} text={travelledText(p, locale)} />
          <p className="text-lg font-semibold" data-testid="next-milestone">
            {nextMilestoneText(p, locale)}
          </p>
          <p>{remainingText(p, locale)}</p>
          <p className="text-ink-soft">Counting sessions from {formatDate(goal.countFrom, locale, 'date')}.</p>
          <div>
            <h3 className="font-semibold">Milestones passed</h3>
            {p.passed.length ? (
              <ol className="mt-1 list-decimal space-y-1 pl-6">
                {p.passed.map((m) => (
                  <li key={`${m.name}-${m.atM}`}>
                    {m.name} <span className="text-ink-soft">at {km(m.atM, locale)}</span>
                  </li>
                ))}
              </ol>
            ) : (
              <p className="mt-1">None yet — the first one is on its way.</p>
            )}
          </div>
        </div>
      </div>
    </section>
  );
}

type CountChoice = 'program' | 'today' | 'keep';

function GoalForm({
  clientId,
  routes,
  goal,
  programStart,
  today,
  locale,
  onSaved,
}: {
  clientId: string;
  routes: RouteChoice[];
  goal: Goal | null;
  programStart: string | null;
  today: string;
  locale: string;
  onSaved: (goal: Goal) => void;
}) {
  const keyCounter = useRef(0);
  const newKey = () => `p${++keyCounter.current}`;
  const isBuiltin = goal?.route.id != null && routes.some((r) => r.id === goal.route.id);
  const [choice, setChoice] = useState<string>(goal ? (isBuiltin ? (goal.route.id as string) : CUSTOM) : '');
  const [draft, setDraft] = useState<RouteDraft>(() =>
    goal && !isBuiltin ? draftFromPoints(goal.route.name, goal.route.points, newKey) : { name: '', rows: [0, 1].map(() => ({ key: newKey(), name: '', lat: '', lon: '', milestone: true })) },
  );
  // A newly chosen route counts from today, so a short route is not finished the moment it is chosen; the program start stays one choice away.
  const initialCount: CountChoice = !goal ? 'today' : goal.countFrom === programStart ? 'program' : goal.countFrom === today ? 'today' : 'keep';
  const [count, setCountState] = useState<CountChoice>(initialCount);
  const countTouched = useRef(false);
  const setCount = (c: CountChoice) => {
    countTouched.current = true;
    setCountState(c);
  };
  const chooseRoute = (route: string) => {
    setChoice(route);
    const current = goal ? (isBuiltin ? goal.route.id : CUSTOM) : null;
    if (!countTouched.current) setCountState(route === current ? initialCount : 'today');
  };
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [status, setStatus] = useState('');
  const [busy, setBusy] = useState(false);
  const problemRef = useRef<HTMLDivElement>(null);

  const countFrom = count === 'program' ? programStart : count === 'today' ? today : goal?.countFrom;

  function fail(message: string, fieldErrors: Record<string, string> = {}) {
    setErrors(fieldErrors);
    setProblem(message);
    setStatus('');
    requestAnimationFrame(() => problemRef.current?.focus());
  }

  async function submit(e: FormEvent) {
    e.preventDefault();
    if (!choice) return fail('Choose a route first.', { route: 'Choose one of the routes, or your own.' });
    const body: { routeId?: string; customRoute?: unknown; countFrom?: string } = countFrom ? { countFrom } : {};
    if (choice === CUSTOM) {
      const { route, errors: draftErrors } = routeFromDraft(draft);
      if (!route) return fail('Some of your route needs another look; the fields are marked below.', draftErrors);
      body.customRoute = route;
    } else {
      body.routeId = choice;
    }
    setBusy(true);
    setErrors({});
    setProblem(null);
    try {
      const { goal: savedGoal } = await api<{ goal: Goal }>('PUT', `/api/clients/${clientId}/goal`, body);
      onSaved(savedGoal);
      setStatus(`Saved. Your distance goal is now ${savedGoal.route.name}.`);
    } catch (err) {
      const apiError = err as ApiError;
      const fieldErrors: Record<string, string> = {};
      for (const f of apiError.body?.fields ?? []) fieldErrors[f.path.replace(/^customRoute\./, '')] = f.message;
      fail(apiError.message, fieldErrors);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="card space-y-6" aria-labelledby="choose-h">
      <h2 id="choose-h" className="text-xl">
        {goal ? 'Change your distance goal' : 'Choose a distance goal'}
      </h2>
      {problem && (
        <div ref={problemRef} tabIndex={-1}>
          <Alert tone="danger" title="The goal was not saved" live>
            <p>{problem}</p>
          </Alert>
        </div>
      )}

      <fieldset className="space-y-3" aria-describedby={errors.route ? 'route-error' : undefined}>
        <legend className="text-lg font-semibold">Route</legend>
        {errors.route && (
          <p id="route-error" className="font-medium text-brick">
            {errors.route}
          </p>
        )}
        <div className="grid gap-3 md:grid-cols-2">
          {routes.map((r) => (
            <RouteCard key={r.id} value={r.id} checked={choice === r.id} onChoose={chooseRoute} title={r.name}>
              {km(r.lengthM, locale)}, {r.points.filter((p, i) => p.milestone || i === r.points.length - 1).length} milestones, {routeEnds(r.points)}
            </RouteCard>
          ))}
          <RouteCard value={CUSTOM} checked={choice === CUSTOM} onChoose={chooseRoute} title="My own route">
            Name the places along a route of your own.
          </RouteCard>
        </div>
      </fieldset>

      {choice === CUSTOM && (
        <fieldset className="space-y-3">
          <legend className="text-lg font-semibold">Your own route</legend>
          <CustomRouteFields draft={draft} errors={errors} onChange={setDraft} newKey={newKey} />
        </fieldset>
      )}

      <fieldset className="space-y-2">
        <legend className="text-lg font-semibold">Count sessions from</legend>
        {programStart && <CountOption value="program" current={count} onChoose={setCount} label={`The start of my program (${formatDate(programStart, locale, 'date')})`} />}
        <CountOption value="today" current={count} onChoose={setCount} label={`Today (${formatDate(today, locale, 'date')})`} />
        {goal && initialCount === 'keep' && <CountOption value="keep" current={count} onChoose={setCount} label={`${formatDate(goal.countFrom, locale, 'date')}, as now`} />}
      </fieldset>

      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" busy={busy} className="min-h-14 px-8 text-lg">
          Save distance goal
        </Button>
        <p role="status" className="font-medium text-moss">
          {status}
        </p>
      </div>
    </form>
  );
}

function RouteCard({ value, checked, onChoose, title, children }: { value: string; checked: boolean; onChoose: (v: string) => void; title: string; children: React.ReactNode }) {
  return (
    <label
      className={`flex min-h-14 cursor-pointer items-start gap-3 rounded-xl border-2 p-4 ${checked ? 'border-lagoon bg-lagoon-tint' : 'border-line bg-surface hover:border-lagoon'}`}
    >
      <input type="radio" name="route" value={value} checked={checked} onChange={() => onChoose(value)} className="mt-1 h-6 w-6 shrink-0 accent-lagoon" />
      <span>
        <span className="block font-semibold">{title}</span>
        <span className="block text-sm text-ink-soft">{children}</span>
      </span>
    </label>
  );
}

function CountOption({ value, current, onChoose, label }: { value: CountChoice; current: CountChoice; onChoose: (v: CountChoice) => void; label: string }) {
  return (
    <label className="flex min-h-12 cursor-pointer items-center gap-3">
      <input type="radio" name="count-from" value={value} checked={current === value} onChange={() => onChoose(value)} className="h-6 w-6 accent-lagoon" />
      {label}
    </label>
  );
}
