import { describe, it, expect } from 'vitest';
import { km, nextMilestoneText, percent, remainingText, routeEnds, travelledText } from '../../../src/components/rider/goal-words';
import { BUILTIN_ROUTES } from '../../../src/lib/goals/builtin-routes';
import type { GoalProgress } from '../../../src/components/rider/types';

function progress(travelledM: number, totalM: number, next: GoalProgress['next'] = null): GoalProgress {
  const finished = travelledM >= totalM;
  return { travelledM, totalM, fraction: totalM > 0 ? travelledM / totalM : 1, passed: [], next, position: { lat: 0, lon: 0 }, finished };
}

describe('km', () => {
  it('gives kilometres with one decimal in the locale', () => {
    expect(km(123_400, 'en-GB')).toBe('123.4 km');
    expect(km(0, 'en-GB')).toBe('0.0 km');
    expect(km(1_234_500, 'en-GB')).toBe('1,234.5 km');
    expect(km(12_300, 'de-DE')).toBe('12,3 km');
  });

  it('rounds half a hundred metres up', () => {
    // source: ECMA-402 NumberFormat default roundingMode "halfExpand"
    expect(km(1250, 'en-GB')).toBe('1.3 km');
    expect(km(1249, 'en-GB')).toBe('1.2 km');
  });
});

describe('percent', () => {
  it('gives whole percent, rounded down', () => {
    expect(percent(0, false)).toBe(0);
    expect(percent(0.5, false)).toBe(50);
    expect(percent(0.499, false)).toBe(49);
  });

  it('never shows 100 % before the finish', () => {
    expect(percent(0.999, false)).toBe(99);
    expect(percent(1, false)).toBe(99);
  });

  it('shows 100 % at the finish', () => {
    expect(percent(1, true)).toBe(100);
  });

  it('keeps odd fractions inside 0…99', () => {
    expect(percent(-0.2, false)).toBe(0);
    expect(percent(1.7, false)).toBe(99);
  });

  // fraction × 100 is computed in binary floating point: 0.29 × 100 is
  // 28.999999999999996 and 0.57 × 100 is 56.99999999999999, so Math.floor
  // gives 28 and 56. A rider exactly 29 km along a 100 km route reads "28 %".
  // Flooring after rounding away the float noise (e.g. Math.floor(Math.round(
  // fraction * 1e6) / 1e4)) keeps the "never 100 % early" rule.
  it('gives the exact percent for a fraction that is a whole percent', () => {
    expect(percent(29_000 / 100_000, false)).toBe(29);
    expect(percent(57_000 / 100_000, false)).toBe(57);
  });
});

describe('travelledText', () => {
  it('gives distance travelled, the route length and the percent', () => {
    expect(travelledText(progress(123_400, 250_000), 'en-GB')).toBe('123.4 km of 250.0 km (49 %)');
  });

  it('shows 99 % just before the finish, and 100 % at it', () => {
    expect(travelledText(progress(249_000, 250_000), 'en-GB')).toBe('249.0 km of 250.0 km (99 %)');
    expect(travelledText(progress(250_000, 250_000), 'en-GB')).toBe('250.0 km of 250.0 km (100 %)');
  });
});

describe('nextMilestoneText', () => {
  it('names the next milestone and the distance to it', () => {
    expect(nextMilestoneText(progress(10_000, 50_000, { name: 'Old mill', remainingM: 3_450 }), 'en-GB')).toBe('Next milestone: Old mill, 3.5 km to go.');
  });

  it('congratulates at the finish, even if a next milestone is still given', () => {
    const done = 'You have reached the finish of this route — well done.';
    expect(nextMilestoneText(progress(50_000, 50_000), 'en-GB')).toBe(done);
    expect(nextMilestoneText({ ...progress(50_000, 50_000), next: { name: 'Old mill', remainingM: 0 } }, 'en-GB')).toBe(done);
  });

  it('congratulates when no milestone is left', () => {
    expect(nextMilestoneText({ ...progress(10_000, 50_000), next: null }, 'en-GB')).toBe('You have reached the finish of this route — well done.');
  });
});

describe('remainingText', () => {
  it('gives what is left to the finish', () => {
    expect(remainingText(progress(10_000, 50_000), 'en-GB')).toBe('40.0 km left to the finish.');
  });

  it('says the route is complete at the finish', () => {
    expect(remainingText(progress(50_000, 50_000), 'en-GB')).toBe('Route complete.');
  });

  it('never gives a negative distance left', () => {
    expect(remainingText({ ...progress(60_000, 50_000), finished: false }, 'en-GB')).toBe('0.0 km left to the finish.');
  });
});

describe('routeEnds', () => {
  it('says a route that comes back to where it started is a round trip, not "from X to Back at X"', () => {
    // The Lake Constance route starts and ends at Konstanz harbour (same coordinates, builtin-routes.ts).
    const lake = BUILTIN_ROUTES.find((r) => r.id === 'lake-loop')!;
    expect(routeEnds(lake.points)).toBe('from Konstanz harbour and back');
    const danube = BUILTIN_ROUTES.find((r) => r.id === 'danube-valley')!;
    expect(routeEnds(danube.points)).toBe(`from ${danube.points[0].name} to ${danube.points[danube.points.length - 1].name}`);
  });

  it('treats ends 300 m apart as two places and 100 m apart as one', () => {
    // 0.0027° of latitude is about 300 m, 0.0009° about 100 m (1° ≈ 111.2 km, common practice)
    const a = { name: 'A', lat: 51.5, lon: -0.1 };
    expect(routeEnds([a, { name: 'B', lat: 51.5027, lon: -0.1 }])).toBe('from A to B');
    expect(routeEnds([a, { name: 'B', lat: 51.5009, lon: -0.1 }])).toBe('from A and back');
  });
});
