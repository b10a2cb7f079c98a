import type { Response } from 'express';
import { and, asc, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { computeTask, INLINE_READINGS, runComputeBySize } from '../../compute/compute-pool';
import { readings } from '../../db/schema/surveys';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { plans } from '../../db/schema/plans';
import type { SessionUser } from '@shared/schemas/auth';
import type { Reading, ReadingSeries, ReadingsResponse } from '@shared/schemas/readings';
import { readingsQuerySchema, type ReadingsQuery } from '@shared/schemas/readings';
import { toSafeCsvRows } from '@shared/csv-safe';
import { readingCells, readingColumns, type ExportReading } from '@shared/export-columns';
import { currentReadingConditions, getSurveyRow } from '../surveys/surveys-service';
import { decodeBudget } from './stored-budget';
import { keptReadingTotal } from '../surveys/reading-counts';
import { pageMark } from './reading-page-marks';

const columns = {
  id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, planId: readings.planId, role: readings.role, timeMs: readings.timeMs, probe: probes.serial,
  lux: readings.lux, uLux: readings.uLux, luxBound: readings.luxBound, flag: readings.flag, gainCode: readings.gainCode,
  samples: readings.sampleCount, chosenSample: readings.chosenSample, budget: readings.budget, note: readings.note,
  plane: readings.plane, azimuthDeg: readings.azimuthDeg,
  rawCounts: readings.rawCounts, rawSignal: readings.rawSignal, intMs: readings.intMs, tempC: readings.tempC, coefficientSetId: readings.coefficientSetId,
};
type Row = {
  id: number; point: string; xM: number | null; yM: number | null; planId: number | null; role: Reading['role']; timeMs: number; probe: string; lux: number | null; uLux: number | null;
  luxBound: Reading['luxBound']; flag: Reading['flag']; gainCode: number | null; samples: number; chosenSample: number | null; budget: unknown; note: string | null;
  plane: Reading['plane']; azimuthDeg: number | null;
  rawCounts: number | null; rawSignal: number | null; intMs: number | null; tempC: number | null; coefficientSetId: number | null;
};

function present(r: Row): Reading {
  return {
    id: r.id, point: r.point, xM: r.xM, yM: r.yM, planId: r.planId, role: r.role, timestamp: new Date(r.timeMs).toISOString(), probe: r.probe,
    lux: r.lux, uLux: r.uLux, luxBound: r.luxBound, flag: r.flag, gainCode: r.gainCode, samples: r.samples, chosenSample: r.chosenSample,
    budget: decodeBudget(r.budget), plane: r.plane, azimuthDeg: r.azimuthDeg,
    rawCounts: r.rawCounts, rawSignal: r.rawSignal, intMs: r.intMs, tempC: r.tempC, coefficientSetId: r.coefficientSetId,
  };
}

const SORT_COLUMN = { time: readings.timeMs, point: readings.point, lux: readings.lux, flag: readings.flag, probe: probes.serial } as const;

function filters(survey: Parameters<typeof currentReadingConditions>[0], q: { flag?: string; point?: string }): SQL[] {
  const where = currentReadingConditions(survey);
  if (q.flag) where.push(eq(readings.flag, q.flag as Reading['flag']));
  if (q.point) where.push(sql`${readings.point} like ${`%${q.point.replace(/[\\%_]/g, (c) => `\\${c}`)}%`} escape '\\'`);
  return where;
}

/** The survey row a page is read for: enough to name its current readings. */
type PageSurvey = { id: number; activeDecodeId: number | null };
type PageQuery = z.output<typeof readingsQuerySchema>;

/**
 * One page by OFFSET (small surveys inline; on a compute thread for large ones, where skipping rows
 * costs), or by OFFSET from a page mark (`from`, with the total the caller already holds).
 */
function queryPage(db: Db, survey: PageSurvey, q: PageQuery, opts: { from?: SQL; total?: number } = {}): ReadingsResponse {
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  const where = and(...filters(survey, q));
  // Unfiltered, the total is the kept count (reading-counts.ts) rather than a count over every reading.
  const total = opts.total ?? (!q.flag && !q.point
    ? keptReadingTotal(db, survey.id)
    : db.select({ n: sql<number>`count(*)` }).from(readings).where(where).get()!.n);
  const dir = q.order === 'desc' ? desc : asc;
  const rows = db.select(columns).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).where(and(where, opts.from))
    .orderBy(dir(SORT_COLUMN[q.sort]), dir(readings.timeMs), asc(readings.id)).limit(q.limit).offset(q.offset).all();
  return { items: rows.map(present), total };
}

/** Declared in server/modules.ts (readings): a page of a large survey by OFFSET, off the request's thread. */
export const readingsPageTask = computeTask('readings-page', (db: Db, input: { survey: PageSurvey; query: PageQuery }) => queryPage(db, input.survey, input.query));

/**
 * The survey's current readings, filtered by flag and point, sorted, one page at a time. Small
 * surveys are read inline. In a large one, OFFSET would walk every reading before the page (60 ms
 * to half a second at 500,000 readings), so the time order, unfiltered, starts from the nearest
 * page mark (reading-page-marks.ts: one index seek and at most PAGE_MARK_STRIDE rows skipped), and
 * any other order or filter is read on a compute thread.
 */
