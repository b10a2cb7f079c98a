import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { point as turfPoint } from '@turf/helpers';
import { distanceToOutline, polygonAreaM2, toTurfPolygon, type PlanPoint } from './polygon';

export type ZoneKind = 'room' | 'task_area' | 'outdoor';

export type ZoneShape = { id: number; kind: ZoneKind; wallBandM: number; polygon: PlanPoint[] };

export type ZoneAssignment = {
  /** The smallest zone containing the point (outline included), or null. */
  zoneId: number | null;
  /**
   * Within the wall band of its room: closer than wallBandM to the room's outline.
   * Only rooms have walls; a task area marks where a task lies, so its points are
   * never excluded (EN 12464-1 excludes the band "unless a task lies there").
   */
  inWallBand: boolean;
};

/**
 * Assigns points to zones. Containment by @turf/boolean-point-in-polygon with the outline
 * counted as inside; nested zones resolve to the smallest by area, so a task area inside a
 * room takes its points and the rest of the room keeps the others. On an edge shared by two
 * zones of equal area, the zone with the lower id wins (stable across calls).
 */
export function createZoneAssigner(zones: readonly ZoneShape[]) {
  const prepared = zones
    .filter((z) => z.polygon.length >= 3)
    .map((z) => ({ zone: z, turf: toTurfPolygon(z.polygon), area: polygonAreaM2(z.polygon), bbox: bboxOf(z.polygon) }))
    .sort((a, b) => a.area - b.area || a.zone.id - b.zone.id);

  return (p: PlanPoint): ZoneAssignment => {
    const pt = turfPoint(p);
    for (const z of prepared) {
      const [x0, y0, x1, y1] = z.bbox;
      if (p[0] < x0 || p[0] > x1 || p[1] < y0 || p[1] > y1) continue;
      if (!booleanPointInPolygon(pt, z.turf)) continue;
      const inWallBand = z.zone.kind === 'room' && z.zone.wallBandM > 0 && distanceToOutline(p, z.zone.polygon) < z.zone.wallBandM;
      return { zoneId: z.zone.id, inWallBand };
    }
    return { zoneId: null, inWallBand: false };
  };
}

export function assignZones(points: readonly PlanPoint[], zones: readonly ZoneShape[]): ZoneAssignment[] {
  const assign = createZoneAssigner(zones);
  return points.map(assign);
}

function bboxOf(poly: readonly PlanPoint[]): [number, number, number, number] {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [x, y] of poly) {
    if (x < x0) x0 = x;
    if (y < y0) y0 = y;
    if (x > x1) x1 = x;
    if (y > y1) y1 = y;
  }
  return [x0, y0, x1, y1];
}
