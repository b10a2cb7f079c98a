import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { gridSpacing, pointsPerSide, GRID_ROUNDINGS, type GridRounding } from '../core/zone-stats';
import { distanceToOutline, toTurfPolygon, type PlanPoint } from './polygon';
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
 * a digit is appended while the code is taken. "Office 1" → "O1", "Reading room" → "RR", "Stairs" → "ST".
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
  return { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) };
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
