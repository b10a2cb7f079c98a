import { max, min } from 'simple-statistics';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { gridSpacing, pointsPerSide, GRID_ROUNDINGS, type GridRounding } from '../core/zone-stats';
import { distanceToOutline, isAnticlockwise, toTurfPolygon, type PlanPoint } from './polygon';
import type { ZoneKind } from './zone-assignment';

export { GRID_ROUNDINGS, type GridRounding };

/**
 * Planned measurement points for a zone (EN 12464-1 grid; formula and d rule in DOMAIN.md, section 5):
 *   p = 0.2 × 5^log10(d) m, p ≤ 10 m; d the longer side of the area, or the shorter when the sides
 *   differ by a factor of 2 or more; points per side from d / p (rounding: see GridRounding);
 *   cells with an aspect ratio between 0.5 and 2 (secondary); points at the cell centres;
 *   a wall band (0.5 m by default) excluded in rooms, none in task areas and outdoor areas.
 *
 * Luxtrail's own rules where the standard is silent:
 * - Outlines that are not rectangles: the grid is laid over the bounding box of the outline less the
 *   band on each side (axis-aligned with the plan), and only cell centres inside the outline and at
 *   least the band away from it are kept (so an L-shaped room keeps the points of its two arms).
 * - Narrow zones (corridors, walkways) whose bounding box is less than NARROW_ZONE_WIDTH_M wide and at
 *   least twice as long: a centreline row along the long axis is offered as the documented alternative.
 *   Its d is the row's length, so p = 0.2 × 5^log10(length), points at the centres of equal segments.
 */
export const NARROW_ZONE_WIDTH_M = 2.5;

/** Cell aspect ratio limits (EN 12464-1, secondary). */
export const CELL_ASPECT_MIN = 0.5;
export const CELL_ASPECT_MAX = 2;

export const GRID_LAYOUTS = ['full', 'centreline'] as const;
export type GridLayout = (typeof GRID_LAYOUTS)[number];

export const GRID_ROUNDING_TEXT: Record<GridRounding, string> = {
  next_higher: 'Points per side: the next higher integer of d / p (EN 12464-1:2011 wording)',
  nearest: 'Points per side: d / p rounded to the nearest integer (EN 12464-1:2021 as reported by secondary sources; unchecked against the text)',
};

export const GRID_LAYOUT_TEXT: Record<GridLayout, string> = {
  full: 'Full grid over the area (less the wall band in rooms)',
  centreline: `Centreline row for a narrow zone (narrower than ${NARROW_ZONE_WIDTH_M} m): one row along the long axis at spacing p from the row's length`,
};

export type GridZone = { kind: ZoneKind; wallBandM: number; polygon: readonly PlanPoint[] };

export type GridPoint = {
  /** Row from the top of the plan (highest y) starting at 0; column from the left starting at 0. */
  row: number;
  col: number;
  /** Row letters and column number, e.g. "B3"; the label is the zone code, a dash and this. */
  cell: string;
  xM: number;
  yM: number;
};

export type MeasurementGrid = {
  rounding: GridRounding;
  layout: GridLayout;
  /** Band taken off each edge: the zone's wall band for rooms, 0 for task areas and outdoor areas. */
  bandM: number;
  /** Lower-left and upper-right corners of the gridded box (outline's bounding box less the band). */
  box: { x0: number; y0: number; x1: number; y1: number };
  dM: number;
  spacingM: number;
  columns: number;
  rows: number;
  cellWidthM: number;
  cellHeightM: number;
  /** cellWidth / cellHeight; within 0.5..2 for a full grid. */
  cellAspect: number;
  /** Columns or rows added beyond d / p to keep the cell aspect within 0.5..2. */
  aspectAdjusted: boolean;
  rectangular: boolean;
  /** Cell centres of the box that fell outside the outline (or inside its band) and were dropped. */
  dropped: number;
  points: GridPoint[];
};

export class GridError extends Error {}

