import { describe, it, expect } from 'vitest';
import { drawRoute, type RouteDrawing } from '../../../src/components/rider/route-drawing';
import { cumulativeM, progressAlong, type RoutePoint } from '../../../src/lib/goals/route';

// The drawing is 600 units wide (the design's choice), with a 36-unit margin each side.
const DRAWING_WIDTH = 600;
const PAD = 36;
const route = (points: RoutePoint[]) => ({ id: 'r', name: 'Test route', points });
/** The drawing of a rider `distanceM` along the route, positioned as the goal API does it. */
function drawAt(points: RoutePoint[], distanceM: number): RouteDrawing {
  const progress = progressAlong(route(points), distanceM);
  return drawRoute(points, progress.travelledM, progress.position);
}
const parse = (svgPoints: string) => svgPoints.split(' ').map((p) => p.split(',').map(Number));

// Along the equator, cos(0) = 1: degrees of longitude and latitude draw alike.
const equator: RoutePoint[] = [
  { name: 'Start', lat: 0, lon: 0 },
  { name: 'Middle', lat: 0, lon: 1, milestone: true },
  { name: 'End', lat: 0, lon: 2 },
];

// Suva to Apia, eastwards across the 180° meridian.
// source: from memory (Suva about 18.14° S 178.44° E, Apia about 13.83° S 171.76° W); any pair across the meridian serves
const pacific: RoutePoint[] = [
  { name: 'Suva', lat: -18.14, lon: 178.44 },
  { name: 'Reef', lat: -16.8, lon: 179.97, milestone: true },
  { name: 'Channel', lat: -18.65, lon: -173.98 },
  { name: 'Apia', lat: -13.83, lon: -171.76 },
];

