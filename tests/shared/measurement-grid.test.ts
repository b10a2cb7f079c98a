import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { gridSpacing, pointsPerSide } from '@shared/core/zone-stats';
import {
  cellCounts, gridCountsByRounding, gridLabel, GridError, isNarrowZone, labelKey, measurementGrid, rowLetters, zoneCode,
  NARROW_ZONE_WIDTH_M, type GridZone,
} from '@shared/spatial/measurement-grid';
import { distanceToOutline, toTurfPolygon, type PlanPoint } from '@shared/spatial/polygon';

const rect = (w: number, h: number, x = 0, y = 0): PlanPoint[] => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];
const task = (polygon: PlanPoint[]): GridZone => ({ kind: 'task_area', wallBandM: 0.5, polygon });
const room = (polygon: PlanPoint[], wallBandM = 0.5): GridZone => ({ kind: 'room', wallBandM, polygon });

describe('EN 12464-1 spacing p = 0.2 × 5^log10(d), p ≤ 10 m (formula: EN 12464-1; values derived from it, as listed in the issue)', () => {
  it('p = 0.200 m at d = 1 m, 1.000 m at 10 m, 5.000 m at 100 m, capped at 10 m for d = 1000 m', () => {
    expect(gridSpacing(1)).toBeCloseTo(0.2, 12);
    expect(gridSpacing(10)).toBeCloseTo(1, 12);
    expect(gridSpacing(100)).toBeCloseTo(5, 12);
    expect(gridSpacing(1000)).toBe(10);
  });

  it.each([
    // d, d/p (derived), nearest (2021 reading, secondary), next higher (2011 text)
    [5, 8.12, 8, 9],
    [2, 6.16, 6, 7],
    [25, 13.18, 13, 14],
  ])('d = %s m: d/p = %s, so %s points per side (nearest) or %s (next higher)', (d, ratio, nearest, higher) => {
    expect(d / gridSpacing(d)).toBeCloseTo(ratio, 2);
    expect(pointsPerSide(d, gridSpacing(d), 'nearest')).toBe(nearest);
    expect(pointsPerSide(d, gridSpacing(d), 'next_higher')).toBe(higher);
    // A square task area of side d (no wall band) gets that many points per side under each reading.
    expect(gridCountsByRounding(task(rect(d, d)))).toEqual({ nearest: nearest * nearest, next_higher: higher * higher });
  });
});