export async function listReadings(db: Deps['db'], user: SessionUser, surveyId: number, query: ReadingsQuery, inlineUpTo = INLINE_READINGS): Promise<ReadingsResponse> {
  const q = readingsQuerySchema.parse(query);
  const row = getSurveyRow(db, user, surveyId);
  const survey: PageSurvey = { id: row.id, activeDecodeId: row.activeDecodeId };
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  const total = keptReadingTotal(db, survey.id);
  if (total > inlineUpTo && q.sort === 'time' && !q.flag && !q.point) {
    if (q.offset >= total) return { items: [], total };
    const mark = await pageMark(db, survey, q.order, q.offset);
    if (mark) return queryPage(db, survey, { ...q, offset: mark.skip }, { from: fromInTimeOrder(mark, q.order, 'at'), total });
  }
  return runComputeBySize(db, total, readingsPageTask, { survey, query: q }, inlineUpTo);
}

export const SERIES_MAX_POINTS = 4000;

/** The walk over time: every n-th current reading (n from the kept count), and every flagged one. */
function querySeries(db: Db, survey: PageSurvey): ReadingSeries {
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  const total = keptReadingTotal(db, survey.id);
  const where = currentReadingConditions(survey);
  const stride = Math.max(1, Math.ceil(total / SERIES_MAX_POINTS));
  if (stride > 1) where.push(sql`(${readings.id} % ${stride} = 0 or ${readings.flag} <> 'ok')`);
  const rows = db.select({ t: readings.timeMs, lux: readings.lux, gainCode: readings.gainCode, flag: readings.flag, role: readings.role, point: readings.point })
    .from(readings).where(and(...where)).orderBy(asc(readings.timeMs), asc(readings.id)).all();
  return { items: rows, total };
}

/** Declared in server/modules.ts (readings): a large survey's walk is thinned on a compute thread (it reads every reading). */
export const readingSeriesTask = computeTask('reading-series', (db: Db, survey: PageSurvey) => querySeries(db, survey));

/** The walk over time for the chart; beyond SERIES_MAX_POINTS every n-th reading, and every flagged one. */
export async function readingSeries(db: Deps['db'], user: SessionUser, surveyId: number, inlineUpTo = INLINE_READINGS): Promise<ReadingSeries> {
  const row = getSurveyRow(db, user, surveyId);
  const survey: PageSurvey = { id: row.id, activeDecodeId: row.activeDecodeId };
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  return runComputeBySize(db, keptReadingTotal(db, survey.id), readingSeriesTask, survey, inlineUpTo);
}

/**
 * Readings from a place (time, id) in the time order (ascending, or descending with ties by id):
 * at it and on, or only after it. Written as a range on time plus a tie rule, so SQLite seeks the
 * time index to the place (an OR of the two would scan the index from its start on every page).
 */
export function fromInTimeOrder(place: { timeMs: number; id: number }, order: 'asc' | 'desc', tie: 'at' | 'after'): SQL {
  const sameTime = tie === 'at' ? sql`${readings.id} >= ${place.id}` : sql`${readings.id} > ${place.id}`;
  return order === 'desc'
    ? sql`${readings.timeMs} <= ${place.timeMs} and (${readings.timeMs} < ${place.timeMs} or ${sameTime})`
    : sql`${readings.timeMs} >= ${place.timeMs} and (${readings.timeMs} > ${place.timeMs} or ${sameTime})`;
}

/** Rows per page of a streamed export: each page is one short stretch of the event loop. */
const EXPORT_PAGE = 1000;

/**
 * Streams the current readings as CSV in lux or foot-candles, in the export vocabulary of
 * shared/export-columns (full precision, the bound, the raw evidence). Text cells a spreadsheet
 * would run as a formula are neutralised (shared/csv-safe); numbers stay numbers.
 */
export async function exportReadingsCsv(db: Deps['db'], user: SessionUser, surveyId: number, unit: 'lux' | 'fc', res: Response) {
  const survey = getSurveyRow(db, user, surveyId);
  const u = unit === 'fc' ? 'fc' : 'lx';
  const safeName = survey.name.replace(/[^A-Za-z0-9 _-]+/g, '').trim().replace(/\s+/g, '-') || 'survey';
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${safeName}-readings-${u}.csv"`);
  res.write(`${toSafeCsvRows([readingColumns(u)])}\r\n`);
  if (survey.activeDecodeId !== null) {
    let after = { timeMs: Number.MIN_SAFE_INTEGER, id: 0 };
    for (;;) {
      const where = [...currentReadingConditions(survey), fromInTimeOrder(after, 'asc', 'after')];
      const rows = db.select(exportColumns).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).leftJoin(plans, eq(plans.id, readings.planId))
        .leftJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
        .where(and(...where)).orderBy(asc(readings.timeMs), asc(readings.id)).limit(EXPORT_PAGE).all();
      if (rows.length === 0) break;
      const chunk = toSafeCsvRows(rows.map((r) => readingCells(r, u)));
      if (!res.write(`${chunk}\r\n`)) await new Promise((r) => res.once('drain', r));
      const last = rows[rows.length - 1];
      after = { timeMs: last.timeMs, id: last.id };
    }
  }
  res.end();
}

/** The columns an export row needs (shared/export-columns' ExportReading), for any readings query joined with probes, plans and coefficient sets. */
export const exportColumns = {
  id: readings.id, timeMs: readings.timeMs, point: readings.point, planName: plans.name, xM: readings.xM, yM: readings.yM, role: readings.role,
  probe: probes.serial, probeKind: probes.kind, lux: readings.lux, uLux: readings.uLux, luxBound: readings.luxBound, flag: readings.flag, gainCode: readings.gainCode,
  rawCounts: readings.rawCounts, rawSignal: readings.rawSignal, intMs: readings.intMs, tempC: readings.tempC, coefficientSetId: readings.coefficientSetId,
  coefficientSetVersion: coefficientSets.version, samples: readings.sampleCount, chosenSample: readings.chosenSample, note: readings.note,
  plane: readings.plane, azimuthDeg: readings.azimuthDeg,
} satisfies Record<keyof ExportReading, unknown>;