/** A, B, ..., Z, AA, AB, ... */
export function rowLetters(row: number): string {
  let n = row + 1;
  let s = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

export function gridLabel(zoneCode: string, row: number, col: number): string {
  return `${zoneCode}-${rowLetters(row)}${col + 1}`;
}

/** How a log's `point` is matched to a planned label: trimmed, case-insensitive. */
export function labelKey(label: string): string {
  return label.trim().toLowerCase();
}

/**
 * A short code for a zone, unique among `taken` (compared case-insensitively): the initials of its
 * words (first two letters of a one-word name), at most three letters, then any number in the name;
 * a digit is appended while the code is taken. "Office 1" → "OF1", "Reading room" → "RR", "Stairs" → "ST".
 */
export function zoneCode(name: string, taken: Iterable<string> = []): string {
  const used = new Set([...taken].map((t) => t.toLowerCase()));
  const words = name.normalize('NFKD').replace(/[^A-Za-z0-9 ]+/g, ' ').trim().split(/\s+/).filter(Boolean);
  const alpha = words.filter((w) => /^[A-Za-z]/.test(w));
  const digits = words.filter((w) => /^[0-9]+$/.test(w)).join('').slice(0, 3);
  let letters = alpha.length === 1 ? alpha[0].slice(0, 2) : alpha.map((w) => w[0]).join('').slice(0, 3);
  if (!letters) letters = 'Z';
  const base = (letters + digits).toUpperCase();
  if (!used.has(base.toLowerCase())) return base;
  for (let i = 2; ; i++) {
    const c = `${base}${digits ? '.' : ''}${i}`;
    if (!used.has(c.toLowerCase())) return c;
  }
}

function boundsOf(poly: readonly PlanPoint[]) {
  const xs = poly.map((p) => p[0]);
  const ys = poly.map((p) => p[1]);
  return { x0: min(xs), y0: min(ys), x1: max(xs), y1: max(ys) };
}

function isAxisRectangle(poly: readonly PlanPoint[], b: ReturnType<typeof boundsOf>): boolean {
  const eq = (u: number, v: number) => Math.abs(u - v) < 1e-9;
  return poly.length === 4 && poly.every((p) => (eq(p[0], b.x0) || eq(p[0], b.x1)) && (eq(p[1], b.y0) || eq(p[1], b.y1)));
}

/** True when the zone qualifies for the centreline row (bounding box narrower than NARROW_ZONE_WIDTH_M and at least twice as long). */
export function isNarrowZone(polygon: readonly PlanPoint[]): boolean {
  const b = boundsOf(polygon);
  const w = b.x1 - b.x0;
  const h = b.y1 - b.y0;
  const short = Math.min(w, h);
  const long = Math.max(w, h);
  return short < NARROW_ZONE_WIDTH_M && long >= 2 * short;
}

/**
 * Columns and rows for a box of width a and height b at spacing p: each side from its own length
 * over p, then the side whose cells are too long gets more points until the cell aspect lies in
 * 0.5..2 (more points only shorten cells, so the spacing stays at most p).
 */
export function cellCounts(a: number, b: number, p: number, rounding: GridRounding) {
  let cols = pointsPerSide(a, p, rounding);
  let rows = pointsPerSide(b, p, rounding);
  let adjusted = false;
  for (let guard = 0; guard < 10_000; guard++) {
    const aspect = a / cols / (b / rows);
    if (aspect > CELL_ASPECT_MAX + 1e-9) { cols = Math.ceil((a * rows) / (CELL_ASPECT_MAX * b) - 1e-9); adjusted = true; continue; }
    if (aspect < CELL_ASPECT_MIN - 1e-9) { rows = Math.ceil((b * cols) / (CELL_ASPECT_MAX * a) - 1e-9); adjusted = true; continue; }
    break;
  }
  return { cols, rows, adjusted };
}

/** The measurement grid for a zone; throws GridError when the band leaves no area to grid. */
export function measurementGrid(zone: GridZone, options: { rounding: GridRounding; layout?: GridLayout }): MeasurementGrid {
  const layout = options.layout ?? 'full';
  const rounding = options.rounding;
  if (zone.polygon.length < 3) throw new GridError('The zone has no outline to lay a grid over');
  const outer = boundsOf(zone.polygon);
  const rectangular = isAxisRectangle(zone.polygon, outer);
  const bandM = zone.kind === 'room' ? Math.max(0, zone.wallBandM) : 0;
  const box = { x0: outer.x0 + bandM, y0: outer.y0 + bandM, x1: outer.x1 - bandM, y1: outer.y1 - bandM };
  const a = box.x1 - box.x0; // across (x)
  const b = box.y1 - box.y0; // up (y)
  if (!(a > 1e-6) || !(b > 1e-6)) {
    throw new GridError(`The zone is ${(outer.x1 - outer.x0).toFixed(2)} m × ${(outer.y1 - outer.y0).toFixed(2)} m: its ${bandM} m wall band leaves no area to measure`);
  }

  let dM: number;
  let cols: number;
  let rows: number;
  let adjusted = false;
  if (layout === 'centreline') {
    if (!isNarrowZone(zone.polygon)) throw new GridError(`A centreline row is for zones narrower than ${NARROW_ZONE_WIDTH_M} m and at least twice as long; this zone is ${(outer.x1 - outer.x0).toFixed(2)} m × ${(outer.y1 - outer.y0).toFixed(2)} m`);
    dM = Math.max(a, b);
    const n = pointsPerSide(dM, gridSpacing(dM), rounding);
    if (a >= b) { cols = n; rows = 1; } else { cols = 1; rows = n; }
  } else {
    const long = Math.max(a, b);
    const short = Math.min(a, b);
    dM = long / short >= 2 ? short : long;
    ({ cols, rows, adjusted } = cellCounts(a, b, gridSpacing(dM), rounding));
  }
  const spacingM = gridSpacing(dM);
  const cw = a / cols;
  const ch = b / rows;

  const turf = rectangular ? null : toTurfPolygon(zone.polygon as PlanPoint[]);
  const points: GridPoint[] = [];
  let dropped = 0;
  for (let r = 0; r < rows; r++) {
    const y = box.y1 - (r + 0.5) * ch; // row A at the top of the plan
    for (let c = 0; c < cols; c++) {
      const x = box.x0 + (c + 0.5) * cw;
      if (turf) {
        const inside = booleanPointInPolygon(turfPoint([x, y]), turf, { ignoreBoundary: true });
        if (!inside || (bandM > 0 && distanceToOutline([x, y], zone.polygon) < bandM - 1e-9)) { dropped++; continue; }
      }
      points.push({ row: r, col: c, cell: `${rowLetters(r)}${c + 1}`, xM: x, yM: y });
    }
  }
  return {
    rounding, layout, bandM, box, dM, spacingM, columns: cols, rows, cellWidthM: cw, cellHeightM: ch, cellAspect: cw / ch,
    aspectAdjusted: adjusted, rectangular, dropped, points,
  };
}

/** Point counts of the full grid under each rounding, so a zone can say when the two readings differ. */
export function gridCountsByRounding(zone: GridZone, layout: GridLayout = 'full'): Record<GridRounding, number> {
  const out = {} as Record<GridRounding, number>;
  for (const r of GRID_ROUNDINGS) out[r] = measurementGrid(zone, { rounding: r, layout }).points.length;
  return out;
}

type LabelledPoint = { label: string; xM: number; yM: number };

/** True when planned points differ from the generated grid (a point added, deleted or moved by more than a micrometre): a changed grid. */
export function gridDiffersFromGenerated(generated: readonly LabelledPoint[], points: readonly LabelledPoint[]): boolean {
  if (points.length !== generated.length) return true;
  const byLabel = new Map(points.map((p) => [p.label, p]));
  return generated.some((g) => {
    const p = byLabel.get(g.label);
    return !p || Math.abs(p.xM - g.xM) > 1e-6 || Math.abs(p.yM - g.yM) > 1e-6;
  });
}

/**
 * Grids on surfaces other than the working plane, planned on request for rooms (EN 12464-1:2021 asks
 * for the mean illuminance of walls and ceilings, each with U0 ≥ 0.10; secondary sources).
 *
 * Luxtrail's own rules, the standard's text not being at hand (from memory: the same grid formula
 * serves walls and ceilings):
 * - Ceiling: the working-plane grid of the room projected up (the same outline, wall band and
 *   rounding), each point a ceiling reading at the plan position below it.
 * - Walls: every edge of the room's outline is a wall of the edge's length and the room's height
 *   (given when asked). Each wall gets its own grid from the same formula with d taken from its two
 *   sides, no band, cell aspect 0.5..2; a point's plan position is on the edge, WALL_POINT_INSET_M
 *   inside the room (so it falls in the zone), with its height above the floor and the direction its
 *   sensor faces (into the room, clockwise from the plan's up), as a log's azimuth_deg.
 */
export const GRID_SURFACES = ['working_plane', 'walls', 'ceiling'] as const;
export type GridSurface = (typeof GRID_SURFACES)[number];

export const GRID_SURFACE_TEXT: Record<GridSurface, string> = {
  working_plane: 'Working plane: the EN 12464-1 grid over the area at the working-plane height',
  walls: 'Walls: each wall of the room its own grid over its length and the room height (Luxtrail\'s rule: d from the wall\'s two sides, no band), read facing into the room',
  ceiling: 'Ceiling: the working-plane grid of the room projected up to the ceiling (Luxtrail\'s rule), read facing down',
};

/** Planes a planned point is measured on (a subset of a log's `plane` values). */
export const PLANNED_PLANES = ['horizontal', 'wall', 'ceiling'] as const;
export type PlannedPlane = (typeof PLANNED_PLANES)[number];

/** The reading plane a surface's points are measured on. */
export const SURFACE_PLANE: Record<GridSurface, PlannedPlane> = { working_plane: 'horizontal', walls: 'wall', ceiling: 'ceiling' };

/** How far inside the room a wall point's plan position is put, metres (Luxtrail's choice: on the wall, yet inside the zone). */
export const WALL_POINT_INSET_M = 0.05;
/** Walls shorter than this are not gridded (a jog in the outline, not a wall one can measure). */
export const MIN_WALL_LENGTH_M = 0.3;
/** Room heights Luxtrail accepts for a wall grid, metres. */
export const WALL_HEIGHT_RANGE_M = { min: 1, max: 30 } as const;

export type WallGridPoint = GridPoint & { heightM: number };

export type WallGrid = {
  /** 1-based, in the outline's order of edges. */
  wall: number;
  from: PlanPoint;
  to: PlanPoint;
  lengthM: number;
  heightM: number;
  dM: number;
  spacingM: number;
  columns: number;
  rows: number;
  /** Direction the sensor faces (the wall's normal into the room), degrees clockwise from the plan's up (+y). */
  azimuthDeg: number;
  dropped: number;
  points: WallGridPoint[];
};

/** The ceiling grid of a room: its working-plane grid, read facing down at the same plan positions. */
export function ceilingGrid(zone: GridZone, options: { rounding: GridRounding }): MeasurementGrid {
  if (zone.kind !== 'room') throw new GridError('Ceiling grids are planned for rooms; a task area or an outdoor area has no ceiling of its own');
  return measurementGrid(zone, { rounding: options.rounding, layout: 'full' });
}

/** One grid per wall of a room of the given height (see GRID_SURFACES for the rule). */
export function wallGrids(zone: GridZone, options: { rounding: GridRounding; wallHeightM: number }): WallGrid[] {
  if (zone.kind !== 'room') throw new GridError('Wall grids are planned for rooms; a task area or an outdoor area has no walls of its own');
  const h = options.wallHeightM;
  if (!(h >= WALL_HEIGHT_RANGE_M.min && h <= WALL_HEIGHT_RANGE_M.max)) {
    throw new GridError(`The room height must be ${WALL_HEIGHT_RANGE_M.min} m to ${WALL_HEIGHT_RANGE_M.max} m to plan wall grids`);
  }
  if (zone.polygon.length < 3) throw new GridError('The zone has no outline to lay a grid over');
  const turf = toTurfPolygon(zone.polygon as PlanPoint[]);
  // Interior on the left of each edge for anticlockwise corners, on the right for clockwise ones.
  const side = isAnticlockwise(zone.polygon) ? 1 : -1;
  const walls: WallGrid[] = [];
  for (let i = 0; i < zone.polygon.length; i++) {
    const from = zone.polygon[i];
    const to = zone.polygon[(i + 1) % zone.polygon.length];
    const dx = to[0] - from[0];
    const dy = to[1] - from[1];
    const lengthM = Math.hypot(dx, dy);
    if (lengthM < MIN_WALL_LENGTH_M) continue;
    const nx = (-dy / lengthM) * side;
    const ny = (dx / lengthM) * side;
    const long = Math.max(lengthM, h);
    const short = Math.min(lengthM, h);
    const dM = long / short >= 2 ? short : long;
    const spacingM = gridSpacing(dM);
    const { cols, rows } = cellCounts(lengthM, h, spacingM, options.rounding);
    const points: WallGridPoint[] = [];
    let dropped = 0;
    for (let r = 0; r < rows; r++) {
      const heightM = h - (r + 0.5) * (h / rows); // row A nearest the ceiling, like row A at the top of a plan
      for (let c = 0; c < cols; c++) {
        const t = (c + 0.5) / cols;
        const x = from[0] + dx * t + nx * WALL_POINT_INSET_M;
        const y = from[1] + dy * t + ny * WALL_POINT_INSET_M;
        if (!booleanPointInPolygon(turfPoint([x, y]), turf, { ignoreBoundary: true })) { dropped++; continue; }
        points.push({ row: r, col: c, cell: `${rowLetters(r)}${c + 1}`, xM: x, yM: y, heightM });
      }
    }
    const azimuthDeg = ((Math.atan2(nx, ny) * 180) / Math.PI + 360) % 360;
    walls.push({ wall: walls.length + 1, from, to, lengthM, heightM: h, dM, spacingM, columns: cols, rows, azimuthDeg: Math.abs(azimuthDeg - 360) < 1e-9 ? 0 : azimuthDeg, dropped, points });
  }
  if (walls.length === 0) throw new GridError(`No wall of the outline is at least ${MIN_WALL_LENGTH_M} m long`);
  return walls;
}

/** A wall point's label: the zone code, W and the wall's number, then row letters and column ("O1-W2-B3"). */
export function wallLabel(zoneCodeText: string, wall: number, row: number, col: number): string {
  return gridLabel(`${zoneCodeText}-W${wall}`, row, col);
}

/** A ceiling point's label: the zone code, C, then row letters and column ("O1-C-B3"). */
export function ceilingLabel(zoneCodeText: string, row: number, col: number): string {
  return gridLabel(`${zoneCodeText}-C`, row, col);
}
