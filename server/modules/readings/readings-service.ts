import type { Response } from 'express';
import { and, asc, desc, eq, sql, type SQL } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { readings, surveys } from '../../db/schema/surveys';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { plans } from '../../db/schema/plans';
import type { SessionUser } from '@shared/schemas/auth';
import type { Reading, ReadingSeries, ReadingsResponse } from '@shared/schemas/readings';
import { readingsQuerySchema, type ReadingsQuery } from '@shared/schemas/readings';
import { toSafeCsvRows } from '@shared/csv-safe';
import { readingCells, readingColumns, type ExportReading } from '@shared/export-columns';
import { currentReadingConditions, getSurveyRow } from '../surveys/surveys-service';
import { decodeBudget } from './stored-budget';
import { currentReadingCount } from '../surveys/reading-counts';

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

/** The survey's current readings, filtered by flag and point, sorted, one page at a time. */
export function listReadings(db: Deps['db'], user: SessionUser, surveyId: number, query: ReadingsQuery): ReadingsResponse {
  const q = readingsQuerySchema.parse(query);
  const survey = getSurveyRow(db, user, surveyId);
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  const where = and(...filters(survey, q));
  // Unfiltered, the total is the kept count (reading-counts.ts) rather than a count over every reading.
  const total = !q.flag && !q.point
    ? db.select({ n: currentReadingCount }).from(surveys).where(eq(surveys.id, survey.id)).get()!.n
    : db.select({ n: sql<number>`count(*)` }).from(readings).where(where).get()!.n;
  const dir = q.order === 'desc' ? desc : asc;
  const rows = db.select(columns).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).where(where)
    .orderBy(dir(SORT_COLUMN[q.sort]), dir(readings.timeMs), asc(readings.id)).limit(q.limit).offset(q.offset).all();
  return { items: rows.map(present), total };
}

export const SERIES_MAX_POINTS = 4000;

/** The walk over time for the chart; beyond SERIES_MAX_POINTS every n-th reading, and every flagged one. */
export function readingSeries(db: Deps['db'], user: SessionUser, surveyId: number): ReadingSeries {
  const survey = getSurveyRow(db, user, surveyId);
  if (survey.activeDecodeId === null) return { items: [], total: 0 };
  const where = currentReadingConditions(survey);
  const total = db.select({ n: sql<number>`count(*)` }).from(readings).where(and(...where)).get()!.n;
  const stride = Math.max(1, Math.ceil(total / SERIES_MAX_POINTS));
  if (stride > 1) where.push(sql`(${readings.id} % ${stride} = 0 or ${readings.flag} <> 'ok')`);
  const rows = db.select({ t: readings.timeMs, lux: readings.lux, gainCode: readings.gainCode, flag: readings.flag, role: readings.role, point: readings.point })
    .from(readings).where(and(...where)).orderBy(asc(readings.timeMs), asc(readings.id)).all();
  return { items: rows, total };
}

const EXPORT_PAGE = 5000;

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
    let after = { t: Number.MIN_SAFE_INTEGER, id: 0 };
    for (;;) {
      const where = [...currentReadingConditions(survey), sql`(${readings.timeMs} > ${after.t} or (${readings.timeMs} = ${after.t} and ${readings.id} > ${after.id}))`];
      const rows = db.select(exportColumns).from(readings).innerJoin(probes, eq(probes.id, readings.probeId)).leftJoin(plans, eq(plans.id, readings.planId))
        .leftJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
        .where(and(...where)).orderBy(asc(readings.timeMs), asc(readings.id)).limit(EXPORT_PAGE).all();
      if (rows.length === 0) break;
      const chunk = toSafeCsvRows(rows.map((r) => readingCells(r, u)));
      if (!res.write(`${chunk}\r\n`)) await new Promise((r) => res.once('drain', r));
      const last = rows[rows.length - 1];
      after = { t: last.timeMs, id: last.id };
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