describe('grid geometry (EN 12464-1: points at cell centres; band for rooms only)', () => {
  it('a 10 m × 10 m task area: d = 10 m, p = 1 m, 10 × 10 points at the centres of 1 m cells', () => {
    const g = measurementGrid(task(rect(10, 10)), { rounding: 'next_higher' });
    expect(g.bandM).toBe(0);
    expect([g.columns, g.rows, g.points.length]).toEqual([10, 10, 100]);
    expect(g.points[0]).toMatchObject({ row: 0, col: 0, cell: 'A1', xM: expect.closeTo(0.5, 12), yM: expect.closeTo(9.5, 12) });
    expect(g.points[99]).toMatchObject({ cell: 'J10', xM: expect.closeTo(9.5, 12), yM: expect.closeTo(0.5, 12) });
  });

  it('a room loses its 0.5 m wall band before d is taken: 11 m × 11 m gives the 10 m × 10 m grid shifted by the band', () => {
    const g = measurementGrid(room(rect(11, 11)), { rounding: 'next_higher' });
    expect(g.dM).toBeCloseTo(10, 12);
    expect(g.points).toHaveLength(100);
    expect(g.points[0]).toMatchObject({ xM: expect.closeTo(1, 12), yM: expect.closeTo(10, 12) });
    // The same outline as an outdoor area keeps its edges: d = 11 m.
    expect(measurementGrid({ kind: 'outdoor', wallBandM: 0.5, polygon: rect(11, 11) }, { rounding: 'next_higher' }).dM).toBe(11);
  });

  it('the shorter side gives d when the sides differ by a factor of 2 or more: the 18 m × 2 m corridor needs 425 points with its band', () => {
    const g = measurementGrid(room(rect(18, 2)), { rounding: 'next_higher' });
    // Less the band: 17 m × 1 m, factor 17, so d = 1 m and p = 0.2 m: 85 × 5 (the count the issue reports).
    expect(g.dM).toBeCloseTo(1, 12);
    expect(g.spacingM).toBeCloseTo(0.2, 12);
    expect([g.columns, g.rows, g.points.length]).toEqual([85, 5, 425]);
  });

  it('cell aspect ratio is kept within 0.5..2 (EN 12464-1, secondary) by adding points on the long-celled side', () => {
    // 10 m × 1 m at p = 3 m: ceil gives 4 × 1 cells of 2.5 m × 1 m (aspect 2.5): one more column makes 2 m × 1 m.
    expect(cellCounts(10, 1, 3, 'next_higher')).toEqual({ cols: 5, rows: 1, adjusted: true });
    expect(cellCounts(1, 10, 3, 'next_higher')).toEqual({ cols: 1, rows: 5, adjusted: true });
    expect(cellCounts(10, 10, 1, 'next_higher')).toEqual({ cols: 10, rows: 10, adjusted: false });
  });

  it('property: for any rectangle, cells keep their aspect within 0.5..2 and the 2011 reading never spaces wider than p', () => {
    fc.assert(fc.property(fc.double({ min: 0.3, max: 120, noNaN: true }), fc.double({ min: 0.3, max: 120, noNaN: true }), (w, h) => {
      for (const rounding of ['next_higher', 'nearest'] as const) {
        const g = measurementGrid(task(rect(w, h)), { rounding });
        expect(g.cellAspect).toBeGreaterThanOrEqual(0.5 - 1e-9);
        expect(g.cellAspect).toBeLessThanOrEqual(2 + 1e-9);
        expect(g.points).toHaveLength(g.columns * g.rows);
        if (rounding === 'next_higher') {
          expect(g.cellWidthM).toBeLessThanOrEqual(g.spacingM + 1e-9);
          expect(g.cellHeightM).toBeLessThanOrEqual(g.spacingM + 1e-9);
        }
      }
    }), { numRuns: 60 });
  });

  it('a band that leaves nothing is refused, saying why', () => {
    expect(() => measurementGrid(room(rect(0.9, 4)), { rounding: 'next_higher' })).toThrow(GridError);
    expect(() => measurementGrid(room(rect(0.9, 4)), { rounding: 'next_higher' })).toThrow(/wall band leaves no area/);
  });
});

describe('outlines that are not rectangles (Luxtrail rule: grid over the bounding box less the band, keep centres inside the outline and outside its band)', () => {
  // An L-shaped room: 10 m × 10 m less its upper-right 6 m × 6 m.
  const L: PlanPoint[] = [[0, 0], [10, 0], [10, 4], [4, 4], [4, 10], [0, 10]];

  it('keeps the 51 centres of the two arms: box 9 m × 9 m, d = 9 m, 10 × 10 cells of 0.9 m', () => {
    const g = measurementGrid(room(L), { rounding: 'next_higher' });
    expect(g.rectangular).toBe(false);
    expect(g.dM).toBeCloseTo(9, 12);
    expect([g.columns, g.rows]).toEqual([10, 10]);
    // By hand: centres at 0.95 + 0.9 k; the vertical arm keeps x ≤ 3.5 (3 columns), the horizontal arm y ≤ 3.5 (3 rows):
    // 3 × 10 + 10 × 3 − 3 × 3 = 51 kept, 49 dropped.
    expect(g.points).toHaveLength(51);
    expect(g.dropped).toBe(49);
  });

  it('every kept point lies inside the outline and at least 0.5 m from it; every dropped centre fails one of the two (cross-check with turf)', () => {
    const g = measurementGrid(room(L), { rounding: 'next_higher' });
    const poly = toTurfPolygon(L);
    const kept = new Set(g.points.map((p) => `${p.row},${p.col}`));
    for (let r = 0; r < g.rows; r++) {
      for (let c = 0; c < g.columns; c++) {
        const x = g.box.x0 + (c + 0.5) * g.cellWidthM;
        const y = g.box.y1 - (r + 0.5) * g.cellHeightM;
        const ok = booleanPointInPolygon(turfPoint([x, y]), poly) && distanceToOutline([x, y], L) >= 0.5;
        expect(kept.has(`${r},${c}`)).toBe(ok);
      }
    }
  });

  it('as a task area (no band) the L keeps more points, and labels keep their row and column in the full box', () => {
    const g = measurementGrid(task(L), { rounding: 'next_higher' });
    expect(g.bandM).toBe(0);
    expect(g.points.length).toBeGreaterThan(51);
    expect(g.points.every((p) => p.cell === `${rowLetters(p.row)}${p.col + 1}`)).toBe(true);
  });
});

