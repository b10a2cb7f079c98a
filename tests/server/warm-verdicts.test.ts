import { describe, it, expect } from 'vitest';
import { eq } from 'drizzle-orm';
import { jobs } from '@server/db/schema/jobs';
import { verdictAggregates, verdictAnswerParts } from '@server/db/schema/aggregates';
import type { AggregateSummary } from '@server/modules/compliance/verdict-aggregates';
import { surveys } from '@server/db/schema/surveys';
import { verdictInputs } from '@server/modules/compliance/verdict-aggregates';
import { answerCache } from '@server/modules/compliance/answer-cache';
import { WARM_VERDICTS_JOB } from '@server/modules/compliance/warm-verdicts';
import { IMPORT_THREADS_IDLE_MS } from '@server/modules/imports/import-runner';
import { DEMO_START } from './helpers';
import { appWithTestProbes, newDraftSurvey, testWalkCsv, uploadAndWait } from './support/factories';

// Judging a large survey takes seconds, so an accepted import queues its verdicts (in the same
// transaction) and the job runner computes them before anyone asks: the first reader finds them kept.
describe('verdicts computed ahead after an import', () => {
  it('an accepted import queues the job; running it keeps the aggregate the verdicts page then reads', async () => {
    const { t, c } = await appWithTestProbes();
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, testWalkCsv(DEMO_START));
    expect(status.status).toBe('done');
    const ofSurvey = () => t.db.select().from(jobs).where(eq(jobs.name, WARM_VERDICTS_JOB)).all().filter((j) => (j.data as { surveyId: number }).surveyId === surveyId);
    expect(ofSurvey().map((j) => j.data)).toEqual([{ surveyId }]);
    expect(t.db.select().from(verdictAggregates).where(eq(verdictAggregates.surveyId, surveyId)).all()).toEqual([]);

    // It waits for the import threads to end (IMPORT_THREADS_IDLE_MS), then runs.
    await t.deliverMail();
    expect(ofSurvey().map((j) => j.status)).toEqual(['queued']);
    t.clock.advance(IMPORT_THREADS_IDLE_MS + 1_000);
    await t.deliverMail();
    const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
    const kept = t.db.select().from(verdictAggregates).where(eq(verdictAggregates.surveyId, surveyId)).all();
    expect(kept.map((a) => a.inputsKey)).toEqual([verdictInputs(t.db, survey).key]);
    expect(ofSurvey().map((j) => j.status)).toEqual(['done']);

    // The verdicts page reads the kept aggregate: no second one is computed.
    const res = await c.get(`/api/surveys/${surveyId}/compliance`);
    expect(res.status).toBe(200);
    expect(t.db.select().from(verdictAggregates).where(eq(verdictAggregates.surveyId, surveyId)).all().map((a) => a.id)).toEqual(kept.map((a) => a.id));

    // Every judged zone's points and every plan's map readings were built beside it in the same job,
    // and each answer from them equals one built on request with nothing kept.
    const summary = kept[0].summary as AggregateSummary;
    const expected = [...summary.zones.map((z) => `zone:${z.zoneId}`), ...summary.map.plans.map((p) => `map:${p.planId}`)].sort();
    expect(summary.zones.length).toBeGreaterThan(0);
    const parts = () => t.db.select({ part: verdictAnswerParts.part }).from(verdictAnswerParts).where(eq(verdictAnswerParts.aggregateId, kept[0].id)).all().map((p) => p.part).sort();
    expect(parts()).toEqual(expected);
    const urls = [...summary.zones.map((z) => `/api/surveys/${surveyId}/zones/${z.zoneId}/compliance`), ...summary.map.plans.map((p) => `/api/surveys/${surveyId}/map?planId=${p.planId}`)];
    const fromKept = await Promise.all(urls.map((u) => c.get(u)));
    expect(fromKept.some((r) => (r.body as { points?: unknown[] }).points?.length)).toBe(true);
    // Nothing kept, in the database or in the process: each answer is built again on request.
    t.db.delete(verdictAnswerParts).run();
    answerCache(t.db).clear();
    for (const [i, u] of urls.entries()) {
      expect(fromKept[i].status).toBe(200);
      expect((await c.get(u)).body).toEqual(fromKept[i].body);
    }
    expect(parts()).toEqual(expected);
  });

  it('a rejected import queues nothing', async () => {
    const { t, c } = await appWithTestProbes();
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, 'not,a,log\n1,2,3\n');
    expect(status?.status ?? 'refused').not.toBe('done');
    expect(t.db.select().from(jobs).where(eq(jobs.name, WARM_VERDICTS_JOB)).all().filter((j) => (j.data as { surveyId: number }).surveyId === surveyId)).toEqual([]);
  });
});
