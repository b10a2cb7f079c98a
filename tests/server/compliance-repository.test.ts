import { and, asc, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { readings, surveys } from '../../server/db/schema/surveys';
import { loadCurrentReadings, loadReadingPointGroups, loadReadingsById, loadReportPointGroups } from '../../server/modules/compliance/compliance-repository';
import { toCoreReading } from '../../server/modules/compliance/judge-zones';
import { decodeBudget } from '../../server/modules/readings/stored-budget';
import { currentReadingConditions } from '../../server/modules/surveys/surveys-service';
import { combineBudget } from '@shared/core/uncertainty';
import { appWithTestProbes, newDraftSurvey, testWalkCsv, uploadAndWait } from './support/factories';

describe('reading loaders of the verdicts and the report', () => {
  it('loadCurrentReadings and loadReadingsById, of an imported walk, give each current reading with every column as stored (budget parsed), one shared budget per stored text', async () => {
    const { t, c } = await appWithTestProbes();
    const surveyId = await newDraftSurvey(t, c);
    expect((await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-21T09:00:00Z'), 3))).status.status).toBe('done');
    const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
    const loaded = loadCurrentReadings(t.db, survey);
    // The plain drizzle select these readings replace (every row mapped, the budget parsed by its JSON column).
    const plain = t.db.select({
      id: readings.id, point: readings.point, xM: readings.xM, yM: readings.yM, planId: readings.planId, role: readings.role, timeMs: readings.timeMs, probeId: readings.probeId,
      lux: readings.lux, uLux: readings.uLux, luxBound: readings.luxBound, flag: readings.flag, budget: readings.budget, coefficientSetId: readings.coefficientSetId,
      plane: readings.plane, azimuthDeg: readings.azimuthDeg, excludedReason: readings.excludedReason, note: readings.note,
    }).from(readings).where(and(...currentReadingConditions(survey))).orderBy(asc(readings.timeMs), asc(readings.id)).all();
    expect(loaded.length).toBeGreaterThan(20);
    expect(loaded).toEqual(plain);
    // By id (a zone's detail, frozen sign-offs): the same readings, in time order whatever the ids' order.
    const some = plain.filter((_, i) => i % 3 === 0);
    expect(loadReadingsById(t.db, surveyId, some.map((r) => r.id).reverse())).toEqual(some);
    // Readings with the same stored budget share one object, and judging reads it as the budget's own parts.
    const stored = t.db.select({ id: readings.id, budget: readings.budget }).from(readings).where(eq(readings.surveyId, surveyId)).all();
    const textOf = new Map(stored.map((r) => [r.id, JSON.stringify(r.budget)]));
    const byText = new Map<string, unknown>();
    for (const r of loaded) {
      const seen = byText.get(textOf.get(r.id)!);
      if (seen === undefined) byText.set(textOf.get(r.id)!, r.budget);
      else expect(r.budget).toBe(seen);
    }
    expect(byText.size).toBeLessThan(loaded.length);
    for (const r of loaded.slice(0, 20)) {
      const core = toCoreReading(r);
      if (decodeBudget(r.budget).length > 0) expect(core.budget).toEqual(decodeBudget(r.budget));
      expect(core.uRel).toBeCloseTo(combineBudget(core.budget), 12);
    }
    // The report's points, for groups of ids (as the zones' readings and wall bands): the same readings' place, value, time, role and note, each group in time order.
    const point = (r: (typeof loaded)[number]) => ({ id: r.id, point: r.point, xM: r.xM, yM: r.yM, role: r.role, timeMs: r.timeMs, lux: r.lux, luxBound: r.luxBound, note: r.note });
    const odd = loaded.filter((_, i) => i % 2 === 1);
    const fewLate = loaded.slice(-3);
    const groups = [odd.map((r) => r.id).reverse(), [], fewLate.map((r) => r.id), [loaded[0].id]];
    expect(loadReadingPointGroups(t.db, surveyId, groups)).toEqual([odd.map(point), [], fewLate.map(point), [point(loaded[0])]]);
    expect(loadReadingPointGroups(t.db, surveyId, [[], []])).toEqual([[], []]);
    // Another survey's reading ids give nothing.
    expect(loadReadingPointGroups(t.db, surveyId + 1, [loaded.map((r) => r.id)])).toEqual([[]]);
    // A group kept as columns (a zone drawn as merged dots) holds the same places and values, in id order, and its latest time.
    const [asPoints, asColumns] = loadReportPointGroups(t.db, surveyId, [fewLate.map((r) => r.id), odd.map((r) => r.id)], (g) => g === 0);
    expect(asPoints).toEqual({ points: fewLate.map(point), columns: null });
    const byId = [...odd].sort((a, b) => a.id - b.id);
    const nan = (v: number | null) => v ?? Number.NaN;
    expect(asColumns.points).toBeNull();
    expect(asColumns.columns!.count).toBe(odd.length);
    expect(Array.from(asColumns.columns!.xM)).toEqual(byId.map((r) => nan(r.xM)));
    expect(Array.from(asColumns.columns!.yM)).toEqual(byId.map((r) => nan(r.yM)));
    expect(Array.from(asColumns.columns!.lux)).toEqual(byId.map((r) => nan(r.lux)));
    expect(asColumns.columns!.latestMs).toBe(odd.reduce((latest, r) => (r.timeMs > latest ? r.timeMs : latest), -Infinity));
  });
});
