import { polygon as turfPolygon } from '@turf/helpers';
import { kinks } from '@turf/kinks';
import { polygonArea, polygonCentroid } from 'd3-polygon';

/** A corner in plan metres from the plan's lower-left corner, y upwards. */
export type PlanPoint = [number, number];

/** The plan's extent in metres; corners must lie within [0, widthM] x [0, heightM]. */
export type PlanExtent = { widthM: number; heightM: number };

export type PolygonCheck = { ok: true; polygon: PlanPoint[] } | { ok: false; problems: string[] };

/** Corners closer than this (metres) count as the same corner. */
const SAME_CORNER_M = 1e-6;

const fmt = (v: number) => (Math.round(v * 100) / 100).toString();

/** Drops repeated consecutive corners and a closing corner equal to the first (GeoJSON style). */
export function normalisePolygon(corners: readonly PlanPoint[]): PlanPoint[] {
  const out: PlanPoint[] = [];
  for (const c of corners) {
    const prev = out[out.length - 1];
    if (prev && Math.abs(prev[0] - c[0]) < SAME_CORNER_M && Math.abs(prev[1] - c[1]) < SAME_CORNER_M) continue;
    out.push([c[0], c[1]]);
  }
  while (out.length > 1 && Math.abs(out[0][0] - out[out.length - 1][0]) < SAME_CORNER_M && Math.abs(out[0][1] - out[out.length - 1][1]) < SAME_CORNER_M) out.pop();
  return out;
}

/** The closed GeoJSON polygon turf wants (first corner repeated at the end). */
export function toTurfPolygon(corners: readonly PlanPoint[]) {
  return turfPolygon([[...corners.map((c) => [c[0], c[1]]), [corners[0][0], corners[0][1]]]]);
}

/**
 * Checks a zone outline: at least 3 distinct corners, finite, not self-intersecting
 * (@turf/kinks), with area, and (when the extent is known) inside the plan.
 * Returns the normalised corners or every problem found, each saying where.
 */
export function validatePolygon(corners: readonly PlanPoint[], extent?: PlanExtent | null): PolygonCheck {
  const problems: string[] = [];
  const bad = corners.findIndex((c) => !Number.isFinite(c[0]) || !Number.isFinite(c[1]));
  if (bad >= 0) return { ok: false, problems: [`Corner ${bad + 1} is not a pair of finite numbers`] };
  const poly = normalisePolygon(corners);
  if (poly.length < 3) return { ok: false, problems: [`A zone needs at least 3 distinct corners; this outline has ${poly.length}`] };
  if (extent) {
    const tol = 1e-6;
    poly.forEach((c, i) => {
      if (c[0] < -tol || c[1] < -tol || c[0] > extent.widthM + tol || c[1] > extent.heightM + tol) {
        problems.push(`Corner ${i + 1} (${fmt(c[0])}, ${fmt(c[1])}) m lies outside the plan (0 to ${fmt(extent.widthM)} m across, 0 to ${fmt(extent.heightM)} m up)`);
      }
    });
  }
  const crossings = kinks(toTurfPolygon(poly)).features;
  if (crossings.length > 0) {
    const [x, y] = crossings[0].geometry.coordinates;
    problems.push(`The outline crosses itself near (${fmt(x)}, ${fmt(y)}) m${crossings.length > 1 ? ` and at ${crossings.length - 1} more place(s)` : ''}: order the corners around the zone`);
  } else if (Math.abs(polygonArea(poly)) < 1e-4) {
    problems.push('The corners lie on one line: the zone has no area');
  }
  return problems.length ? { ok: false, problems } : { ok: true, polygon: poly };
}

/** Area in square metres (d3-polygon; planar, orientation ignored). */
export function polygonAreaM2(corners: readonly PlanPoint[]): number {
  return Math.abs(polygonArea(corners as PlanPoint[]));
}

/** True when the corners run anticlockwise on the plan (y up). d3-polygon's area is positive for clockwise order here: it assumes y down. */
export function isAnticlockwise(corners: readonly PlanPoint[]): boolean {
  return polygonArea(corners as PlanPoint[]) < 0;
}

export function polygonCentre(corners: readonly PlanPoint[]): PlanPoint {
  return polygonCentroid(corners as PlanPoint[]);
}

/** Shortest planar distance from p to an open polyline (projection onto each segment, clamped). */
export function distanceToPolyline(p: PlanPoint, line: readonly PlanPoint[]): number {
  if (line.length === 1) return Math.hypot(p[0] - line[0][0], p[1] - line[0][1]);
  let best = Infinity;
  for (let i = 1; i < line.length; i++) {
    const a = line[i - 1], b = line[i];
    const vx = b[0] - a[0], vy = b[1] - a[1];
    const len2 = vx * vx + vy * vy;
    const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2));
    best = Math.min(best, Math.hypot(p[0] - (a[0] + t * vx), p[1] - (a[1] + t * vy)));
  }
  return best;
}

/**
 * Shortest planar distance from a point to the polygon's outline (the closed ring), metres.
 * Written here rather than taken from turf: turf's point-to-line distance is spherical
 * (rhumb or geodesic, in degrees), and plan metres are a flat frame.
 */
export function distanceToOutline(p: PlanPoint, corners: readonly PlanPoint[]): number {
  return corners.length === 0 ? Infinity : distanceToPolyline(p, [...corners, corners[0]]);
}
