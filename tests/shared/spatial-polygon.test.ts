import { describe, it, expect } from 'vitest';
import { distanceToOutline, normalisePolygon, polygonAreaM2, validatePolygon, type PlanPoint } from '@shared/spatial/polygon';

const square: PlanPoint[] = [[0, 0], [10, 0], [10, 10], [0, 10]];
const plan = { widthM: 36, heightM: 20 };

describe('validatePolygon', () => {
  it('validatePolygon, when given a plain rectangle inside the plan, accepts it unchanged', () => {
    const r = validatePolygon(square, plan);
    expect(r).toEqual({ ok: true, polygon: square });
  });

  it('validatePolygon, when given two corners, rejects it saying how many corners it has', () => {
    const r = validatePolygon([[0, 0], [1, 1]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatch(/at least 3 distinct corners; this outline has 2/);
  });

  it('validatePolygon, when three corners include a repeat and a closing copy, counts distinct corners only', () => {
    const r = validatePolygon([[0, 0], [0, 0], [5, 0], [0, 0]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatch(/has 2/);
  });

  it('validatePolygon, when the outline is a bow tie, rejects it and names the crossing point', () => {
    const r = validatePolygon([[0, 0], [10, 10], [10, 0], [0, 10]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems.join(' ')).toMatch(/crosses itself near \(5, 5\) m/);
  });

  it('validatePolygon, when a corner lies beyond the plan, rejects it naming that corner and the plan size', () => {
    const r = validatePolygon([[30, 0], [40, 0], [40, 5], [30, 5]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems).toHaveLength(2);
      expect(r.problems[0]).toMatch(/Corner 2 \(40, 0\) m lies outside the plan \(0 to 36 m across, 0 to 20 m up\)/);
    }
  });

  it('validatePolygon, when the corners are collinear, rejects it as having no area', () => {
    const r = validatePolygon([[0, 0], [5, 0], [10, 0]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatch(/no area/);
  });

  it('validatePolygon, when a corner is not finite, rejects it naming the corner', () => {
    const r = validatePolygon([[0, 0], [Number.NaN, 0], [1, 1]], plan);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatch(/Corner 2/);
  });

  it('validatePolygon, when no plan extent is given, accepts corners anywhere', () => {
    expect(validatePolygon([[100, 100], [200, 100], [200, 200]]).ok).toBe(true);
  });
});

describe('polygon measures', () => {
  it('polygonAreaM2, for a 20 m x 12 m room in either winding, is 240 m2', () => {
    const room: PlanPoint[] = [[0, 0], [20, 0], [20, 12], [0, 12]];
    expect(polygonAreaM2(room)).toBeCloseTo(240, 9);
    expect(polygonAreaM2([...room].reverse())).toBeCloseTo(240, 9);
  });

  it('distanceToOutline, for points inside, on and beyond a corner of a square, is the planar distance', () => {
    expect(distanceToOutline([5, 5], square)).toBeCloseTo(5, 12);
    expect(distanceToOutline([0.3, 6], square)).toBeCloseTo(0.3, 12);
    expect(distanceToOutline([10, 4], square)).toBe(0);
    expect(distanceToOutline([13, 14], square)).toBeCloseTo(5, 12); // 3-4-5 triangle to the corner (10, 10)
  });

  it('normalisePolygon, when the closing corner repeats the first, drops it', () => {
    expect(normalisePolygon([...square, [0, 0]])).toEqual(square);
  });
});
