import { Delaunay } from 'd3-delaunay';
import { contours } from 'd3-contour';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { polygonAreaM2, toTurfPolygon, type PlanPoint } from './polygon';

/** The EN 12464-1 scale of illuminance steps, lux (EN 12464-1:2011, 4.3; as listed in DOMAIN.md). */
export const EN12464_SCALE_LUX = [20, 30, 50, 75, 100, 150, 200, 300, 500, 750, 1000, 1500, 2000, 3000, 5000] as const;

export type MeasuredPoint = { x: number; y: number; lux: number };

export type IsoluxLevel = {
  lux: number;
  /** Open or closed polylines in plan metres. */
  lines: PlanPoint[][];
  /** Where to put the level's label: the middle of its longest line. */
  labelAt: PlanPoint;
};

export type IsoluxResult = {
  levels: IsoluxLevel[];
  /** The measured points' convex hull (plan metres); nothing is drawn outside it. */
  hull: PlanPoint[] | null;
  /** Grid spacing used, metres: the lines' position is good to about one cell. */
  cellM: number;
  /** Why nothing could be drawn, when levels is empty. */
  reason: string | null;
};

export type IsoluxOptions = {
  /** Grid cells along the zone's longer side (default 120, capped at 400). */
  cellsAcross?: number;
  levels?: readonly number[];
};

/**
 * Isolux lines of one zone: the points are interpolated linearly over their Delaunay
 * triangulation (d3-delaunay) onto a grid covering the zone, the grid is contoured with
 * d3-contour at the EN 12464-1 steps that fall within the measured range, and only the
 * parts inside both the zone and the points' hull are kept. No value is ever extrapolated:
 * grid nodes outside every triangle stay empty, and line pieces that touch an empty node
 * (or a node outside the zone) are cut away.
 */
export function isoluxLines(points: readonly MeasuredPoint[], zone: readonly PlanPoint[], options: IsoluxOptions = {}): IsoluxResult {
  const usable = mergeDuplicates(points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y) && Number.isFinite(p.lux)));
  const empty = (reason: string, hull: PlanPoint[] | null = null, cellM = 0): IsoluxResult => ({ levels: [], hull, cellM, reason });
  if (usable.length < 3) return empty('Fewer than 3 measured points with a value: no lines.');
  if (zone.length < 3) return empty('The zone has no outline.');

  const delaunay = Delaunay.from(usable, (p) => p.x, (p) => p.y);
  const tri = delaunay.triangles;
  const hull = (delaunay.hullPolygon() as PlanPoint[]).slice(0, -1);
  // d3-delaunay jitters collinear points into sliver triangles: a hull under 1 cm2 has no area to speak of.
  if (tri.length === 0 || polygonAreaM2(hull) < 1e-4) return empty('The points lie on one line: no area to interpolate over.');

  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [x, y] of zone) {
    x0 = Math.min(x0, x); y0 = Math.min(y0, y); x1 = Math.max(x1, x); y1 = Math.max(y1, y);
  }
  const across = Math.min(400, Math.max(10, options.cellsAcross ?? 120));
  const cellM = Math.max(x1 - x0, y1 - y0) / across;
  // Grid nodes at x0 + i * cellM, i = 0..nx-1 (and likewise in y), covering the zone's box.
  const nx = Math.floor((x1 - x0) / cellM) + 1;
  const ny = Math.floor((y1 - y0) / cellM) + 1;
  const values = new Float64Array(nx * ny).fill(NaN);

  // Rasterise each triangle: barycentric interpolation is exactly linear interpolation on it.
  const eps = 1e-9;
  for (let t = 0; t < tri.length; t += 3) {
    const a = usable[tri[t]], b = usable[tri[t + 1]], c = usable[tri[t + 2]];
    const det = (b.y - c.y) * (a.x - c.x) + (c.x - b.x) * (a.y - c.y);
    if (Math.abs(det) < 1e-12) continue;
    const iMin = Math.max(0, Math.ceil((Math.min(a.x, b.x, c.x) - x0) / cellM - eps));
    const iMax = Math.min(nx - 1, Math.floor((Math.max(a.x, b.x, c.x) - x0) / cellM + eps));
    const jMin = Math.max(0, Math.ceil((Math.min(a.y, b.y, c.y) - y0) / cellM - eps));
    const jMax = Math.min(ny - 1, Math.floor((Math.max(a.y, b.y, c.y) - y0) / cellM + eps));
    for (let j = jMin; j <= jMax; j++) {
      const y = y0 + j * cellM;
      for (let i = iMin; i <= iMax; i++) {
        const x = x0 + i * cellM;
        const wa = ((b.y - c.y) * (x - c.x) + (c.x - b.x) * (y - c.y)) / det;
        const wb = ((c.y - a.y) * (x - c.x) + (a.x - c.x) * (y - c.y)) / det;
        const wc = 1 - wa - wb;
        if (wa < -eps || wb < -eps || wc < -eps) continue;
        values[j * nx + i] = wa * a.lux + wb * b.lux + wc * c.lux;
      }
    }
  }

  const zoneTurf = toTurfPolygon(zone);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (!Number.isNaN(values[k]) && !booleanPointInPolygon(turfPoint([x0 + i * cellM, y0 + j * cellM]), zoneTurf)) values[k] = NaN;
    }
  }

  let lo = Infinity, hi = -Infinity;
  for (const v of values) if (!Number.isNaN(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); }
  if (!Number.isFinite(lo)) return empty('No measured area inside the zone.', hull, cellM);
  const steps = (options.levels ?? EN12464_SCALE_LUX).filter((l) => l > lo && l < hi);
  if (steps.length === 0) return empty('The measured range has no step of the EN 12464-1 scale inside it.', hull, cellM);

  // A closed loop enclosing no more than one measured point's share of the hull is a single
  // reading's bump (noise around a level near the zone's average), not a pattern: leave it out.
  const minLoopAreaM2 = polygonAreaM2(hull) / usable.length;
  const generator = contours().size([nx, ny]).smooth(false);
  const grid = Array.from(values);
  const valueAt = (i: number, j: number) => values[j * nx + i];
  const levels: IsoluxLevel[] = [];
  for (const level of steps) {
    const lines: PlanPoint[][] = [];
    for (const poly of generator.contour(grid, level).coordinates) {
      for (const ring of poly) for (const line of cutRing(ring as [number, number][], level, valueAt, nx, ny, x0, y0, cellM)) lines.push(line);
    }
    const kept = lines.filter((l) => l.length >= 2 && !(isClosed(l) && polygonAreaM2(l.slice(0, -1)) < minLoopAreaM2));
    if (kept.length === 0) continue;
    const longest = kept.reduce((a, b) => (b.length > a.length ? b : a));
    levels.push({ lux: level, lines: kept, labelAt: longest[Math.floor(longest.length / 2)] });
  }
  return { levels, hull, cellM, reason: levels.length ? null : 'No line lies inside the measured area.' };
}

