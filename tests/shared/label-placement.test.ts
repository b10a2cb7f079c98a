import { describe, it, expect } from 'vitest';
import { placeLineLabel, placeZoneLabel, type LabelBox } from '@shared/spatial/label-placement';
import { DEMO_PLANS } from '@server/db/demo/library-layout';
import { simulateDemoWalk } from '@server/db/demo/simulate-log';
import type { PlanPoint } from '@shared/spatial/polygon';

// Label sizes as the map draws them (11 px text, about 6.3 px a character, 16.5 px tall, markers of
// 5 px radius): common practice for a legible map label, not a standard. The map opens the demo's
// ground floor at 16 px per metre in the browser tests' window; other zooms are checked too.
const size = (text: string, pxPerM: number) => ({ width: (text.length * 6.27 + 8) / pxPerM, height: 16.5 / pxPerM, pointMargin: 5 / pxPerM });
const covers = (b: LabelBox, p: PlanPoint, m: number) => Math.abs(p[0] - b.x) <= b.hw + m && Math.abs(p[1] - b.y) <= b.hh + m;

describe('zone labels leave every measurement point of the demo plans visible', () => {
  const walk = simulateDemoWalk({ startMs: Date.parse('2026-11-19T09:00:00Z'), seed: 1 });
  for (const plan of DEMO_PLANS) for (const pxPerM of [8, 16, 20, 32]) {
    it(`${plan.name} at ${pxPerM} px per metre: no zone label covers a point, and no two labels overlap`, () => {
      const points = walk.filter((r) => r.plan === plan.name && r.xM !== undefined && r.yM !== undefined).map((r) => [r.xM!, r.yM!] as PlanPoint);
      expect(points.length).toBeGreaterThan(5);
      const taken: LabelBox[] = [];
      for (const z of plan.zones) {
        const o = size(`${z.name} · Eavg 560 lx`, pxPerM);
        const placed = placeZoneLabel(z.polygon, points, { ...o, taken });
        expect(placed.covering, z.name).toBe(false);
        for (const p of points) expect(covers(placed.box, p, o.pointMargin), `${z.name} label over (${p[0]}, ${p[1]})`).toBe(false);
        for (const t of taken) expect(Math.abs(t.x - placed.box.x) < t.hw + placed.box.hw && Math.abs(t.y - placed.box.y) < t.hh + placed.box.hh, `${z.name} overlaps a label`).toBe(false);
        taken.push(placed.box);
      }
    });
  }

  it('keeps a label inside its zone, near the centre, when the centre is free', () => {
    const placed = placeZoneLabel([[0, 0], [10, 0], [10, 10], [0, 10]], [[1, 1]], { width: 3, height: 1, pointMargin: 0.2 });
    expect(placed).toMatchObject({ inside: true, covering: false });
    expect(placed.box.x).toBeCloseTo(5, 6);
    expect(placed.box.y).toBeCloseTo(5, 6);
  });

  it('moves off a point at the centre (the middle row of an office grid), staying inside', () => {
    const row: PlanPoint[] = [[1, 5], [3, 5], [5, 5], [7, 5], [9, 5]];
    const placed = placeZoneLabel([[0, 0], [10, 0], [10, 10], [0, 10]], row, { width: 3, height: 1, pointMargin: 0.2 });
    expect(placed.inside).toBe(true);
    expect(Math.abs(placed.box.y - 5)).toBeGreaterThan(0.7);
  });

  it('goes outside a zone whose inside is all points', () => {
    const dense: PlanPoint[] = [];
    for (let x = 0.25; x < 4; x += 0.5) for (let y = 0.25; y < 2; y += 0.5) dense.push([x, y]);
    const placed = placeZoneLabel([[0, 0], [4, 0], [4, 2], [0, 2]], dense, { width: 2, height: 0.5, pointMargin: 0.1 });
    expect(placed).toMatchObject({ inside: false, covering: false });
  });

  // The case the browser found (issue #17, item 10): "Study tables" (8 m × 5 m) lies inside the
  // reading room (20 m × 12 m), measured every metre, at 16 px per metre; its label is wider than the
  // zone, and the ring just outside it is all points too, so the label used to fall back to the centre.
  it('labels a small zone inside a densely measured one beyond the neighbour\'s points, not on them', () => {
    const grid: PlanPoint[] = [];
    for (let x = 0.5; x < 20; x += 1) for (let y = 0.5; y < 12; y += 1) grid.push([x, y]);
    const o = size('Study tables · Eavg 580 lx', 16);
    const placed = placeZoneLabel([[4, 3], [12, 3], [12, 8], [4, 8]], grid, o);
    expect(placed.covering).toBe(false);
    expect(placed.inside).toBe(false);
    for (const p of grid) expect(covers(placed.box, p, o.pointMargin), `label over (${p[0]}, ${p[1]})`).toBe(false);
    // Nearest clear place: just above or below the measured room (the grid's last row is 0.5 m in).
    expect(Math.min(Math.abs(placed.box.y - placed.box.hh - 11.5), Math.abs(placed.box.y + placed.box.hh - 0.5))).toBeLessThan(1.5);
  });

  it('puts an isolux label on a vertex of its line that hides no point', () => {
    const line: PlanPoint[] = [[0, 0], [1, 0], [2, 0], [3, 0], [4, 0]];
    const at = placeLineLabel([line], [[2, 0]], { width: 1, height: 0.4, pointMargin: 0.1 });
    expect(at).not.toBeNull();
    expect(Math.abs(at!.x - 2)).toBeGreaterThan(0.5);
  });
});
