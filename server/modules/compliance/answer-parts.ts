import { and, asc, eq, sql } from 'drizzle-orm';
import { oncePerConnection, type Db } from '../../db/client';
import { readings } from '../../db/schema/surveys';
import { zones } from '../../db/schema/plans';
import { probes } from '../../db/schema/calibration';
import { verdictAggregateZones, verdictAggregates, verdictAnswerParts } from '../../db/schema/aggregates';
import type { ZonePoint } from '@shared/schemas/compliance';
import type { MapReading } from '@shared/schemas/plans';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import { computeTask } from '../../compute/compute-pool';
import { packJsonField, type PackedField } from '../../http/packed-json';
import { answerCache } from './answer-cache';
import { photoPointKey } from '../field/field-service';
import { loadReadingGroups, loadReadingsById } from './compliance-repository';
import type { JudgeReading } from './judge-zones';
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

/** A zone's points from its members and their readings (in time order). */
function zonePointsPart(members: ZoneMembers, pointReadings: readonly JudgeReading[]): ZonePointsPart {
  const wallBand = new Set(members.wallBandReadingIds);
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
}

const memberIds = (m: ZoneMembers) => m.readingIds.concat(m.wallBandReadingIds, m.otherPlaneReadingIds);

function buildZonePoints(db: Db, input: ZonePointsInput): ZonePointsPart | null {
  if ('members' in input) return db.$client.transaction(() => zonePointsPart(input.members, loadReadingsById(db, input.surveyId, memberIds(input.members)))).deferred();
  // One snapshot: the aggregate still there, and its readings as they were judged.
  const built = db.$client.transaction(() => {
    if (!aggregateExists(db, input.aggregateId)) return null;
    const members = aggregateZoneMembers(db, input.aggregateId, input.zoneId);
    return zonePointsPart(members, loadReadingsById(db, input.surveyId, memberIds(members)));
  }).deferred();
  if (built) storeParts(db, input.aggregateId, [{ part: zonePart(input.zoneId), packed: built.points, extra: built.labels }]);
  return built;
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
  const built = mapReadingsPart(db, input);
  if (built) storeParts(db, input.aggregateId, [{ part: mapPart(input.planId), packed: built.readings, extra: JSON.stringify(built.probes) }], { replace: true });
  return built;
}

