import { describe, it, expect } from 'vitest';
import { assignZones, type ZoneShape } from '@shared/spatial/zone-assignment';
import { DEMO_PLANS } from '@server/db/demo/library-layout';

const room: ZoneShape = { id: 1, kind: 'room', wallBandM: 0.5, polygon: [[0, 0], [20, 0], [20, 12], [0, 12]] };
const task: ZoneShape = { id: 2, kind: 'task_area', wallBandM: 0.5, polygon: [[4, 3], [12, 3], [12, 8], [4, 8]] };
const office: ZoneShape = { id: 3, kind: 'room', wallBandM: 0.5, polygon: [[20, 0], [28, 0], [28, 6], [20, 6]] };
const carPark: ZoneShape = { id: 4, kind: 'outdoor', wallBandM: 0.5, polygon: [[30, 0], [40, 0], [40, 10], [30, 10]] };
const zones = [room, task, office, carPark];

describe('assignZones', () => {
  it('assignZones, for a point inside a task area nested in a room, gives the smaller task area', () => {
    expect(assignZones([[8, 5]], zones)[0]).toEqual({ zoneId: 2, inWallBand: false });
  });

  it('assignZones, for a point in the room outside its nested task area (the task area is a hole in the room), gives the room', () => {
    expect(assignZones([[2, 5], [14, 10]], zones).map((a) => a.zoneId)).toEqual([1, 1]);
  });

  it('assignZones, for a point on the task area edge, gives the task area (the outline counts as inside)', () => {
    expect(assignZones([[4, 5], [12, 8]], zones).map((a) => a.zoneId)).toEqual([2, 2]);
  });

  it('assignZones, for a point on the wall shared by two rooms, gives the smaller room and marks it in the wall band', () => {
    // Office (48 m2) is smaller than the reading room (240 m2).
    expect(assignZones([[20, 3]], zones)[0]).toEqual({ zoneId: 3, inWallBand: true });
  });

  it('assignZones, for points on a shared edge of two equal zones, gives the lower id both times', () => {
    const a: ZoneShape = { id: 7, kind: 'room', wallBandM: 0, polygon: [[0, 0], [5, 0], [5, 5], [0, 5]] };
    const b: ZoneShape = { id: 6, kind: 'room', wallBandM: 0, polygon: [[5, 0], [10, 0], [10, 5], [5, 5]] };
    expect(assignZones([[5, 2], [5, 4]], [a, b]).map((r) => r.zoneId)).toEqual([6, 6]);
  });

  it('assignZones, for room points 0.49 m and 0.51 m from a wall, marks only the first in the wall band', () => {
    const r = assignZones([[0.49, 6], [0.51, 6], [10, 11.6]], zones);
    expect(r.map((a) => a.inWallBand)).toEqual([true, false, true]);
    expect(r.every((a) => a.zoneId === 1)).toBe(true);
  });

  it('assignZones, for a task-area point close to the room wall, never marks the wall band (a task lies there)', () => {
    const edgeTask: ZoneShape = { id: 9, kind: 'task_area', wallBandM: 0.5, polygon: [[0, 0], [3, 0], [3, 3], [0, 3]] };
    expect(assignZones([[0.1, 1]], [room, edgeTask])[0]).toEqual({ zoneId: 9, inWallBand: false });
  });

  it('assignZones, for an outdoor point near the car park edge, does not mark a wall band (no walls outdoors)', () => {
    expect(assignZones([[30.1, 5]], zones)[0]).toEqual({ zoneId: 4, inWallBand: false });
  });

  it('assignZones, for a point in no zone, gives null', () => {
    expect(assignZones([[29, 20]], zones)[0]).toEqual({ zoneId: null, inWallBand: false });
  });

  it('assignZones, for an L-shaped zone, leaves the notch outside', () => {
    const entrance = DEMO_PLANS[2].zones.find((z) => z.key === 'entrance')!;
    const l: ZoneShape = { id: 5, kind: 'outdoor', wallBandM: 0, polygon: entrance.polygon };
    expect(assignZones([[46, 20], [54, 20], [46, 5]], [l]).map((a) => a.zoneId)).toEqual([null, 5, 5]);
  });

  it('assignZones, for the demo ground floor, puts a point 1 m inside each zone\'s lower-left corner in that zone', () => {
    const ground = DEMO_PLANS[0].zones.map((z, i) => ({ id: i + 1, kind: z.kind, wallBandM: 0.5, polygon: z.polygon }));
    const centres = DEMO_PLANS[0].zones.map((z) => {
      const xs = z.polygon.map((p) => p[0]), ys = z.polygon.map((p) => p[1]);
      return [Math.min(...xs) + 1, Math.min(...ys) + 1] as [number, number];
    });
    expect(assignZones(centres, ground).map((a) => a.zoneId)).toEqual(ground.map((z) => z.id));
  });
});
