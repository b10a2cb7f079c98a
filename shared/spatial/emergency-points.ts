import { max, min } from 'simple-statistics';
// Planned measurement points of emergency-lighting elements, and where a measured point lies in
// its element. Plan metres, y upwards. Planar geometry (turf's distances are spherical).
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { distanceToOutline, distanceToPolyline, toTurfPolygon, type PlanPoint } from './polygon';

import { ROUTE_STRIP_MAX_M, routeStripCount, type EmergencyPointRole } from '../core/emergency';

export { ROUTE_STRIP_MAX_M, routeStripCount };

export interface PlannedPoint {
  label: string;
  role: EmergencyPointRole;
  xM: number;
  yM: number;
  /** The 2 m strip of a wider escape route the point belongs to (1 = leftmost looking along the route); absent otherwise. */
  strip?: number;
}

/**
 * The polyline offset sideways by d metres (positive: to the left looking along it), with mitred
 * corners: each inner vertex moves along the bisector of its two segments' normals by
 * d / cos(half the turn), so both offset segments stay exactly d from their originals. Very sharp
 * turns (over about 160 degrees) are capped at 6 d to keep the corner on the plan.
 */
export function offsetPolyline(line: readonly PlanPoint[], d: number): PlanPoint[] {
  const pts = line.filter((p, i) => i === 0 || p[0] !== line[i - 1][0] || p[1] !== line[i - 1][1]);
  if (pts.length < 2 || d === 0) return pts.map((p) => [p[0], p[1]]);
  const normals: PlanPoint[] = [];
  for (let i = 1; i < pts.length; i++) {
    const dx = pts[i][0] - pts[i - 1][0], dy = pts[i][1] - pts[i - 1][1];
    const len = Math.hypot(dx, dy);
    normals.push([-dy / len, dx / len]);
  }
  return pts.map((p, i) => {
    if (i === 0) return [p[0] + normals[0][0] * d, p[1] + normals[0][1] * d];
    if (i === pts.length - 1) return [p[0] + normals[i - 1][0] * d, p[1] + normals[i - 1][1] * d];
    const a = normals[i - 1], b = normals[i];
    const bx = a[0] + b[0], by = a[1] + b[1];
    const bl = Math.hypot(bx, by);
    if (bl < 1e-9) return [p[0] + a[0] * d, p[1] + a[1] * d];
    const m: PlanPoint = [bx / bl, by / bl];
    const stretch = Math.min(1 / (m[0] * a[0] + m[1] * a[1]), 6);
    return [p[0] + m[0] * d * stretch, p[1] + m[1] * d * stretch];
  });
}

export interface RouteStrip {
  /** 1 = leftmost looking along the route. */
  index: number;
  /** The strip's own centre line. */
  line: PlanPoint[];
  widthM: number;
}

/**
 * A route of widthM as n equal strips of at most maxStripM side by side, each with its centre
 * line offset from the route's: strip k (1..n) lies widthM/2 - (k - 0.5) * widthM/n to the left.
 * A route up to maxStripM is one strip on its own centre line.
 */
export function routeStrips(line: readonly PlanPoint[], widthM: number, maxStripM = ROUTE_STRIP_MAX_M): RouteStrip[] {
  const n = routeStripCount(widthM, maxStripM);
  const w = widthM / n;
  return Array.from({ length: n }, (_, i) => ({ index: i + 1, widthM: w, line: n === 1 ? line.map((p): PlanPoint => [p[0], p[1]]) : offsetPolyline(line, widthM / 2 - (i + 0.5) * w) }));
}

/** Length of a polyline, metres. */
export function polylineLength(line: readonly PlanPoint[]): number {
  let s = 0;
  for (let i = 1; i < line.length; i++) s += Math.hypot(line[i][0] - line[i - 1][0], line[i][1] - line[i - 1][1]);
  return s;
}

/** Point and unit direction at distance d along the polyline (clamped to its ends). */
function along(line: readonly PlanPoint[], d: number): { p: PlanPoint; dir: PlanPoint } {
  let rest = Math.max(0, d);
  for (let i = 1; i < line.length; i++) {
    const a = line[i - 1], b = line[i];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (len === 0) continue;
    const dir: PlanPoint = [(b[0] - a[0]) / len, (b[1] - a[1]) / len];
    if (rest <= len + 1e-9 || i === line.length - 1) {
      const t = Math.min(rest, len);
      return { p: [a[0] + dir[0] * t, a[1] + dir[1] * t], dir };
    }
    rest -= len;
  }
  return { p: [line[0][0], line[0][1]], dir: [1, 0] };
}

const pad = (n: number) => String(n).padStart(2, '0');
const round3 = (v: number) => Math.round(v * 1000) / 1000;

/**
 * Planned points of an escape route: on the centre line from one end to the other at most
 * spacingM apart (both ends included, evenly spread), and at each, two points across the
 * central band at ±width/4 from the centre line (the band is half the route's width,
 * EN 1838:2013 via secondary sources). Labels `<code>-C01`, `<code>-L01`, `<code>-R01` (left and right looking along the route).
 * A route wider than ROUTE_STRIP_MAX_M is planned strip by strip (routeStrips), each strip as a
 * route of its own: labels `<code>-S1-C01`, `<code>-S1-L01`, … and each point names its strip.
 */
