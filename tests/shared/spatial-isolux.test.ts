import { describe, it, expect } from 'vitest';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point } from '@turf/helpers';
import { isoluxLines, EN12464_SCALE_LUX, type MeasuredPoint } from '@shared/spatial/isolux';
import { toTurfPolygon, type PlanPoint } from '@shared/spatial/polygon';

const square: PlanPoint[] = [[0, 0], [10, 0], [10, 10], [0, 10]];

/** E = f(x, y) sampled on a regular grid of (n+1)^2 points over the 10 m square. */
function sampled(f: (x: number, y: number) => number, n = 10, size = 10): MeasuredPoint[] {
  const pts: MeasuredPoint[] = [];
  for (let i = 0; i <= n; i++) for (let j = 0; j <= n; j++) {
    const x = (i * size) / n, y = (j * size) / n;
    pts.push({ x, y, lux: f(x, y) });
  }
  return pts;
}

describe('isoluxLines', () => {
  it('isoluxLines, on the linear field E = 100 x lx over a 10 m square, draws the 500 lx line at x = 5 m within one grid cell', () => {
    const r = isoluxLines(sampled((x) => 100 * x), square);
    const l500 = r.levels.find((l) => l.lux === 500)!;
    expect(l500).toBeDefined();
    const vertices = l500.lines.flat();
    expect(vertices.length).toBeGreaterThan(10);
    for (const [x] of vertices) expect(Math.abs(x - 5)).toBeLessThanOrEqual(r.cellM);
    // The line spans the square from bottom to top, apart from the cells at the data's edge.
    const ys = vertices.map((v) => v[1]);
    expect(Math.min(...ys)).toBeLessThan(2 * r.cellM);
    expect(Math.max(...ys)).toBeGreaterThan(10 - 2 * r.cellM);
  });

  it('isoluxLines, on E = 100 x lx (0 to 1000 lx), draws exactly the EN 12464-1 steps strictly inside the range', () => {
    const r = isoluxLines(sampled((x) => 100 * x), square);
    expect(r.levels.map((l) => l.lux)).toEqual([20, 30, 50, 75, 100, 150, 200, 300, 500, 750]);
    for (const l of r.levels) for (const [x] of l.lines.flat()) expect(Math.abs(x - l.lux / 100)).toBeLessThanOrEqual(r.cellM);
  });

  it('isoluxLines, on the cone E = 1000 - 100 r lx, draws the 750 lx line as one closed circle of radius 2.5 m', () => {
    const r = isoluxLines(sampled((x, y) => 1000 - 100 * Math.hypot(x - 5, y - 5), 20), square);
    const l750 = r.levels.find((l) => l.lux === 750)!;
    expect(l750.lines).toHaveLength(1);
    // Linear interpolation between 0.5 m samples of a cone bends the circle by less than a few cm.
    for (const [x, y] of l750.lines[0]) expect(Math.abs(Math.hypot(x - 5, y - 5) - 2.5)).toBeLessThan(0.1);
    const ring = l750.lines[0];
    expect(ring[0]).toEqual(ring[ring.length - 1]);
  });

  it('isoluxLines, when the points cover only the left half of the zone, never draws beyond their hull', () => {
    const left = sampled((x, y) => 100 * x + 20 * y, 10).filter((p) => p.x <= 5);
    const r = isoluxLines(left, square);
    expect(r.hull).not.toBeNull();
    const hull = toTurfPolygon(r.hull!);
    const vertices = r.levels.flatMap((l) => l.lines.flat());
    expect(vertices.length).toBeGreaterThan(0);
    for (const v of vertices) expect(booleanPointInPolygon(point(v), hull), `${v}`).toBe(true);
    expect(Math.max(...vertices.map((v) => v[0]))).toBeLessThanOrEqual(5);
  });

  it('isoluxLines, when the zone is smaller than the measured area, keeps lines inside the zone only', () => {
    const zone: PlanPoint[] = [[0, 0], [4, 0], [4, 10], [0, 10]];
    const r = isoluxLines(sampled((x) => 100 * x), zone);
    expect(r.levels.map((l) => l.lux)).toEqual([20, 30, 50, 75, 100, 150, 200, 300]);
    for (const v of r.levels.flatMap((l) => l.lines.flat())) expect(v[0]).toBeLessThanOrEqual(4 + 1e-9);
  });

  it('isoluxLines, when the field is flat, draws nothing and says why', () => {
    const r = isoluxLines(sampled(() => 420), square);
    expect(r.levels).toEqual([]);
    expect(r.reason).toMatch(/no step/);
  });

  it('isoluxLines, when the points lie on one line, draws nothing and says why', () => {
    const r = isoluxLines([{ x: 0, y: 0, lux: 100 }, { x: 5, y: 5, lux: 300 }, { x: 10, y: 10, lux: 600 }], square);
    expect(r.levels).toEqual([]);
    expect(r.reason).toMatch(/one line/);
  });

  it('isoluxLines, with fewer than three points, draws nothing and says why', () => {
    expect(isoluxLines([{ x: 1, y: 1, lux: 10 }], square).reason).toMatch(/Fewer than 3/);
  });

  it('EN12464_SCALE_LUX, as listed in DOMAIN.md section 5 (EN 12464-1 scale), has its 15 steps in order', () => {
    expect(EN12464_SCALE_LUX).toEqual([20, 30, 50, 75, 100, 150, 200, 300, 500, 750, 1000, 1500, 2000, 3000, 5000]);
  });
});

describe('isolux loops around a single reading', () => {
  // Project rule: a closed loop enclosing no more than one point's share of the hull is noise.
  const grid = (f: (x: number, y: number) => number) => {
    const pts: { x: number; y: number; lux: number }[] = [];
    for (let i = 0; i <= 10; i++) for (let j = 0; j <= 10; j++) pts.push({ x: i, y: j, lux: f(i, j) });
    return pts;
  };
  const square: [number, number][] = [[0, 0], [10, 0], [10, 10], [0, 10]];

  it('draws no loop around one reading that pokes above a level', () => {
    const r = isoluxLines(grid((x, y) => (x === 5 && y === 5 ? 320 : 280)), square);
    expect(r.levels.find((l) => l.lux === 300)).toBeUndefined();
  });

  it('keeps a loop around a bright patch of several readings', () => {
    const r = isoluxLines(grid((x, y) => (Math.abs(x - 5) <= 2 && Math.abs(y - 5) <= 2 ? 320 : 280)), square);
    const level = r.levels.find((l) => l.lux === 300);
    expect(level).toBeDefined();
    expect(level!.lines.length).toBe(1);
  });
});
