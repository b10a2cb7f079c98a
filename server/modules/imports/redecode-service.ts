import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { decodes, logImports, readings, surveys } from '../../db/schema/surveys';
import { coefficientSets } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import type { RedecodeResponse } from '@shared/schemas/readings';
import { conflict, unprocessable } from '../../http/errors';
import { loadDecodingCalibration } from '../probes/probe-calibration';
import { recordAudit } from '../audit/audit-service';
import { assertSurveyAbility, getSurveyRow } from '../surveys/surveys-service';
import { createLogDecoder, type SampleProblem } from './log-decoder';
import { surveysBeingRedecoded } from './imports-service';
import { pagesOfSamples } from './sample-blocks';
import { createBatchBuilder } from './batch-format';
import { createBatchWriter } from './batch-writer';
import { applyPlacements } from '../placements/placements-service';
import { carryFieldReadings } from '../field/field-service';
import { keepReadingCount } from '../surveys/reading-counts';
import { queueWarmVerdicts } from '../compliance/warm-verdicts';

/**
 * Re-decodes every kept sample of a survey's accepted imports with the approved coefficient sets
 * in force now, into a new decode that becomes active; the previous decode and its readings stay
 * recorded, and the audit trail names who did it. Runs in slices that yield to the event loop.
 */
export async function redecodeSurvey(deps: Deps, actor: SessionUser, surveyId: number, reason = 'redecode'): Promise<RedecodeResponse> {
  const survey = getSurveyRow(deps.db, actor, surveyId);
  // A signed-off survey is read-only: its readings, like its verdicts, stay as they were judged.
  assertSurveyAbility(actor, survey, 'redecode');
  const busy = deps.db.select({ id: logImports.id }).from(logImports).where(and(eq(logImports.surveyId, survey.id), inArray(logImports.status, ['queued', 'running']))).get();
  if (busy || surveysBeingRedecoded.has(survey.id)) throw conflict('A log of this survey is being imported or re-decoded; try again when it has finished');
  const imports = deps.db.select({ id: logImports.id }).from(logImports).where(and(eq(logImports.surveyId, survey.id), eq(logImports.status, 'done'))).orderBy(asc(logImports.id)).all();
  if (imports.length === 0) throw conflict('This survey has no accepted log to re-decode');

  surveysBeingRedecoded.add(survey.id);
  const decode = deps.db.insert(decodes).values({ surveyId: survey.id, reason, createdBy: actor.id, createdAt: deps.clock.now() }).returning().get();
  try {
    const calibration = loadDecodingCalibration(deps.db, actor.organizationId);
    const serialOf = new Map([...calibration.values()].map((c) => [c.probeId, c.serial]));
    let count = 0;
    const perImport = new Map<number, number>();
    const problems: SampleProblem[] = [];
    for (const imp of imports) {
      const before = count;
      // The import's own writer: the same readings insert the import used, under the new decode.
      const write = createBatchWriter(deps.db.$client, { importId: imp.id, surveyId: survey.id, decodeId: decode.id });
      const batch = createBatchBuilder();
      const flush = () => {
        count += batch.readingRows;
        const taken = batch.take();
        if (problems.length === 0 && taken.readingRows > 0) write(taken);
      };
      const decoder = createLogDecoder(calibration, (r) => batch.addReading(r), (p) => { if (problems.length < 200) problems.push(p); });
      for (const page of pagesOfSamples(deps.db, imp.id)) {
        for (const s of page) {
          decoder.push({
            line: s.line, timeMs: s.timeMs, probe: serialOf.get(s.probeId) ?? `#${s.probeId}`, point: s.point,
            gainCode: s.gainCode ?? undefined, counts: s.counts ?? undefined, ma: s.ma ?? undefined, volts: s.volts ?? undefined,
            intMs: s.intMs ?? undefined, tempC: s.tempC ?? undefined, xM: s.xM, yM: s.yM, planId: s.planId, role: s.role, note: s.note, plane: s.plane, azimuthDeg: s.azimuthDeg,
          });
        }
        flush();
        await yieldToEventLoop();
      }
      decoder.finish();
      flush();
      perImport.set(imp.id, count - before);
    }
    if (problems.length > 0) {
      throw unprocessable(`The current coefficient sets cannot decode this survey's samples (first: line ${problems[0].line}, ${problems[0].column}: ${problems[0].message}); nothing was changed`, problems);
    }
    const lapsed = deps.db.select({ n: sql<number>`count(*)` }).from(readings).innerJoin(coefficientSets, eq(coefficientSets.id, readings.coefficientSetId))
      .where(and(eq(readings.decodeId, decode.id), sql`${readings.timeMs} > ${coefficientSets.dueDate}`)).get()!.n;
    const now = deps.clock.now();
    deps.db.transaction((tx) => {
      carryFieldReadings(tx, survey.id, survey.activeDecodeId, decode.id);
      // Hand placements and exclusions are kept by point label, probe and time: the new decode's readings get them again.
      applyPlacements(tx, survey.id, decode.id);
      tx.update(surveys).set({ activeDecodeId: decode.id }).where(eq(surveys.id, survey.id)).run();
      for (const [importId, n] of perImport) keepReadingCount(tx, decode.id, importId, n);
      queueWarmVerdicts(tx, deps.jobs, survey.id);
      recordAudit(tx, {
        organizationId: actor.organizationId, actorId: actor.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'redecoded',
        before: { decodeId: survey.activeDecodeId }, after: { decodeId: decode.id, readings: count, calibrationLapsed: lapsed }, at: now,
      });
    });
    return { decodeId: decode.id, previousDecodeId: survey.activeDecodeId, readings: count, calibrationLapsed: lapsed };
  } catch (err) {
    const del = deps.db.$client.prepare('delete from readings where rowid in (select rowid from readings where decode_id = ? limit 5000)');
    while (del.run(decode.id).changes > 0) await yieldToEventLoop();
    deps.db.delete(decodes).where(eq(decodes.id, decode.id)).run();
    throw err;
  } finally {
    surveysBeingRedecoded.delete(survey.id);
  }
}
