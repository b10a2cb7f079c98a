import { and, asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { readings } from '../../db/schema/surveys';
import { zones } from '../../db/schema/plans';
import { probes } from '../../db/schema/calibration';
import { verdictAggregates } from '../../db/schema/aggregates';
import type { ZonePoint } from '@shared/schemas/compliance';
import type { MapReading } from '@shared/schemas/plans';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import { computeTask } from '../../compute/compute-pool';
import { packJsonField, type PackedField } from '../../http/packed-json';
import { photoPointKey } from '../field/field-service';
import { loadReadingsById } from './compliance-repository';
import { aggregateZoneMembers, type AggregateSummary, type ZoneMembers } from './verdict-aggregates';

/**
 * The large parts of the zone-detail and map answers, built on a compute thread from one verdict
 * aggregate (its zone members or its map sample, and those readings) and packed (packed-json.ts),
 * so the routes keep them per aggregate (answer-cache.ts) and never serialise thousands of points
 * on the event loop. What is not part of the aggregate's inputs (photos, notes, the previous
 * survey, probe serials) is added or checked per request.
 */

/** A zone's points, packed, and the point labels of its readings (a photo taken at one of them belongs to the zone). */
export type ZonePointsPart = { points: PackedField<'points', ZonePoint[]>; labels: string };
export type ZonePointsInput = { surveyId: number; aggregateId: number; zoneId: number } | { surveyId: number; members: ZoneMembers };

function buildZonePoints(db: Db, input: ZonePointsInput): ZonePointsPart | null {
  // One snapshot: the aggregate still there, and its readings as they were judged.
  return db.$client.transaction(() => {
    let members: ZoneMembers;
    if ('members' in input) members = input.members;
    else {
      if (!db.select({ id: verdictAggregates.id }).from(verdictAggregates).where(eq(verdictAggregates.id, input.aggregateId)).get()) return null;
      members = aggregateZoneMembers(db, input.aggregateId, input.zoneId);
    }
    const wallBand = new Set(members.wallBandReadingIds);
    const pointReadings = loadReadingsById(db, input.surveyId, members.readingIds.concat(members.wallBandReadingIds, members.otherPlaneReadingIds));
    const points: ZonePoint[] = [];
    for (const r of pointReadings) {
      if (r.xM === null || r.yM === null) continue;
      const df = members.pointDf[r.id];
      points.push({
        readingId: r.id, point: r.point, xM: r.xM, yM: r.yM, timestamp: new Date(r.timeMs).toISOString(),
        lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag, inWallBand: wallBand.has(r.id), plane: r.plane ?? 'horizontal', azimuthDeg: r.azimuthDeg ?? null,
        ...(df !== undefined ? { dfPercent: df } : {}),
      });
    }
    return { points: packJsonField('points', points), labels: labelList(pointReadings.map((r) => r.point)) };
  }).deferred();
}

/** Declared in server/modules.ts (compliance). */
export const zonePointsTask = computeTask('zone-points', buildZonePoints);

/**
 * Point labels as one string, each as its JSON text on a line of its own (JSON text has no raw
 * line break), so a lookup is one substring search and 12,500 labels cost one string, not a Set.
 */
function labelList(labels: readonly string[]): string {
  return `\n${[...new Set(labels.map((l) => JSON.stringify(photoPointKey(l))))].join('\n')}\n`;
}

/** Whether a zone's readings include this point label (as photoPointKey compares them). */
export const hasPointLabel = (part: Pick<ZonePointsPart, 'labels'>, label: string) => part.labels.includes(`\n${JSON.stringify(photoPointKey(label))}\n`);

/** A plan's drawn readings, packed, and the probes they name ([id, serial]: a serial can change without a new aggregate). */
export type MapReadingsPart = { readings: PackedField<'readings', MapReading[]>; probes: [number, string][] };
export type MapReadingsInput = { surveyId: number; aggregateId: number; planId: number };

function buildMapReadings(db: Db, input: MapReadingsInput): MapReadingsPart | null {
  return db.$client.transaction(() => {
    const summary = db.select({ summary: verdictAggregates.summary }).from(verdictAggregates).where(eq(verdictAggregates.id, input.aggregateId)).get()?.summary as AggregateSummary | undefined;
    if (!summary) return null;
    const sampleIds = summary.map.plans.find((p) => p.planId === input.planId)?.sampleIds ?? [];
    const rows = sampleIds.length === 0 ? [] : db.select({
      id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, role: readings.role, lux: readings.lux, uLux: readings.uLux,
      luxBound: readings.luxBound, flag: readings.flag, timeMs: readings.timeMs, gainCode: readings.gainCode, probeId: readings.probeId, probe: probes.serial,
    }).from(readings).innerJoin(probes, eq(probes.id, readings.probeId))
      .where(and(eq(readings.surveyId, input.surveyId), sql`${readings.id} in (select value from json_each(${JSON.stringify(sampleIds)}))`))
      .orderBy(asc(readings.timeMs), asc(readings.id)).all();
    const zoneRows = db.select({ id: zones.id, kind: zones.kind, wallBandM: zones.wallBandM, polygon: zones.polygon }).from(zones).where(eq(zones.planId, input.planId)).all();
    const assign = createZoneAssigner(zoneRows);
    const serials = new Map<number, string>();
    const mapReadings: MapReading[] = rows.map((r) => {
      serials.set(r.probeId, r.probe);
      // Reference probes stand outdoors for daylight: they belong to no zone.
      const a = r.role === 'task' ? assign([r.xM!, r.yM!]) : { zoneId: null, inWallBand: false };
      return {
        id: r.id, point: r.point, xM: r.xM!, yM: r.yM!, role: r.role, lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag,
        timestamp: new Date(r.timeMs).toISOString(), probe: r.probe, gainCode: r.gainCode, zoneId: a.zoneId, inWallBand: a.inWallBand,
      };
    });
    return { readings: packJsonField('readings', mapReadings), probes: [...serials.entries()].sort((a, b) => a[0] - b[0]) };
  }).deferred();
}

/** Declared in server/modules.ts (compliance). */
export const mapReadingsTask = computeTask('map-readings', buildMapReadings);
