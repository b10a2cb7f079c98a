// Placing a label-free log by time, on the server: after an import, each of its bursts without a
// place goes to the "measured here now" mark nearest in time (shared/core/mark-matching.ts). A
// placed burst gets a kept placement (reading_placements), so every later decode places it again.
import { and, eq, inArray, isNull, or } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { logImports, readings } from '../../db/schema/surveys';
import { probes } from '../../db/schema/calibration';
import { readingPlacements } from '../../db/schema/grids';
import { fieldRecords, markMatchings } from '../../db/schema/field';
import { matchBurstsToMarks } from '@shared/core/mark-matching';
import type { MarkMatchingResult } from '@shared/schemas/imports';
import { recordAudit } from '../audit/audit-service';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export type MarkMatchingOptions = { windowMs: number; clockOffsetMs: number };

const iso = (ms: number) => new Date(ms).toISOString();
const seconds = (ms: number) => `${ms >= 0 ? '+' : '−'}${(Math.abs(ms) / 1000).toFixed(1)} s`;

/** Marks an earlier import of the survey already placed a burst on: they take no second one. */
function marksAlreadyTaken(tx: Tx, surveyId: number, importId: number): Set<number> {
  const earlier = tx.select({ result: markMatchings.result }).from(markMatchings).innerJoin(logImports, eq(logImports.id, markMatchings.importId))
    .where(and(eq(logImports.surveyId, surveyId), eq(logImports.status, 'done'))).all();
  const taken = new Set<number>();
  for (const e of earlier) for (const m of (e.result as MarkMatchingResult).matched) if (m.importId !== importId) taken.add(m.markId);
  return taken;
}

/**
 * Runs in the import's finishing transaction. Bursts: this import's task readings without a place
 * (no position, or a position on no plan). Marks: the survey's "measured here now" records with a
 * place (a planned point or a plan position) that no earlier import took. Returns null when the
 * survey has no such marks (nothing is stored then).
 */
export function placeBurstsOnMarks(tx: Tx, job: { surveyId: number; importId: number; decodeId: number; organizationId: number; actorId: number | null }, options: MarkMatchingOptions, now: number): MarkMatchingResult | null {
  const taken = marksAlreadyTaken(tx, job.surveyId, job.importId);
  const marks = tx.select().from(fieldRecords).where(and(eq(fieldRecords.surveyId, job.surveyId), eq(fieldRecords.kind, 'mark'))).all()
    .filter((m) => m.planId !== null && m.xM !== null && m.yM !== null && !taken.has(m.id));
  if (marks.length === 0) return null;
  const bursts = tx.select().from(readings)
    .where(and(eq(readings.importId, job.importId), eq(readings.decodeId, job.decodeId), eq(readings.role, 'task'), or(isNull(readings.xM), isNull(readings.planId)))).all();
  const probeIds = [...new Set([...bursts.map((b) => b.probeId), ...marks.flatMap((m) => (m.probeId === null ? [] : [m.probeId]))])];
  const serials = new Map(probeIds.length ? tx.select({ id: probes.id, serial: probes.serial }).from(probes).where(inArray(probes.id, probeIds)).all().map((p) => [p.id, p.serial]) : []);
  const serial = (id: number | null) => (id === null ? null : serials.get(id) ?? String(id));

  const m = matchBurstsToMarks(
    bursts.map((b) => ({ id: b.id, timeMs: b.timeMs, probe: String(b.probeId) })),
    marks.map((k) => ({ id: k.id, timeMs: k.timeMs, probe: k.probeId === null ? null : String(k.probeId) })),
    options,
  );
  const burstById = new Map(bursts.map((b) => [b.id, b]));
  const markById = new Map(marks.map((k) => [k.id, k]));

  for (const hit of m.matched) {
    const b = burstById.get(hit.burstId)!;
    const k = markById.get(hit.markId)!;
    const reason = `Placed by time on mark "${k.point}" (${iso(k.timeMs)}): burst ${seconds(hit.deltaMs)} from it, window ±${options.windowMs / 1000} s, clock offset ${seconds(options.clockOffsetMs)}`;
    const key = and(eq(readingPlacements.surveyId, job.surveyId), eq(readingPlacements.point, b.point), eq(readingPlacements.probeId, b.probeId), eq(readingPlacements.timeMs, b.timeMs));
    const values = { state: 'placed' as const, planId: k.planId, xM: k.xM, yM: k.yM, plannedPointId: k.plannedPointId, placeReason: reason, updatedBy: job.actorId, updatedAt: now };
    const existing = tx.select({ id: readingPlacements.id }).from(readingPlacements).where(key).get();
    if (existing) tx.update(readingPlacements).set(values).where(eq(readingPlacements.id, existing.id)).run();
    else tx.insert(readingPlacements).values({ surveyId: job.surveyId, point: b.point, probeId: b.probeId, timeMs: b.timeMs, excludedReason: null, ...values }).run();
    tx.update(readings).set({ planId: k.planId, xM: k.xM, yM: k.yM }).where(eq(readings.id, b.id)).run();
  }

  const result: MarkMatchingResult = {
    windowS: options.windowMs / 1000,
    clockOffsetS: options.clockOffsetMs / 1000,
    matched: m.matched.map((h) => {
      const b = burstById.get(h.burstId)!;
      const k = markById.get(h.markId)!;
      return { importId: job.importId, readingId: b.id, markId: k.id, point: k.point, probe: serial(b.probeId)!, burstAt: iso(b.timeMs), markAt: iso(k.timeMs), deltaS: h.deltaMs / 1000, lux: b.lux };
    }),
    unplaced: m.unplaced.map((u) => {
      const b = burstById.get(u.burstId)!;
      return { readingId: b.id, probe: serial(b.probeId)!, burstAt: iso(b.timeMs), lux: b.lux, reason: u.reason, message: u.message, markPoints: u.markIds.map((id) => markById.get(id)!.point) };
    }),
    marksWithoutBurst: m.marksWithoutBurst.map((id) => {
      const k = markById.get(id)!;
      return { markId: k.id, point: k.point, probe: serial(k.probeId), markAt: iso(k.timeMs) };
    }),
  };
  tx.insert(markMatchings).values({ importId: job.importId, windowMs: options.windowMs, clockOffsetMs: options.clockOffsetMs, result, createdAt: now }).run();
  recordAudit(tx, {
    organizationId: job.organizationId, actorId: job.actorId, entityType: 'log_import', entityId: job.importId, surveyId: job.surveyId, action: 'placed_by_time',
    after: { windowS: result.windowS, clockOffsetS: result.clockOffsetS, placed: result.matched.length, unplaced: result.unplaced.length, marksWithoutBurst: result.marksWithoutBurst.length }, at: now,
  });
  return result;
}

/** The stored outcome of an import's placing by time, or null when it had none. */
export function markMatchingOf(db: Db, importId: number): MarkMatchingResult | null {
  const row = db.select({ result: markMatchings.result }).from(markMatchings).where(eq(markMatchings.importId, importId)).get();
  return row ? (row.result as MarkMatchingResult) : null;
}
