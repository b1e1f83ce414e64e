import { useId } from 'react';
import { drawRoute } from './route-drawing';
import type { Goal } from './types';
import { PALETTE } from '../palette';

const AHEAD = PALETTE.lineStrong;

/** The goal's route as a line drawing with the milestones and the rider's position, described in words too. */
export function RouteDrawing({ goal, description }: { goal: Goal; description: string }) {
  const id = useId();
  const d = drawRoute(goal.route.points, goal.progress.travelledM, goal.progress.position);
  const first = d.points[0];
  const last = d.points[d.points.length - 1];
  const loop = Math.hypot(first.x - last.x, first.y - last.y) < 12;
  return (
    <figure className="space-y-2">
      <svg
        viewBox={`0 0 ${d.width} ${d.height}`}
        className="h-auto w-full rounded-lg border border-line bg-paper"
        role="img"
        aria-labelledby={`${id}-t ${id}-d`}
        data-testid="route-drawing"
      >
        <title id={`${id}-t`}>{`Drawing of the route ${goal.route.name}`}</title>
        <desc id={`${id}-d`}>{description}</desc>
        <polyline points={d.ahead} fill="none" stroke={AHEAD} strokeWidth="4" strokeDasharray="10 8" strokeLinecap="round" strokeLinejoin="round" />
        <polyline points={d.done} fill="none" stroke={PALETTE.lagoon} strokeWidth="7" strokeLinecap="round" strokeLinejoin="round" />
        {d.points.map((p, i) =>
          p.milestone ? (
            <circle key={i} cx={p.x} cy={p.y} r="8" fill={p.passed ? PALETTE.lagoon : PALETTE.surface} stroke={PALETTE.lagoon} strokeWidth="3" />
          ) : (
            <circle key={i} cx={p.x} cy={p.y} r="3" fill={p.passed ? PALETTE.lagoon : AHEAD} />
          ),
        )}
        <rect x={first.x - 8} y={first.y - 8} width="16" height="16" fill="#1d2a2f" />
        <text x={d.startLabel.x} y={d.startLabel.y} textAnchor={d.startLabel.anchor} fontSize="24" fontWeight="600" fill="#1d2a2f" stroke="#f6f4ef" strokeWidth="5" paintOrder="stroke">
          {loop ? 'Start and finish' : 'Start'}
        </text>
        {!loop && (
          <text x={d.finishLabel.x} y={d.finishLabel.y} textAnchor={d.finishLabel.anchor} fontSize="24" fontWeight="600" fill="#1d2a2f" stroke="#f6f4ef" strokeWidth="5" paintOrder="stroke">
            Finish
          </text>
        )}
        <circle cx={d.position.x} cy={d.position.y} r="14" fill={PALETTE.ochre} stroke={PALETTE.surface} strokeWidth="4" />
        <circle cx={d.position.x} cy={d.position.y} r="4" fill={PALETTE.surface} />
      </svg>
      <figcaption>
        <ul className="flex flex-wrap gap-x-5 gap-y-1 text-sm">
          <li className="flex items-center gap-2">
            <svg aria-hidden="true" width="32" height="12">
              <line x1="2" y1="6" x2="30" y2="6" stroke={PALETTE.lagoon} strokeWidth="6" strokeLinecap="round" />
            </svg>
            Travelled
          </li>
          <li className="flex items-center gap-2">
            <svg aria-hidden="true" width="32" height="12">
              <line x1="2" y1="6" x2="30" y2="6" stroke={AHEAD} strokeWidth="4" strokeDasharray="7 5" />
            </svg>
            Still ahead
          </li>
          <li className="flex items-center gap-2">
            <svg aria-hidden="true" width="18" height="18">
              <circle cx="9" cy="9" r="6" fill={PALETTE.lagoon} stroke={PALETTE.lagoon} strokeWidth="2.5" />
            </svg>
            Milestone passed
          </li>
          <li className="flex items-center gap-2">
            <svg aria-hidden="true" width="18" height="18">
              <circle cx="9" cy="9" r="6" fill={PALETTE.surface} stroke={PALETTE.lagoon} strokeWidth="2.5" />
            </svg>
            Milestone ahead
          </li>
          <li className="flex items-center gap-2">
            <svg aria-hidden="true" width="22" height="22">
              <circle cx="11" cy="11" r="8" fill={PALETTE.ochre} stroke={PALETTE.surface} strokeWidth="2" />
            </svg>
            Where you are
          </li>
        </ul>
      </figcaption>
    </figure>
  );
}
