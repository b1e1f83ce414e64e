import { describe, it, expect } from 'vitest';
import { haversineM } from '../../../src/lib/goals/haversine';
import { progressAlong, routeLengthM, type Route } from '../../../src/lib/goals/route';
import { customRouteSchema } from '../../../src/lib/goals/route-schema';
import { BUILTIN_ROUTES } from '../../../src/lib/goals/builtin-routes';

// Along the equator one degree of longitude is 2πR/360 on our sphere.
const DEG = haversineM({ lat: 0, lon: 0 }, { lat: 0, lon: 1 });

const route: Route = {
  id: 'test',
  name: 'Equator test line',
  points: [
    { name: 'Start', lat: 0, lon: 0 },
    { name: 'One', lat: 0, lon: 1, milestone: true },
    { name: 'Bend', lat: 0, lon: 2 },
    { name: 'Three', lat: 0, lon: 3, milestone: true },
    { name: 'End', lat: 0, lon: 4 },
  ],
};

describe('routeLengthM', () => {
  it('sums the segments', () => {
    expect(routeLengthM(route)).toBeCloseTo(4 * DEG, 3);
    // source: 2πR/360 with R = 6,371,008.8 m
    expect(DEG).toBeCloseTo((2 * Math.PI * 6_371_008.8) / 360, 3);
  });
});

describe('progressAlong', () => {
  it('at 0 has passed nothing and sits on the start', () => {
    const p = progressAlong(route, 0);
    expect(p.travelledM).toBe(0);
    expect(p.fraction).toBe(0);
    expect(p.passed).toEqual([]);
    expect(p.next?.name).toBe('One');
    expect(p.next?.remainingM).toBeCloseTo(DEG, 3);
    expect(p.position).toEqual({ lat: 0, lon: 0 });
    expect(p.finished).toBe(false);
  });

  it('mid-segment interpolates the position', () => {
    const p = progressAlong(route, 1.25 * DEG);
    expect(p.passed.map((m) => m.name)).toEqual(['One']);
    expect(p.next?.name).toBe('Three');
    expect(p.next?.remainingM).toBeCloseTo(1.75 * DEG, 3);
    expect(p.position.lat).toBeCloseTo(0, 9);
    expect(p.position.lon).toBeCloseTo(1.25, 9);
    expect(p.fraction).toBeCloseTo(1.25 / 4, 9);
  });

  it('exactly at a milestone counts it as passed', () => {
    const at = routeLengthM({ ...route, points: route.points.slice(0, 4) });
    const p = progressAlong(route, at);
    expect(p.passed.map((m) => m.name)).toEqual(['One', 'Three']);
    expect(p.passed[1].atM).toBe(at);
    expect(p.next?.name).toBe('End');
    expect(p.position.lon).toBeCloseTo(3, 9);
  });

  it('beyond the end is finished, with the last point as the final milestone', () => {
    const p = progressAlong(route, 10 * DEG);
    expect(p.finished).toBe(true);
    expect(p.travelledM).toBe(p.totalM);
    expect(p.fraction).toBe(1);
    expect(p.next).toBeNull();
    expect(p.passed.map((m) => m.name)).toEqual(['One', 'Three', 'End']);
    expect(p.position).toEqual({ lat: 0, lon: 4 });
  });

  it('treats a negative or missing distance as none', () => {
    expect(progressAlong(route, -5).travelledM).toBe(0);
    expect(progressAlong(route, Number.NaN).travelledM).toBe(0);
  });

  it('interpolates the short way across the antimeridian', () => {
    const pacific: Route = {
      id: 'p',
      name: 'Date line',
      points: [
        { name: 'West', lat: 0, lon: 179 },
        { name: 'East', lat: 0, lon: -179 },
      ],
    };
    expect(routeLengthM(pacific)).toBeCloseTo(2 * DEG, 3);
    const p = progressAlong(pacific, 0.75 * routeLengthM(pacific));
    expect(p.position.lon).toBeCloseTo(-179.5, 9);
  });
});

describe('built-in routes', () => {
  it('have 6–12 named milestones and lengths from about 50 to 1,500 km', () => {
    expect(BUILTIN_ROUTES.length).toBeGreaterThanOrEqual(3);
    for (const r of BUILTIN_ROUTES) {
      const milestones = r.points.filter((p, i) => p.milestone || i === r.points.length - 1);
      expect(milestones.length).toBeGreaterThanOrEqual(6);
      expect(milestones.length).toBeLessThanOrEqual(12);
      const km = routeLengthM(r) / 1000;
      expect(km).toBeGreaterThan(50);
      expect(km).toBeLessThan(1500);
      expect(customRouteSchema.safeParse({ name: r.name, points: r.points }).success).toBe(true);
    }
    expect(new Set(BUILTIN_ROUTES.map((r) => r.id)).size).toBe(BUILTIN_ROUTES.length);
  });

  it('give a 10 km-a-week rider a milestone within a month on the shortest route', () => {
    const shortest = [...BUILTIN_ROUTES].sort((a, b) => routeLengthM(a) - routeLengthM(b))[0];
    expect(progressAlong(shortest, 40_000).passed.length).toBeGreaterThan(0);
  });
});

describe('customRouteSchema', () => {
  const pts = [
    { name: 'A', lat: 10, lon: 10 },
    { name: 'B', lat: 10.1, lon: 10.1, milestone: true },
  ];
  const issues = (body: unknown) => {
    const r = customRouteSchema.safeParse(body);
    return r.success ? [] : r.error.issues.map((i) => i.message);
  };

  it('accepts a plain route', () => {
    expect(issues({ name: 'Round the park', points: pts })).toEqual([]);
  });
  it('wants 2 to 200 points', () => {
    expect(issues({ name: 'x', points: pts.slice(0, 1) })).toEqual(['A route needs at least 2 points.']);
    const many = Array.from({ length: 201 }, (_, i) => ({ name: '', lat: i * 0.01, lon: 0 }));
    expect(issues({ name: 'x', points: many })).toEqual(['A route may have at most 200 points.']);
    expect(issues({ name: 'x', points: many.slice(0, 200) })).toEqual([]);
  });
  it('limits the name to 80 characters', () => {
    expect(issues({ name: 'n'.repeat(80), points: pts })).toEqual([]);
    expect(issues({ name: 'n'.repeat(81), points: pts })).toEqual(['A route name may be at most 80 characters.']);
    expect(issues({ name: '  ', points: pts })).toEqual(['The route needs a name.']);
  });
  it('checks latitude and longitude ranges', () => {
    expect(issues({ name: 'x', points: [pts[0], { name: 'B', lat: 90.1, lon: 0 }] })).toEqual([
      'Latitude must be between -90 and 90.',
    ]);
    expect(issues({ name: 'x', points: [pts[0], { name: 'B', lat: 0, lon: -180.5 }] })).toEqual([
      'Longitude must be between -180 and 180.',
    ]);
  });
  it('wants a named milestone and some length', () => {
    expect(issues({ name: 'x', points: [pts[0], { name: '', lat: 1, lon: 1, milestone: true }] })).toEqual([
      'A milestone needs a name.',
    ]);
    expect(issues({ name: 'x', points: [pts[0], { ...pts[0] }] })).toEqual([
      'The route has no length: its points are all in one place.',
    ]);
  });
});
