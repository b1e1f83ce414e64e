import { describe, it, expect } from 'vitest';
import { getDistance, getPreciseDistance } from 'geolib';
import { haversineM } from '../../../src/lib/goals/haversine';

// from memory: the IUGG mean Earth radius R1 = (2a + b) / 3 = 6,371,008.8 m on
// GRS 80 (Moritz, Geodetic Reference System 1980); haversineM uses it.
const MEAN_RADIUS_M = 6_371_008.8;

const LHR = { lat: 51.47, lon: -0.4543 };
const JFK = { lat: 40.6413, lon: -73.7781 };

const pairs: [string, { lat: number; lon: number }, { lat: number; lon: number }][] = [
  ['Heathrow–JFK', LHR, JFK],
  ['Wellington–Picton', { lat: -41.2865, lon: 174.7762 }, { lat: -41.2906, lon: 174.001 }],
  ['across the antimeridian', { lat: -17.7, lon: 179.9 }, { lat: -18.1, lon: -179.8 }],
  ['along the equator', { lat: 0, lon: 10 }, { lat: 0, lon: 11 }],
  ['along a meridian at the equator', { lat: -0.5, lon: 30 }, { lat: 0.5, lon: 30 }],
  ['near the pole', { lat: 89.5, lon: 0 }, { lat: 89.5, lon: 180 }],
  ['a few metres', { lat: 50.8195, lon: -0.1363 }, { lat: 50.81955, lon: -0.13625 }],
];

describe('haversineM', () => {
  it('is zero for one point and symmetric, and a degree of the equator is 2πR / 360', () => {
    expect(haversineM(LHR, LHR)).toBe(0);
    expect(haversineM(LHR, JFK)).toBe(haversineM(JFK, LHR));
    // 2π × 6,371,008.8 m / 360 = 111,195.08 m
    expect(haversineM({ lat: 0, lon: 10 }, { lat: 0, lon: 11 })).toBeCloseTo(111_195.08, 1);
  });

  // source: geolib getDistance, a spherical great-circle distance on the
  // equatorial radius 6,378,137 m, rounded to whole metres. Scaled to that
  // radius, ours must agree within 1 m (0.5 m of rounding plus the law of
  // cosines' float error at short range).
  it.each(pairs)('matches geolib getDistance scaled to its radius: %s', (_, a, b) => {
    const ours = (haversineM(a, b) * 6_378_137) / MEAN_RADIUS_M;
    expect(Math.abs(ours - getDistance(a, b))).toBeLessThanOrEqual(1);
  });

  // source: geolib getPreciseDistance (Vincenty on the WGS-84 ellipsoid). A
  // sphere differs from the ellipsoid by the spread of the meridional radius
  // of curvature: b²/a ≈ 6,335 km at the equator to a²/b ≈ 6,400 km at the
  // poles against a mean of 6,371 km, so at most about 0.56 %; allow 0.6 %.
  it.each(pairs)('is within 0.6 %% of geolib getPreciseDistance: %s', (_, a, b) => {
    const precise = getPreciseDistance(a, b, 0.001);
    expect(Math.abs(haversineM(a, b) - precise) / precise).toBeLessThan(0.006);
  });

  it('agrees with the published Heathrow–JFK great-circle distance', () => {
    // from memory: great-circle distance LHR–JFK ≈ 5,555 km (3,451 mi) on the
    // WGS-84 ellipsoid, as printed by great-circle route calculators; a sphere
    // gives a little less, so allow 0.5 %.
    expect(Math.abs(haversineM(LHR, JFK) - 5_555_000) / 5_555_000).toBeLessThan(0.005);
  });
});
