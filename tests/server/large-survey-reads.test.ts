import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { logImports, surveys } from '@server/db/schema/surveys';
import { loadSessionUser } from '@server/modules/auth/auth-service';
import { keepReadingCount } from '@server/modules/surveys/reading-counts';
import { listReadings, readingSeries } from '@server/modules/readings/readings-service';
import { getSurvey } from '@server/modules/surveys/surveys-service';
import { listUnplaced } from '@server/modules/placements/placements-service';
import { keptPageMarks, PAGE_MARK_STRIDE, pageMark } from '@server/modules/readings/reading-page-marks';
import type { SessionUser } from '@shared/schemas/auth';
import { closeComputePools, runCompute } from '@server/compute/compute-pool';
import { verdictAnswerParts } from '@server/db/schema/aggregates';
import { keptMapReadings, keptZonePoints, mapReadingsTask, zonePointsTask } from '@server/modules/compliance/answer-parts';
import { currentAggregate } from '@server/modules/compliance/verdict-aggregates';
import { answerCache } from '@server/modules/compliance/answer-cache';
import { warmVerdicts } from '@server/modules/compliance/warm-verdicts';
import type { PackedField } from '@server/http/packed-json';
import type { Deps } from '@server/deps';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey, insertDecode, OFFICE_AND_CORRIDOR, officeAndCorridorReadings, userId } from './support/factories';

// What reads every reading of a large survey stays off the event loop, with the same answers.
// A large survey's readings pages start from page marks (a seek to every PAGE_MARK_STRIDE-th
// reading) instead of an OFFSET walk. The pages must be exactly those of the plain OFFSET query,
// in both time orders, with readings sharing a time (ties go by id), past the end, and once the
// set of current readings changes (an import accepted later).
const READINGS = 3 * PAGE_MARK_STRIDE + 37;
const OFFSETS = [0, 1, 99, PAGE_MARK_STRIDE - 1, PAGE_MARK_STRIDE, PAGE_MARK_STRIDE + 1, 2 * PAGE_MARK_STRIDE + 500, READINGS - 100, READINGS - 1, READINGS, READINGS + 5000];

// Run twice: on an in-memory database (tasks run inline) and on a file database, where the large
// path really hops to the piscina threads (their own connections, tasks found by name).
const fileDir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-large-reads-'));
afterAll(async () => {
  await closeComputePools();
  fs.rmSync(fileDir, { recursive: true, force: true });
});