describe(`narrow zones: centreline row below ${NARROW_ZONE_WIDTH_M} m (Luxtrail's documented alternative)`, () => {
  it('the 18 m × 2 m corridor: one row along its centre, d = 17 m (its length less the band), 12 points', () => {
    expect(isNarrowZone(rect(18, 2))).toBe(true);
    const g = measurementGrid(room(rect(18, 2)), { rounding: 'next_higher', layout: 'centreline' });
    // p = 0.2 × 5^log10(17) = 1.448 m; 17 / 1.448 = 11.74 → 12 under either reading.
    expect(g.spacingM).toBeCloseTo(0.2 * 5 ** Math.log10(17), 12);
    expect(g.points).toHaveLength(12);
    expect(g.points.every((p) => Math.abs(p.yM - 1) < 1e-12)).toBe(true);
    expect(g.points[0].xM).toBeCloseTo(0.5 + 17 / 24, 12);
  });

  it('a vertical walkway gets a column; a wide room is refused the centreline', () => {
    const g = measurementGrid({ kind: 'outdoor', wallBandM: 0, polygon: rect(1.5, 30) }, { rounding: 'nearest', layout: 'centreline' });
    expect(g.columns).toBe(1);
    expect(g.points.every((p) => Math.abs(p.xM - 0.75) < 1e-12)).toBe(true);
    expect(g.points.map((p) => p.cell).slice(0, 3)).toEqual(['A1', 'B1', 'C1']);
    expect(() => measurementGrid(room(rect(6, 4)), { rounding: 'next_higher', layout: 'centreline' })).toThrow(/narrower than/);
    expect(isNarrowZone(rect(3, 10))).toBe(false); // 3 m is not narrow
    expect(isNarrowZone(rect(2, 3))).toBe(false); // not twice as long
  });
});

describe('labels', () => {
  it('row letters run A..Z then AA; labels are zone code, dash, row, column', () => {
    expect([rowLetters(0), rowLetters(25), rowLetters(26), rowLetters(27), rowLetters(701), rowLetters(702)]).toEqual(['A', 'Z', 'AA', 'AB', 'ZZ', 'AAA']);
    expect(gridLabel('OF1', 1, 2)).toBe('OF1-B3');
  });
  it('zone codes: initials or two letters plus the number, unique case-insensitively', () => {
    expect(zoneCode('Office 1')).toBe('OF1');
    expect(zoneCode('Reading room')).toBe('RR');
    expect(zoneCode('Stairs')).toBe('ST');
    expect(zoneCode('Office 1', ['of1'])).toBe('OF1.2');
    expect(zoneCode('Reading room', ['RR', 'RR2'])).toBe('RR3');
    expect(zoneCode('—')).toBe('Z');
  });
  it('a log label matches trimmed and case-insensitively', () => {
    expect(labelKey('  of1-b3 ')).toBe(labelKey('OF1-B3'));
  });
});
