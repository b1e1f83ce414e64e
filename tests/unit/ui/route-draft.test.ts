import { describe, it, expect } from 'vitest';
import { draftFromPoints, MIN_POINTS, parseCoordinate, routeFromDraft, type PointRow, type RouteDraft } from '../../../src/components/rider/route-draft';

function rows(...list: [name: string, lat: string, lon: string, milestone?: boolean][]): PointRow[] {
  return list.map(([name, lat, lon, milestone = false], i) => ({ key: `p${i}`, name, lat, lon, milestone }));
}

describe('parseCoordinate', () => {
  it.each([
    ['50.82', 50.82],
    ['50,82', 50.82],
    ['-0.14', -0.14],
    ['+1.5', 1.5],
    ['\u22120.14', -0.14],
    ['.5', 0.5],
    ['5.', 5],
    ['  12  ', 12],
    ['-180', -180],
    ['0', 0],
  ])('reads %j as %d', (text, value) => {
    expect(parseCoordinate(text)).toBe(value);
  });

  it.each(['', '   ', 'abc', '50.82°', '1e3', '1.2.3', '1,2,3', '--1', '- 1', '−', '.', '0x10', 'Infinity', 'NaN'])('refuses %j', (text) => {
    expect(parseCoordinate(text)).toBeNull();
  });
});

describe('routeFromDraft', () => {
  const good: RouteDraft = {
    name: '  Along the pier  ',
    rows: rows(['  Gate ', '50.8195', '-0.1363'], ['Cafe', '50,8180', '-0,1370', true], ['Pier end', '50.8150', '−0.1370']),
  };

  it('makes the route from well-formed rows, with trimmed names and parsed numbers', () => {
    const { route, errors } = routeFromDraft(good);
    expect(errors).toEqual({});
    expect(route).toEqual({
      name: 'Along the pier',
      points: [
        { name: 'Gate', lat: 50.8195, lon: -0.1363 },
        { name: 'Cafe', lat: 50.818, lon: -0.137, milestone: true },
        { name: 'Pier end', lat: 50.815, lon: -0.137, milestone: true },
      ],
    });
  });

  it('always makes the last point a milestone, the finish', () => {
    const { route } = routeFromDraft({ name: 'Short', rows: rows(['A', '0', '0'], ['B', '0', '1']) });
    expect(route!.points.map((p) => p.milestone ?? false)).toEqual([false, true]);
  });

  it('leaves a plain point without a name alone, but not a milestone or the finish', () => {
    const { errors } = routeFromDraft({ name: 'R', rows: rows(['', '0', '0'], [' ', '0', '1', true], ['', '0', '2']) });
    expect(errors).toEqual({ 'points.1.name': 'A milestone needs a name.', 'points.2.name': 'The finish needs a name.' });
  });

  it('asks for a name and at least two points', () => {
    expect(MIN_POINTS).toBe(2);
    const { route, errors } = routeFromDraft({ name: '  ', rows: rows(['Only', '1', '1']) });
    expect(route).toBeNull();
    expect(errors.name).toBe('Give the route a name.');
    expect(errors.points).toBe('A route needs at least 2 points.');
  });

  it('reports a row that is not a number beside the field, keyed like the server', () => {
    const { route, errors } = routeFromDraft({ name: 'R', rows: rows(['A', 'north', '0'], ['B', '1', '']) });
    expect(route).toBeNull();
    expect(errors).toEqual({
      'points.0.lat': 'Enter the latitude as a number of degrees, for example 50.82.',
      'points.1.lon': 'Enter the longitude as a number of degrees, for example -0.14.',
    });
  });

  it('accepts the poles and the 180° meridian, and nothing beyond', () => {
    expect(routeFromDraft({ name: 'R', rows: rows(['A', '-90', '-180'], ['B', '90', '180']) }).errors).toEqual({});
    const { errors } = routeFromDraft({ name: 'R', rows: rows(['A', '-90.01', '180.5'], ['B', '91', '-181']) });
    expect(errors).toEqual({
      'points.0.lat': 'Latitude is between -90 and 90 degrees.',
      'points.0.lon': 'Longitude is between -180 and 180 degrees.',
      'points.1.lat': 'Latitude is between -90 and 90 degrees.',
      'points.1.lon': 'Longitude is between -180 and 180 degrees.',
    });
  });

  it('gives every problem at once', () => {
    const { errors } = routeFromDraft({ name: '', rows: [] });
    expect(errors).toEqual({ name: 'Give the route a name.', points: 'A route needs at least 2 points.' });
  });
});

describe('draftFromPoints', () => {
  const points = [
    { name: 'Start', lat: 50.8195, lon: -0.1363 },
    { name: 'Halfway', lat: 50.818, lon: -0.137, milestone: true },
    { name: 'Finish', lat: -41.2865, lon: 174.7762 },
  ];

  it('writes the points as form rows with the given keys', () => {
    expect(draftFromPoints('Mine', points, (i) => `row-${i}`)).toEqual({
      name: 'Mine',
      rows: [
        { key: 'row-0', name: 'Start', lat: '50.8195', lon: '-0.1363', milestone: false },
        { key: 'row-1', name: 'Halfway', lat: '50.818', lon: '-0.137', milestone: true },
        { key: 'row-2', name: 'Finish', lat: '-41.2865', lon: '174.7762', milestone: false },
      ],
    });
  });

  it('reads back as the same route, with the finish marked', () => {
    const { route, errors } = routeFromDraft(draftFromPoints('Mine', points, String));
    expect(errors).toEqual({});
    expect(route!.points).toEqual([points[0], points[1], { ...points[2], milestone: true }]);
  });

  // String(n) writes numbers below 1e-6 in exponent form ("1e-7"), which
  // parseCoordinate refuses, so a saved route with a point within about 10 cm
  // of the equator or the prime meridian cannot be saved again from the form
  // without retyping it. Rare, but the round trip breaks; writing the number
  // with toFixed or toLocaleString('en', { maximumFractionDigits: 10,
  // useGrouping: false }) would keep it.
  it('reads back a coordinate very close to zero', () => {
    const near = [
      { name: 'On the line', lat: 51.4779, lon: -0.0000001 },
      { name: 'East', lat: 51.4779, lon: 0.01 },
    ];
    expect(routeFromDraft(draftFromPoints('Meridian', near, String)).errors).toEqual({});
  });
});