export function plannedRoutePoints(code: string, line: readonly PlanPoint[], widthM: number, spacingM: number): PlannedPoint[] {
  const strips = routeStrips(line, widthM);
  if (strips.length === 1) return plannedStripPoints(code, line, widthM, spacingM);
  return strips.flatMap((s) => plannedStripPoints(`${code}-S${s.index}`, s.line, s.widthM, spacingM).map((p) => ({ ...p, strip: s.index })));
}

function plannedStripPoints(code: string, line: readonly PlanPoint[], widthM: number, spacingM: number): PlannedPoint[] {
  const length = polylineLength(line);
  if (!(length > 0) || !(spacingM > 0)) return [];
  const n = Math.max(1, Math.ceil(length / spacingM - 1e-9));
  const out: PlannedPoint[] = [];
  const off = widthM / 4;
  for (let i = 0; i <= n; i++) {
    const { p, dir } = along(line, (length * i) / n);
    const k = pad(i + 1);
    out.push({ label: `${code}-C${k}`, role: 'centre_line', xM: round3(p[0]), yM: round3(p[1]) });
    if (off > 0) {
      // Left normal of (dx, dy) is (-dy, dx).
      out.push({ label: `${code}-L${k}`, role: 'central_band', xM: round3(p[0] - dir[1] * off), yM: round3(p[1] + dir[0] * off) });
      out.push({ label: `${code}-R${k}`, role: 'central_band', xM: round3(p[0] + dir[1] * off), yM: round3(p[1] - dir[0] * off) });
    }
  }
  return out;
}

/**
 * Planned points of an area on a square grid at spacingM, less a border of borderM along the
 * outline (EN 1838:2013 open areas: 0.5 m). Rows and columns are centred in the bounding box.
 * A small stand-in for the measurement-grid work, which can replace it.
 */
export function plannedAreaPoints(code: string, polygon: readonly PlanPoint[], borderM: number, spacingM: number): PlannedPoint[] {
  if (polygon.length < 3 || !(spacingM > 0)) return [];
  const xs = polygon.map((p) => p[0]), ys = polygon.map((p) => p[1]);
  const x0 = min(xs) + borderM, x1 = max(xs) - borderM;
  const y0 = min(ys) + borderM, y1 = max(ys) - borderM;
  if (x1 < x0 || y1 < y0) return [];
  const nx = Math.max(1, Math.ceil((x1 - x0) / spacingM - 1e-9));
  const ny = Math.max(1, Math.ceil((y1 - y0) / spacingM - 1e-9));
  const turf = toTurfPolygon(polygon as PlanPoint[]);
  const out: PlannedPoint[] = [];
  let k = 0;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      // Cell centres of an nx x ny division of the inner box.
      const p: PlanPoint = [x0 + ((i + 0.5) * (x1 - x0)) / nx, y0 + ((j + 0.5) * (y1 - y0)) / ny];
      if (!booleanPointInPolygon(turfPoint(p), turf)) continue;
      if (borderM > 0 && distanceToOutline(p, polygon) < borderM - 1e-9) continue;
      k++;
      out.push({ label: `${code}-A${pad(k)}`, role: 'area', xM: round3(p[0]), yM: round3(p[1]) });
    }
  }
  return out;
}

/** A measured point this close to the centre line counts as on it (project's choice: 0.1 m, a tripod's footprint). */
export const CENTRE_LINE_TOLERANCE_M = 0.1;

/**
 * Role of a positioned reading in a route: on the centre line (within the tolerance), in the
 * central band (within width/4), elsewhere on the route (not judged: 'border'), or not on it (null).
 */
export function routeRoleAt(p: PlanPoint, line: readonly PlanPoint[], widthM: number): EmergencyPointRole | null {
  const d = distanceToPolyline(p, line);
  if (d > widthM / 2 + 1e-9) return null;
  if (d <= Math.min(CENTRE_LINE_TOLERANCE_M, widthM / 4)) return 'centre_line';
  if (d <= widthM / 4 + 1e-9) return 'central_band';
  return 'border';
}

/**
 * Role and strip of a positioned reading in a route of any width: a route up to ROUTE_STRIP_MAX_M
 * as routeRoleAt (strip null); a wider one by the strip whose centre line is nearest, with the
 * roles taken within that strip.
 */
export function routeStripRoleAt(p: PlanPoint, line: readonly PlanPoint[], widthM: number): { role: EmergencyPointRole; strip: number | null } | null {
  if (distanceToPolyline(p, line) > widthM / 2 + 1e-9) return null;
  const strips = routeStrips(line, widthM);
  if (strips.length === 1) {
    const role = routeRoleAt(p, line, widthM);
    return role ? { role, strip: null } : null;
  }
  const nearest = strips.map((s) => ({ s, d: distanceToPolyline(p, s.line) })).reduce((a, b) => (b.d < a.d ? b : a));
  return { role: routeRoleAt(p, nearest.s.line, nearest.s.widthM) ?? 'border', strip: nearest.s.index };
}

/** Role of a positioned reading in an area: inside less the border ('area'), in the border, or outside (null). */
export function areaRoleAt(p: PlanPoint, polygon: readonly PlanPoint[], borderM: number): EmergencyPointRole | null {
  if (!booleanPointInPolygon(turfPoint(p), toTurfPolygon(polygon as PlanPoint[]))) return null;
  return borderM > 0 && distanceToOutline(p, polygon) < borderM ? 'border' : 'area';
}
