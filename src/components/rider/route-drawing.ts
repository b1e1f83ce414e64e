// A route as an SVG drawing: an equirectangular projection of its points
// (longitude scaled by the cosine of the mean latitude, so a short route keeps
// its shape), fitted into a fixed width. No map tiles: the line, its points
// and the rider's position are all there is.
import type { LatLon } from '../../lib/goals/haversine';
import { cumulativeM, type RoutePoint } from '../../lib/goals/route';

export const DRAWING_WIDTH = 600;
const PAD = 36;
const MIN_HEIGHT = 220;
const MAX_HEIGHT = 460;

export interface DrawnPoint {
  x: number;
  y: number;
  name: string;
  milestone: boolean;
  passed: boolean;
}

export interface EndLabel {
  x: number;
  y: number;
  anchor: 'start' | 'middle' | 'end';
}

export interface RouteDrawing {
  width: number;
  height: number;
  /** SVG `points` of the part already travelled, from the start to the position. */
  done: string;
  /** SVG `points` of the part still ahead, from the position to the finish. */
  ahead: string;
  points: DrawnPoint[];
  position: { x: number; y: number };
  /** Where "Start" and "Finish" go: just beyond each end, away from the line. */
  startLabel: EndLabel;
  finishLabel: EndLabel;
}

const LABEL_GAP = 20;
const LABEL_WIDTH = 80;
const LABEL_HALF_HEIGHT = 8;

/** A label beyond `end`, in the direction from `before` to `end`, kept inside the drawing. */
function endLabel(end: { x: number; y: number }, before: { x: number; y: number } | undefined, width: number, height: number): EndLabel {
  let dx = before ? end.x - before.x : 0;
  let dy = before ? end.y - before.y : -1;
  const len = Math.hypot(dx, dy);
  if (len === 0) [dx, dy] = [0, -1];
  else [dx, dy] = [dx / len, dy / len];
  let anchor: EndLabel['anchor'] = dx > 0.4 ? 'start' : dx < -0.4 ? 'end' : 'middle';
  let x = end.x + dx * LABEL_GAP;
  let y = end.y + dy * LABEL_GAP + LABEL_HALF_HEIGHT;
  // No room beside the end: put the label above or below it instead.
  if ((anchor === 'start' && x + LABEL_WIDTH > width) || (anchor === 'end' && x - LABEL_WIDTH < 0)) {
    anchor = 'middle';
    x = end.x;
    y = end.y + (dy > 0 || end.y < 40 ? LABEL_GAP + 2 * LABEL_HALF_HEIGHT : -LABEL_GAP);
  }
  x = Math.min(width - LABEL_WIDTH / 2, Math.max(LABEL_WIDTH / 2, x));
  y = Math.min(height - 4, Math.max(2 * LABEL_HALF_HEIGHT + 4, y));
  return { x: round(x), y: round(y), anchor };
}

/** The difference b − a in degrees of longitude, taken the short way round. */
function lonStep(a: number, b: number): number {
  let d = b - a;
  while (d > 180) d -= 360;
  while (d < -180) d += 360;
  return d;
}

export function drawRoute(points: RoutePoint[], travelledM: number, position: LatLon): RouteDrawing {
  if (points.length === 0) throw new Error('A route drawing needs at least one point');
  const cum = cumulativeM({ id: '', name: '', points });
  // Longitudes made continuous, so a route across the antimeridian is not torn in two.
  const lons = [points[0].lon];
  for (let i = 1; i < points.length; i++) lons.push(lons[i - 1] + lonStep(points[i - 1].lon, points[i].lon));
  let seg = 0;
  while (seg < points.length - 2 && cum[seg + 1] <= travelledM) seg++;
  const posLon = lons[seg] + lonStep(points[seg].lon, position.lon);

  const meanLat = points.reduce((a, p) => a + p.lat, 0) / points.length;
  const k = Math.max(0.05, Math.cos((meanLat * Math.PI) / 180));
  const raw = points.map((p, i) => ({ x: lons[i] * k, y: -p.lat }));
  const rawPos = { x: posLon * k, y: -position.lat };
  const xs = [...raw.map((r) => r.x), rawPos.x];
  const ys = [...raw.map((r) => r.y), rawPos.y];
  const minX = Math.min(...xs);
  const minY = Math.min(...ys);
  const spanX = Math.max(...xs) - minX;
  const spanY = Math.max(...ys) - minY;

  const innerW = DRAWING_WIDTH - 2 * PAD;
  const height = spanX > 0 ? Math.min(MAX_HEIGHT, Math.max(MIN_HEIGHT, (innerW * spanY) / spanX + 2 * PAD)) : MIN_HEIGHT;
  const innerH = height - 2 * PAD;
  const scale = Math.min(spanX > 0 ? innerW / spanX : Infinity, spanY > 0 ? innerH / spanY : Infinity);
  const s = Number.isFinite(scale) ? scale : 1;
  // Centred in the box along the axis that has room to spare.
  const offX = PAD + (innerW - spanX * s) / 2;
  const offY = PAD + (innerH - spanY * s) / 2;
  const place = (r: { x: number; y: number }) => ({ x: round(offX + (r.x - minX) * s), y: round(offY + (r.y - minY) * s) });

  const drawn = raw.map(place);
  const pos = place(rawPos);
  const line = (list: { x: number; y: number }[]) => list.map((p) => `${p.x},${p.y}`).join(' ');
  const lastIndex = points.length - 1;
  return {
    width: DRAWING_WIDTH,
    height: round(height),
    done: line([...drawn.slice(0, seg + 1), pos]),
    ahead: line([pos, ...drawn.slice(seg + 1)]),
    points: points.map((p, i) => ({
      ...drawn[i],
      name: p.name,
      milestone: Boolean(p.milestone) || i === lastIndex,
      passed: cum[i] <= travelledM,
    })),
    position: pos,
    startLabel: endLabel(drawn[0], drawn[1], DRAWING_WIDTH, height),
    finishLabel: endLabel(drawn[lastIndex], drawn[lastIndex - 1], DRAWING_WIDTH, height),
  };
}

function round(n: number): number {
  return Math.round(n * 10) / 10;
}
