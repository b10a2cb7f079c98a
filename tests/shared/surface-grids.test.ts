import { describe, expect, it } from 'vitest';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import {
  ceilingGrid, ceilingLabel, GridError, measurementGrid, wallGrids, wallLabel, WALL_POINT_INSET_M, type GridZone,
} from '@shared/spatial/measurement-grid';
import { distanceToOutline, toTurfPolygon, type PlanPoint } from '@shared/spatial/polygon';

const rect = (w: number, h: number): PlanPoint[] => [[0, 0], [w, 0], [w, h], [0, h]];
const room = (polygon: PlanPoint[]): GridZone => ({ kind: 'room', wallBandM: 0.5, polygon });
// p = 0.2 × 5^log10(d) (EN 12464-1), computed here independently of the code under test.
const p = (d: number) => 0.2 * 5 ** Math.log10(d);

describe('wall grids (EN 12464-1 spacing formula on each wall; the wall rule itself is Luxtrail\'s, stated in GRID_SURFACES)', () => {
  const walls = wallGrids(room(rect(6, 4)), { rounding: 'next_higher', wallHeightM: 3 });

  it('a 6 m × 4 m room 3 m high has four walls; the 6 m × 3 m wall takes d = 3 m (sides differ by a factor of 2), the 4 m × 3 m wall d = 4 m', () => {
    expect(walls.map((w) => w.lengthM)).toEqual([6, 4, 6, 4]);
    const [long, short] = walls;
    expect(long.dM).toBe(3);
    expect(long.spacingM).toBeCloseTo(p(3), 12); // 0.4309 m
    // Next higher integer of side / p: 6 / 0.4309 = 13.92 → 14 along, 3 / 0.4309 = 6.96 → 7 up.
    expect([long.columns, long.rows]).toEqual([Math.ceil(6 / p(3)), Math.ceil(3 / p(3))]);
    expect([long.columns, long.rows]).toEqual([14, 7]);
    expect(short.dM).toBe(4);
    expect([short.columns, short.rows]).toEqual([Math.ceil(4 / p(4)), Math.ceil(3 / p(4))]);
    expect(long.points).toHaveLength(14 * 7);
  });

  it('the nearest-integer reading gives 14 × 7 on the long wall too, and 8 × 6 against the next higher 8 × 6 on the short one (d/p = 7.60 and 5.70)', () => {
    const nearest = wallGrids(room(rect(6, 4)), { rounding: 'nearest', wallHeightM: 3 });
    expect([nearest[0].columns, nearest[0].rows]).toEqual([Math.round(6 / p(3)), Math.round(3 / p(3))]);
    expect([nearest[1].columns, nearest[1].rows]).toEqual([Math.round(4 / p(4)), Math.round(3 / p(4))]);
  });

  it('each point sits on its wall, the inset inside the room, at the centre of its cell, row A nearest the ceiling', () => {
    const [bottom] = walls;
    const a1 = bottom.points[0];
    expect(a1.cell).toBe('A1');
    expect(a1.xM).toBeCloseTo(6 / 14 / 2, 12);
    expect(a1.yM).toBeCloseTo(WALL_POINT_INSET_M, 12);
    expect(a1.heightM).toBeCloseTo(3 - 3 / 7 / 2, 12);
    const last = bottom.points.at(-1)!;
    expect(last.cell).toBe('G14');
    expect(last.heightM).toBeCloseTo(3 / 7 / 2, 12);
  });

  it('the sensor faces into the room: bottom wall 0°, right 270°, top 180°, left 90° (clockwise from the plan\'s up), whichever way the outline runs', () => {
    expect(walls.map((w) => w.azimuthDeg)).toEqual([0, 270, 180, 90].map((a) => expect.closeTo(a, 9)));
    const clockwise = wallGrids(room([...rect(6, 4)].reverse()), { rounding: 'next_higher', wallHeightM: 3 });
    expect(clockwise.map((w) => Math.round(w.azimuthDeg)).sort((a, b) => a - b)).toEqual([0, 90, 180, 270]);
  });

  it('an L-shaped room gets six walls, every point inside the outline (turf) and the inset away from its wall', () => {
    const l: PlanPoint[] = [[0, 0], [8, 0], [8, 3], [3, 3], [3, 7], [0, 7]];
    const ws = wallGrids(room(l), { rounding: 'next_higher', wallHeightM: 2.7 });
    expect(ws).toHaveLength(6);
    const turf = toTurfPolygon(l);
    for (const w of ws) {
      for (const pt of w.points) {
        expect(booleanPointInPolygon(turfPoint([pt.xM, pt.yM]), turf)).toBe(true);
        expect(distanceToOutline([pt.xM, pt.yM], l)).toBeCloseTo(WALL_POINT_INSET_M, 9);
      }
    }
  });

  it('refuses task areas, outdoor areas and room heights outside 1 to 30 m', () => {
    expect(() => wallGrids({ kind: 'task_area', wallBandM: 0, polygon: rect(2, 2) }, { rounding: 'nearest', wallHeightM: 3 })).toThrow(GridError);
    expect(() => wallGrids({ kind: 'outdoor', wallBandM: 0, polygon: rect(2, 2) }, { rounding: 'nearest', wallHeightM: 3 })).toThrow(/rooms/);
    expect(() => wallGrids(room(rect(6, 4)), { rounding: 'nearest', wallHeightM: 0.5 })).toThrow(/1 m to 30 m/);
  });
});

describe('ceiling grid (Luxtrail\'s rule: the working-plane grid projected up)', () => {
  it('has the working-plane grid\'s points and is refused for a task area', () => {
    const zone = room(rect(6, 4));
    const ceiling = ceilingGrid(zone, { rounding: 'next_higher' });
    const floor = measurementGrid(zone, { rounding: 'next_higher' });
    expect(ceiling.points).toEqual(floor.points);
    expect(() => ceilingGrid({ kind: 'task_area', wallBandM: 0, polygon: rect(2, 2) }, { rounding: 'nearest' })).toThrow(/ceiling/);
  });
});

describe('surface labels', () => {
  it('name the zone, the surface and the cell, and differ from the working plane\'s', () => {
    expect(wallLabel('O1', 2, 1, 2)).toBe('O1-W2-B3');
    expect(ceilingLabel('O1', 0, 0)).toBe('O1-C-A1');
  });
});
