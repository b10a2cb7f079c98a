import { max, min } from 'simple-statistics';
import { polygonContains } from 'd3-polygon';
import type { PlanPoint } from './polygon';

/** A label's box in plan metres: centre and half-extents. */
export type LabelBox = { x: number; y: number; hw: number; hh: number };

const covers = (b: LabelBox, p: PlanPoint, margin: number) => Math.abs(p[0] - b.x) <= b.hw + margin && Math.abs(p[1] - b.y) <= b.hh + margin;
const overlaps = (a: LabelBox, b: LabelBox) => Math.abs(a.x - b.x) < a.hw + b.hw && Math.abs(a.y - b.y) < a.hh + b.hh;

export type PlaceOptions = {
  /** Label width and height, metres (text size at the map's zoom). */
  width: number;
  height: number;
  /** A point this close to the box (a marker's radius), metres, counts as covered. */
  pointMargin: number;
  /** Boxes already placed (other labels): a new label avoids them where it can. */
  taken?: readonly LabelBox[];
  /** Candidate positions per side of the zone's extent. */
  steps?: number;
  /** How many rings, a label's height apart, are tried outside the zone before giving up. */
  rings?: number;
};

function box(x: number, y: number, o: PlaceOptions): LabelBox {
  return { x, y, hw: o.width / 2, hh: o.height / 2 };
}

function clear(b: LabelBox, points: readonly PlanPoint[], o: PlaceOptions): boolean {
  return points.every((p) => !covers(b, p, o.pointMargin));
}

/**
 * Where a zone's label goes so that it hides no measurement point: the free position inside the
 * zone (the whole box inside the outline) nearest its centre, avoiding labels already placed; if the
 * zone has none, the nearest free position outside its extent, in rings a label's height apart
 * (above, below, beside), so a small zone inside a densely measured one is labelled beyond its
 * neighbour's points. Failing that, the nearest position that hides no point even if it overlaps
 * another label (labels are opaque and stay legible); as a last resort the centre, and `covering`
 * says so. Our own greedy rule, not from a reference.
 */
export function placeZoneLabel(polygon: readonly PlanPoint[], points: readonly PlanPoint[], o: PlaceOptions): { box: LabelBox; inside: boolean; covering: boolean } {
  const xs = polygon.map((p) => p[0]);
  const ys = polygon.map((p) => p[1]);
  const [x0, x1, y0, y1] = [min(xs), max(xs), min(ys), max(ys)];
  const cx = (x0 + x1) / 2;
  const cy = (y0 + y1) / 2;
  const steps = o.steps ?? 24;
  const rings = o.rings ?? 12;
  const taken = o.taken ?? [];
  const free = (b: LabelBox) => clear(b, points, o) && taken.every((t) => !overlaps(b, t));
  const inside = (b: LabelBox) => [[b.x - b.hw, b.y - b.hh], [b.x + b.hw, b.y - b.hh], [b.x + b.hw, b.y + b.hh], [b.x - b.hw, b.y + b.hh]]
    .every((c) => polygonContains(polygon as PlanPoint[], c as PlanPoint));
  const byDistance = (a: LabelBox, b: LabelBox) => Math.hypot(a.x - cx, a.y - cy) - Math.hypot(b.x - cx, b.y - cy);

  const candidates: LabelBox[] = [];
  for (let i = 0; i <= steps; i++) {
    for (let j = 0; j <= steps; j++) candidates.push(box(x0 + ((x1 - x0) * i) / steps, y0 + ((y1 - y0) * j) / steps, o));
  }
  const within = candidates.filter((b) => inside(b) && free(b)).sort(byDistance);
  if (within.length > 0) return { box: within[0], inside: true, covering: false };

  // Ring k: boxes whose near edge is k label heights (plus a small gap) beyond the zone's extent.
  const gap = o.height * 0.2;
  const ring = (k: number): LabelBox[] => {
    const dx = o.width / 2 + gap + k * o.height;
    const dy = o.height / 2 + gap + k * o.height;
    const out: LabelBox[] = [];
    for (let i = 0; i <= steps; i++) {
      const x = x0 - dx + ((x1 - x0 + 2 * dx) * i) / steps;
      out.push(box(x, y1 + dy, o), box(x, y0 - dy, o));
    }
    for (let j = 0; j <= steps; j++) {
      const y = y0 - dy + ((y1 - y0 + 2 * dy) * j) / steps;
      out.push(box(x1 + dx, y, o), box(x0 - dx, y, o));
    }
    return out;
  };
  const outside = Array.from({ length: rings }, (_, k) => ring(k));
  for (const r of outside) {
    const beyond = r.filter(free).sort(byDistance);
    if (beyond.length > 0) return { box: beyond[0], inside: false, covering: false };
  }
  for (const r of [candidates.filter(inside), ...outside]) {
    const anyClear = r.filter((b) => clear(b, points, o)).sort(byDistance);
    if (anyClear.length > 0) return { box: anyClear[0], inside: inside(anyClear[0]), covering: false };
  }
  return { box: box(cx, cy, o), inside: true, covering: true };
}

/**
 * Where an isolux level's label goes: the vertex of its lines whose box hides no measurement
 * point and no label already placed, nearest the middle of the longest line; null when no vertex
 * is free (the level is then named in the legend only).
 */
export function placeLineLabel(lines: readonly (readonly PlanPoint[])[], points: readonly PlanPoint[], o: PlaceOptions): LabelBox | null {
  const longest = [...lines].sort((a, b) => b.length - a.length)[0];
  if (!longest || longest.length === 0) return null;
  const mid = longest[Math.floor(longest.length / 2)];
  const taken = o.taken ?? [];
  const options = lines.flatMap((l) => l.map((p) => box(p[0], p[1], o)))
    .filter((b) => clear(b, points, o) && taken.every((t) => !overlaps(b, t)))
    .sort((a, b) => Math.hypot(a.x - mid[0], a.y - mid[1]) - Math.hypot(b.x - mid[0], b.y - mid[1]));
  return options[0] ?? null;
}