function mapReadingsPart(db: Db, input: MapReadingsInput): MapReadingsPart | null {
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

/**
 * Every zone's points and every plan's map readings of one aggregate, built in one pass over its
 * readings and kept beside it: run after the verdicts are computed ahead (warm-verdicts.ts), so the
 * first people to open the zones find them built, where 40 zones built one by one on request queued
 * behind each other for seconds. Parts already kept are left as they are. Answers how many it built.
 */
function buildAllParts(db: Db, input: { surveyId: number; aggregateId: number }): number {
  const built = db.$client.transaction(() => {
    if (!aggregateExists(db, input.aggregateId)) return [];
    const have = new Set(keptPartNames(db, input.aggregateId));
    const zoneIds = aggregateZoneIds(db, input.aggregateId).filter((id) => !have.has(zonePart(id)));
    const members = zoneIds.map((zoneId) => aggregateZoneMembers(db, input.aggregateId, zoneId));
    const groups = loadReadingGroups(db, input.surveyId, members.map(memberIds));
    const parts: StoredPart[] = zoneIds.map((zoneId, i) => {
      const part = zonePointsPart(members[i], groups[i]);
      // Each zone's readings let go once packed: the heap holds less than every reading plus every part.
      groups[i] = [];
      return { part: zonePart(zoneId), packed: part.points, extra: part.labels };
    });
    for (const planId of aggregatePlanIds(db, input.aggregateId)) {
      if (have.has(mapPart(planId))) continue;
      const map = mapReadingsPart(db, { surveyId: input.surveyId, aggregateId: input.aggregateId, planId });
      if (map) parts.push({ part: mapPart(planId), packed: map.readings, extra: JSON.stringify(map.probes) });
    }
    return parts;
  }).deferred();
  return storeParts(db, input.aggregateId, built);
}

/** Declared in server/modules.ts (compliance): holds a whole survey's readings, so it runs with the judging. */
export const allPartsTask = computeTask('answer-parts', buildAllParts, { wholeSurvey: true });

const zonePart = (zoneId: number) => `zone:${zoneId}`;
const mapPart = (planId: number) => `map:${planId}`;

type StoredPart = { part: string; packed: PackedField<string, unknown>; extra: string };

function aggregateExists(db: Db, aggregateId: number): boolean {
  return partQueries(db).aggregate.get({ aggregate: aggregateId }) !== undefined;
}

function aggregateZoneIds(db: Db, aggregateId: number): number[] {
  return db.select({ zoneId: verdictAggregateZones.zoneId }).from(verdictAggregateZones).where(eq(verdictAggregateZones.aggregateId, aggregateId)).orderBy(asc(verdictAggregateZones.zoneId)).all().map((r) => r.zoneId);
}

function aggregatePlanIds(db: Db, aggregateId: number): number[] {
  const summary = db.select({ summary: verdictAggregates.summary }).from(verdictAggregates).where(eq(verdictAggregates.id, aggregateId)).get()?.summary as AggregateSummary | undefined;
  return summary?.map.plans.map((p) => p.planId) ?? [];
}

function keptPartNames(db: Db, aggregateId: number): string[] {
  return db.select({ part: verdictAnswerParts.part }).from(verdictAnswerParts).where(eq(verdictAnswerParts.aggregateId, aggregateId)).all().map((r) => r.part);
}

/**
 * Keeps parts beside their aggregate, if it is still there (one that was replaced meanwhile is
 * gone, and so are its parts). A kept part stays unless `replace` (a map part whose probe serials
 * changed). Answers how many were written.
 */
function storeParts(db: Db, aggregateId: number, parts: StoredPart[], options: { replace?: boolean } = {}): number {
  if (parts.length === 0) return 0;
  const q = partQueries(db);
  return db.$client.transaction(() => {
    if (!aggregateExists(db, aggregateId)) return 0;
    let written = 0;
    for (const p of parts) {
      const row = { aggregate: aggregateId, part: p.part, deflated: Buffer.from(p.packed.deflated.buffer, p.packed.deflated.byteOffset, p.packed.deflated.byteLength), crc: p.packed.crc, length: p.packed.length, extra: p.extra };
      written += (options.replace ? q.replace : q.insert).run(row).changes;
    }
    return written;
  }).immediate();
}

/** A kept zone part, or undefined. Read on every zone request: from the process's cache, else one prepared statement. */
export function keptZonePoints(db: Db, aggregateId: number, zoneId: number): ZonePointsPart | undefined {
  return keptPart(db, aggregateId, zonePart(zoneId), (row) => ({ points: packedOf('points', row), labels: row.extra }));
}

/** A kept map part, or undefined. */
export function keptMapReadings(db: Db, aggregateId: number, planId: number): MapReadingsPart | undefined {
  return keptPart(db, aggregateId, mapPart(planId), (row) => ({ readings: packedOf('readings', row), probes: JSON.parse(row.extra) as [number, string][] }));
}

/** Keeps in the process a zone part a compute thread just built (and stored). */
export function rememberZonePoints(db: Db, aggregateId: number, zoneId: number, part: ZonePointsPart): void {
  keepInProcess(db, aggregateId, zonePart(zoneId), part, part.points, part.labels);
}

/** Keeps in the process a map part a compute thread just built (and stored). */
export function rememberMapReadings(db: Db, aggregateId: number, planId: number, part: MapReadingsPart): void {
  keepInProcess(db, aggregateId, mapPart(planId), part, part.readings, JSON.stringify(part.probes));
}

/**
 * Parts are also kept in the process (answer-cache.ts, beside the summaries): a zone request
 * would otherwise read its part's bytes (about 225 KB for 12,500 points) from SQLite into a new
 * Buffer each time, and at 50 clients that churn held tens of MB of dead Buffers between collections.
 */
const PART_KEY = 'part';
type PartRow = { deflated: Buffer; crc: number; length: number; extra: string };
function keptPart<T>(db: Db, aggregateId: number, part: string, from: (row: PartRow) => T): T | undefined {
  const cache = answerCache(db);
  const kept = cache.get<T>(aggregateId, PART_KEY, part);
  if (kept) return kept;
  const row = partQueries(db).part.get({ aggregate: aggregateId, part });
  if (!row) return undefined;
  const value = from(row);
  keepInProcess(db, aggregateId, part, value, row, row.extra);
  return value;
}

/** Counted as its stored bytes: the deflated part and its extra text. */
function keepInProcess(db: Db, aggregateId: number, part: string, value: unknown, packed: { deflated: Uint8Array }, extra: string): void {
  answerCache(db).set(aggregateId, PART_KEY, part, value, packed.deflated.byteLength + extra.length);
}

function packedOf<K extends string, V>(field: K, row: { deflated: Buffer; crc: number; length: number }): PackedField<K, V> {
  return { field, deflated: row.deflated, crc: row.crc >>> 0, length: row.length };
}

const partQueries = oncePerConnection((db) => {
  const aggregate = sql.placeholder('aggregate');
  const part = sql.placeholder('part');
  const values = { aggregateId: aggregate, part, deflated: sql.placeholder('deflated'), crc: sql.placeholder('crc'), length: sql.placeholder('length'), extra: sql.placeholder('extra') };
  return {
    aggregate: db.select({ id: verdictAggregates.id }).from(verdictAggregates).where(eq(verdictAggregates.id, aggregate)).prepare(),
    part: db.select({ deflated: verdictAnswerParts.deflated, crc: verdictAnswerParts.crc, length: verdictAnswerParts.length, extra: verdictAnswerParts.extra })
      .from(verdictAnswerParts).where(and(eq(verdictAnswerParts.aggregateId, aggregate), eq(verdictAnswerParts.part, part))).prepare(),
    insert: db.insert(verdictAnswerParts).values(values as never).onConflictDoNothing().prepare(),
    replace: db.insert(verdictAnswerParts).values(values as never).onConflictDoUpdate({
      target: [verdictAnswerParts.aggregateId, verdictAnswerParts.part],
      set: { deflated: sql`excluded.deflated`, crc: sql`excluded.crc`, length: sql`excluded.length`, extra: sql`excluded.extra` },
    }).prepare(),
  };
});