describe.each([
  ['an in-memory database', ':memory:'],
  ['a file database (compute threads)', path.join(fileDir, 'luxtrail.db')],
])('on %s', (_label, databaseUrl) => {
  let t: TestApp;
  let user: SessionUser;
  let surveyId: number;
  let probeId: number;
  let decodeId: number;
  let laterImportId: number;

  beforeAll(async () => {
    t = await createTestApp({ databaseUrl });
    user = loadSessionUser(t.db, userId(t, DEMO.surveyor).id)!;
    const start = Date.parse('2026-11-10T08:00:00Z');
    // Three readings share each second: the order within a second is by id.
    const built = buildSurvey(t, {
      ownerEmail: DEMO.surveyor, surveyName: 'Paged walk', zones: [],
      readings: Array.from({ length: READINGS }, (_, i) => ({ x: null, y: null, lux: 100 + (i % 50), point: `Q${i}`, timeMs: start + Math.floor(i / 3) * 1000 })),
    });
    surveyId = built.surveyId;
    probeId = built.probeId;
    decodeId = built.decodeId;
    const first = t.db.select().from(logImports).where(eq(logImports.surveyId, surveyId)).get()!;
    keepReadingCount(t.db, decodeId, first.id, READINGS);
    // A further log in the same decode, interleaved in time, still running: its readings are not current yet.
    laterImportId = insertDecode(t, surveyId, Array.from({ length: 300 }, (_, i) => ({
      point: `L${i}`, xM: null, yM: null, planId: null, role: 'task' as const, timeMs: start + i * 7000 + 500, probeId, lux: 321, uLux: 10, luxBound: 'exact' as const,
      flag: 'ok' as const, gainCode: 0, sampleCount: 1, budget: [],
    })), { addLog: true }).importId;
    t.db.update(logImports).set({ status: 'running' }).where(eq(logImports.id, laterImportId)).run();
  });

  async function expectSamePages(total: number) {
    for (const order of ['asc', 'desc'] as const) {
      // The first page of the time order computes and keeps the marks (waiting for them).
      expect(keptPageMarks(t.db, { id: surveyId, activeDecodeId: decodeId }, order)).toBeNull();
      await listReadings(t.db, user, surveyId, { order }, 0);
      expect(keptPageMarks(t.db, { id: surveyId, activeDecodeId: decodeId }, order)?.length).toBe(2 * Math.ceil(total / PAGE_MARK_STRIDE));
      for (const offset of OFFSETS) {
        const byOffset = await listReadings(t.db, user, surveyId, { order, offset, limit: 100 }, Infinity);
        const byMark = await listReadings(t.db, user, surveyId, { order, offset, limit: 100 }, 0);
        expect(byMark.total).toBe(total);
        expect(byMark.items.map((r) => r.id), `${order} from ${offset}`).toEqual(byOffset.items.map((r) => r.id));
        expect(byMark.items).toEqual(byOffset.items);
        // Within the readings, a page never skips more than the stride from its mark.
        const mark = (await pageMark(t.db, { id: surveyId, activeDecodeId: decodeId }, order, offset))!;
        if (offset < total) expect(mark.skip).toBeLessThan(PAGE_MARK_STRIDE);
      }
    }
  }

  describe('readings pages of a large survey', () => {
    it('start from page marks and equal the OFFSET pages in both orders, past the end too', async () => {
      const first = await listReadings(t.db, user, surveyId, { offset: 0, limit: 5 }, Infinity);
      expect(first.items.map((r) => r.point)).toEqual(['Q0', 'Q1', 'Q2', 'Q3', 'Q4']);
      const last = await listReadings(t.db, user, surveyId, { order: 'desc', offset: 0, limit: 4 }, Infinity);
      // Descending time, ties by ascending id: the last second holds Q3108 alone, the one before Q3105..Q3107.
      expect(READINGS).toBe(3109);
      expect(last.items.map((r) => r.point)).toEqual(['Q3108', 'Q3105', 'Q3106', 'Q3107']);
      await expectSamePages(READINGS);
    });

    it('follow the current readings when a further log is accepted (the marks are computed again)', async () => {
      t.db.update(logImports).set({ status: 'done' }).where(eq(logImports.id, laterImportId)).run();
      keepReadingCount(t.db, decodeId, laterImportId, 300);
      // The kept marks name the earlier set of readings: no mark until they are computed again.
      expect(keptPageMarks(t.db, { id: surveyId, activeDecodeId: decodeId }, 'asc')).toBeNull();
      await expectSamePages(READINGS + 300);
      const page = await listReadings(t.db, user, surveyId, { offset: 0, limit: 8 }, 0);
      expect(page.items.some((r) => r.point.startsWith('L'))).toBe(true);
    });

    it('filtered or sorted by another column, its walk, counts and unplaced readings: a large survey is read on a compute thread with the same answer', async () => {
      const q = { sort: 'lux' as const, order: 'desc' as const, offset: 1500, limit: 50 };
      expect(await listReadings(t.db, user, surveyId, q, 0)).toEqual(await listReadings(t.db, user, surveyId, q, Infinity));
      const series = await readingSeries(t.db, user, surveyId, 0);
      expect(series).toEqual(await readingSeries(t.db, user, surveyId, Infinity));
      expect(series.total).toBe(READINGS + 300);
      const detail = await getSurvey(t.db, user, surveyId, 0);
      expect(detail).toEqual(await getSurvey(t.db, user, surveyId, Infinity));
      expect(detail.flagCounts).toEqual({ ok: READINGS + 300 });
      // Every reading here has no position: all are unplaced, grouped by label, at most 2,000 listed.
      const unplaced = await listUnplaced(t.db, user, surveyId, 0);
      expect(unplaced).toEqual(await listUnplaced(t.db, user, surveyId, Infinity));
      expect(unplaced.total).toBe(READINGS + 300);
      expect(unplaced.groups.reduce((n, g) => n + g.readings.length, 0)).toBe(2000);
    });
  });

  describe('answer parts of a survey with zones', () => {
    it('built all at once beside the aggregate (warm-verdicts) equal those built one by one on request', async () => {
      const zoned = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Zoned walk', status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
      const survey = t.db.select().from(surveys).where(eq(surveys.id, zoned.surveyId)).get()!;
      await warmVerdicts({ db: t.db } as Deps, { surveyId: zoned.surveyId });
      const aggregate = await currentAggregate(t.db, survey);
      const zoneIds = [zoned.zoneIds.office, zoned.zoneIds.corridor];
      const together = zoneIds.map((zoneId) => keptZonePoints(t.db, aggregate.id, zoneId));
      const map = keptMapReadings(t.db, aggregate.id, zoned.planId);
      expect(together.every((p) => p !== undefined) && map !== undefined).toBe(true);
      t.db.delete(verdictAnswerParts).where(eq(verdictAnswerParts.aggregateId, aggregate.id)).run();
      answerCache(t.db).clear();
      for (const [i, zoneId] of zoneIds.entries()) {
        const alone = (await runCompute(t.db, zonePointsTask, { surveyId: zoned.surveyId, aggregateId: aggregate.id, zoneId }))!;
        expect(inflated(together[i]!.points)).toBe(inflated(alone.points));
        expect(together[i]!.labels).toBe(alone.labels);
        // The one built on request is kept too (in the database: the process keeps only what it read or was handed).
        expect(inflated(keptZonePoints(t.db, aggregate.id, zoneId)!.points)).toBe(inflated(alone.points));
      }
      // 49 grid points and one in the wall band in the office (factories: officeAndCorridorReadings).
      expect((JSON.parse(`${inflated(together[0]!.points)}}`) as { points: unknown[] }).points).toHaveLength(50);
      const mapAlone = (await runCompute(t.db, mapReadingsTask, { surveyId: zoned.surveyId, aggregateId: aggregate.id, planId: zoned.planId }))!;
      expect(inflated(map!.readings)).toBe(inflated(mapAlone.readings));
      expect(map!.probes).toEqual(mapAlone.probes);
    });
  });
});

const inflated = (p: PackedField<string, unknown>) => zlib.inflateRawSync(p.deflated, { finishFlush: zlib.constants.Z_SYNC_FLUSH }).toString();