/**
 * d3-contour's unsmoothed vertices sit halfway between two neighbouring grid nodes (node i
 * at contour coordinate i + 0.5): an integer x means nodes (x-1, floor y) and (x, floor y),
 * an integer y means nodes (floor x, y-1) and (floor x, y). We place each vertex by linear
 * interpolation between those two nodes, and cut the ring where a node is empty (outside
 * the hull or the zone): d3-contour treats empty nodes as below every level, so those
 * pieces would trace the edge of the data, not an isolux line.
 */
function cutRing(ring: [number, number][], level: number, valueAt: (i: number, j: number) => number, nx: number, ny: number, x0: number, y0: number, cellM: number): PlanPoint[][] {
  const pieces: PlanPoint[][] = [];
  let current: PlanPoint[] = [];
  const first = ring[0], last = ring[ring.length - 1];
  const open = ring.length > 1 && first[0] === last[0] && first[1] === last[1] ? ring.slice(0, -1) : ring;
  const placed = open.map(([gx, gy]) => {
    let ia: number, ja: number, ib: number, jb: number;
    if (Number.isInteger(gx)) { ia = gx - 1; ib = gx; ja = jb = Math.floor(gy); }
    else { ia = ib = Math.floor(gx); ja = gy - 1; jb = gy; }
    if (ia < 0 || ja < 0 || ib >= nx || jb >= ny) return null;
    const va = valueAt(ia, ja), vb = valueAt(ib, jb);
    if (Number.isNaN(va) || Number.isNaN(vb) || va === vb) return null;
    const f = Math.min(1, Math.max(0, (level - va) / (vb - va)));
    return [x0 + (ia + f * (ib - ia)) * cellM, y0 + (ja + f * (jb - ja)) * cellM] as PlanPoint;
  });
  // A closed ring entirely inside the data: keep it closed.
  if (placed.every((p) => p !== null)) return [[...(placed as PlanPoint[]), placed[0] as PlanPoint]];
  // Otherwise start after an empty vertex so that no piece is split across the ring's seam.
  const start = placed.findIndex((p) => p === null);
  for (let k = 1; k <= placed.length; k++) {
    const p = placed[(start + k) % placed.length];
    if (p === null) { if (current.length) pieces.push(current); current = []; }
    else current.push(p);
  }
  if (current.length) pieces.push(current);
  return pieces;
}

function isClosed(line: PlanPoint[]): boolean {
  const a = line[0], b = line[line.length - 1];
  return line.length > 3 && a[0] === b[0] && a[1] === b[1];
}

/** Readings at the same spot (a repeated point) enter as their mean. */
function mergeDuplicates(points: readonly MeasuredPoint[]): MeasuredPoint[] {
  const byKey = new Map<string, { x: number; y: number; sum: number; n: number }>();
  for (const p of points) {
    const key = `${p.x.toFixed(4)},${p.y.toFixed(4)}`;
    const e = byKey.get(key);
    if (e) { e.sum += p.lux; e.n++; } else byKey.set(key, { x: p.x, y: p.y, sum: p.lux, n: 1 });
  }
  return [...byKey.values()].map((e) => ({ x: e.x, y: e.y, lux: e.sum / e.n }));
}