describe('drawRoute', () => {
  it('needs at least one point', () => {
    expect(() => drawRoute([], 0, { lat: 0, lon: 0 })).toThrow();
  });

  it('centres a single point in the smallest drawing', () => {
    const d = drawRoute([{ name: 'Here', lat: 51.5, lon: -0.1 }], 0, { lat: 51.5, lon: -0.1 });
    expect(d.width).toBe(DRAWING_WIDTH);
    expect(d.height).toBe(220);
    expect(d.points).toEqual([{ x: 300, y: 110, name: 'Here', milestone: true, passed: true }]);
    expect(d.position).toEqual({ x: 300, y: 110 });
  });

  it('fills the width along the equator and keeps an east-west line level', () => {
    const d = drawAt(equator, 0);
    expect(d.points.map((p) => p.x)).toEqual([PAD, 300, DRAWING_WIDTH - PAD]);
    expect(new Set(d.points.map((p) => p.y)).size).toBe(1);
    expect(d.height).toBe(220);
  });

  it('splits the line at the rider, who sits on it', () => {
    const along = cumulativeM(route(equator))[1] / 2;
    const d = drawAt(equator, along);
    expect(d.position).toEqual({ x: 168, y: 110 });
    expect(d.done).toBe('36,110 168,110');
    expect(d.ahead).toBe('168,110 300,110 564,110');
    expect(d.points.map((p) => p.passed)).toEqual([true, false, false]);
  });

  it('puts a rider past a point on the next segment', () => {
    const cum = cumulativeM(route(equator));
    const d = drawAt(equator, (cum[1] + cum[2]) / 2);
    expect(d.done).toBe('36,110 300,110 432,110');
    expect(d.ahead).toBe('432,110 564,110');
    expect(d.points.map((p) => p.passed)).toEqual([true, true, false]);
  });

  it('draws a finished route as all done', () => {
    const d = drawAt(equator, 1e9);
    expect(parse(d.done).at(-1)).toEqual([564, 110]);
    expect(d.ahead).toBe('564,110 564,110');
    expect(d.points.every((p) => p.passed)).toBe(true);
  });

  it('marks the marked points and the finish as milestones', () => {
    expect(drawAt(equator, 0).points.map((p) => p.milestone)).toEqual([false, true, true]);
  });

  it('scales longitude by the cosine of the mean latitude, so a short route keeps its shape', () => {
    // Mean latitude 60°, cos 60° = 0.5: 2° of longitude draw as long as 1° of latitude.
    // source: equirectangular projection, x = λ·cos φ0, y = φ (Snyder, Map Projections: A Working Manual, p. 90)
    const d = drawAt(
      [
        { name: 'South-west', lat: 59.5, lon: 10 },
        { name: 'North-east', lat: 60.5, lon: 12 },
      ],
      0,
    );
    const [a, b] = d.points;
    expect(b.x - a.x).toBeCloseTo(a.y - b.y, 0);
    expect(d.height).toBe(460);
    // Taller than wide: centred across the width, filling the height.
    expect(a.x + b.x).toBeCloseTo(DRAWING_WIDTH, 0);
    expect([b.y, a.y]).toEqual([PAD, d.height - PAD]);
  });

  it('keeps the height between 220 and 460', () => {
    const flat = drawAt([{ name: 'A', lat: 0, lon: 0 }, { name: 'B', lat: 0.01, lon: 5 }], 0);
    const tall = drawAt([{ name: 'A', lat: 0, lon: 0 }, { name: 'B', lat: 5, lon: 0.01 }], 0);
    expect(flat.height).toBe(220);
    expect(tall.height).toBe(460);
  });

  it('keeps every point, the rider and both labels inside the drawing', () => {
    for (const points of [equator, pacific]) {
      for (const at of [0, 50_000, 400_000, 1e9]) {
        const d = drawAt(points, at);
        for (const p of [...d.points, d.position, d.startLabel, d.finishLabel]) {
          expect(p.x).toBeGreaterThanOrEqual(0);
          expect(p.x).toBeLessThanOrEqual(d.width);
          expect(p.y).toBeGreaterThanOrEqual(0);
          expect(p.y).toBeLessThanOrEqual(d.height);
        }
      }
    }
  });

  it('moves an end label above or below the end when there is no room beside it', () => {
    const d = drawAt(equator, 0);
    expect(d.startLabel).toEqual({ x: 40, y: 90, anchor: 'middle' });
    expect(d.finishLabel).toEqual({ x: 560, y: 90, anchor: 'middle' });
  });

  it('puts the labels of a route due north below the start and above the finish', () => {
    const d = drawAt([{ name: 'A', lat: 50, lon: 0 }, { name: 'B', lat: 50.2, lon: 0.0001 }], 0);
    const [start, finish] = d.points;
    expect(d.startLabel.anchor).toBe('middle');
    expect(d.startLabel.y).toBeGreaterThan(start.y);
    expect(d.finishLabel.anchor).toBe('middle');
    expect(d.finishLabel.y).toBeLessThan(finish.y);
  });

  it('sets a label beside an end that has room, anchored away from the line', () => {
    // An end in the middle of the width, reached from the left.
    const d = drawAt(
      [
        { name: 'A', lat: 0, lon: 0 },
        { name: 'B', lat: 2, lon: 0 },
        { name: 'C', lat: 2, lon: 0.3 },
      ],
      0,
    );
    expect(d.finishLabel.anchor).toBe('start');
    expect(d.finishLabel.x).toBeGreaterThan(d.points[2].x);
  });

  describe('across the 180° meridian', () => {
    it('draws a Pacific route in one piece, west to east', () => {
      const d = drawAt(pacific, 0);
      const xs = d.points.map((p) => p.x);
      expect(xs[0]).toBe(PAD);
      expect(xs.at(-1)).toBe(DRAWING_WIDTH - PAD);
      // Longitudes taken continuously eastwards (173.98° W = 186.02°, 171.76° W = 188.24°),
      // placed in proportion across the 528 px inside the padding. Torn at the
      // meridian, the third point would land left of the first two.
      const continuous = [178.44, 179.97, 186.02, 188.24];
      xs.forEach((x, i) => expect(x).toBeCloseTo(PAD + ((continuous[i] - 178.44) / (188.24 - 178.44)) * (DRAWING_WIDTH - 2 * PAD), 0));
    });

    it('draws it exactly as the same route moved away from the meridian', () => {
      const shifted = pacific.map((p) => ({ ...p, lon: p.lon > 0 ? p.lon - 180 : p.lon + 180 }));
      for (const at of [0, 150_000, 300_000, 700_000, 1e9]) {
        const a = drawAt(pacific, at);
        const b = drawAt(shifted, at);
        expect(a.height).toBeCloseTo(b.height, 0);
        a.points.forEach((p, i) => {
          expect(Math.abs(p.x - b.points[i].x)).toBeLessThanOrEqual(0.1);
          expect(Math.abs(p.y - b.points[i].y)).toBeLessThanOrEqual(0.1);
        });
        expect(Math.abs(a.position.x - b.position.x)).toBeLessThanOrEqual(0.1);
        expect(Math.abs(a.position.y - b.position.y)).toBeLessThanOrEqual(0.1);
      }
    });

    it('puts the rider between the ends of the segment that crosses the meridian', () => {
      const cum = cumulativeM(route(pacific));
      const d = drawAt(pacific, (cum[1] + cum[2]) / 2);
      // progressAlong gives a longitude wrapped into −180…180.
      expect(progressAlong(route(pacific), (cum[1] + cum[2]) / 2).position.lon).toBeLessThan(0);
      const [a, b] = [d.points[1], d.points[2]];
      expect(d.position.x).toBeGreaterThan(a.x);
      expect(d.position.x).toBeLessThan(b.x);
      expect(d.position.x).toBeCloseTo((a.x + b.x) / 2, 0);
      expect(d.position.y).toBeCloseTo((a.y + b.y) / 2, 0);
      expect(parse(d.done)).toHaveLength(3);
      expect(parse(d.ahead)).toHaveLength(3);
    });

    it('draws a westward crossing from right to left', () => {
      const d = drawAt([...pacific].reverse(), 0);
      expect(d.points[0].x).toBe(DRAWING_WIDTH - PAD);
      expect(d.points.at(-1)!.x).toBe(PAD);
    });
  });
});
