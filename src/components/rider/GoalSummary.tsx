import { nextMilestoneText, percent, travelledText } from './goal-words';
import { ProgressBar } from './ProgressBar';
import type { Goal } from './types';

/** The distance goal in a few lines, for the progress page. */
export function GoalSummary({ goal, locale }: { goal: Goal | null; locale: string }) {
  if (!goal) {
    return (
      <div className="space-y-3">
        <p>No distance goal is chosen yet. Pick a route, and every ride’s distance carries you along it, milestone by milestone.</p>
        <a href="/goal" className="btn btn-primary min-h-14">
          Choose a distance goal
        </a>
      </div>
    );
  }
  const p = goal.progress;
  return (
    <div className="space-y-3">
      <ProgressBar id="goal-summary" label={goal.route.name} percent={percent(p.fraction, p.finished)} text={travelledText(p, locale)} />
      <p>{nextMilestoneText(p, locale)}</p>
      <a href="/goal" className="btn btn-secondary min-h-14">
        See your distance goal
      </a>
    </div>
  );
}
