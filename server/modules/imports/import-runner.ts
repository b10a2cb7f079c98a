import { Worker } from 'node:worker_threads';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { decodes, logImports, readings, surveys } from '../../db/schema/surveys';
import { loadDecodingCalibration } from '../probes/probe-calibration';
import { recordAudit } from '../audit/audit-service';
import { READING_WIDTH, SAMPLE_WIDTH, type ImportProblem, type ImportWarning, type WorkerToMain } from './log-parser';

export type ImportJob = {
  importId: number;
  surveyId: number;
  organizationId: number;
  actorId: number | null;
  filePath: string;
  fileSize: number;
  timeZone: string;
  /** The site's plans (a row's `plan` names one) and the plan for rows that name none. */
  plans: { id: number; name: string }[];
  defaultPlanId: number | null;
};

export type ImportOutcome = { importId: number; status: 'done' | 'failed'; readings: number; errors: ImportProblem[] };

type Queued = { deps: Deps; job: ImportJob; resolve: (o: ImportOutcome) => void };

const queue: Queued[] = [];
let running = false;
let worker: Worker | null = null;
/** Imports finishing, by id, so tests and the seed can wait for one. */
const pendingByDb = new WeakMap<Deps['db'], Map<number, Promise<ImportOutcome>>>();
function pendingOf(db: Deps['db']) {
  let m = pendingByDb.get(db);
  if (!m) pendingByDb.set(db, (m = new Map()));
  return m;
}

function getWorker(): Worker {
  if (worker) return worker;
  worker = new Worker(new URL('./import-worker-entry.mjs', import.meta.url));
  worker.on('exit', () => { worker = null; });
  worker.unref();
  return worker;
}

/** Queues an import; imports run one at a time, each in the import worker thread. */
export function enqueueImport(deps: Deps, job: ImportJob): Promise<ImportOutcome> {
  const done = new Promise<ImportOutcome>((resolve) => {
    queue.push({ deps, job, resolve });
  });
  const pending = pendingOf(deps.db);
  pending.set(job.importId, done);
  void done.finally(() => pending.delete(job.importId));
  void pump();
  return done;
}

/** The outcome of a queued or running import of this process, or null when it is not running here. */
export function importOutcome(deps: Deps, importId: number): Promise<ImportOutcome> | null {
  return pendingOf(deps.db).get(importId) ?? null;
}

async function pump() {
  if (running) return;
  const next = queue.shift();
  if (!next) return;
  running = true;
  let outcome: ImportOutcome;
  try {
    outcome = await runImport(next.deps, next.job);
  } catch (err) {
    outcome = await failImport(next.deps, next.job, null, [{ line: 0, column: '', value: '', message: `The import stopped unexpectedly: ${err instanceof Error ? err.message : String(err)}` }], [], 0);
  }
  running = false;
  next.resolve(outcome);
  void pump();
}

/** The decode new readings go under: the survey's active one, made on the first import. */
function ensureActiveDecode(deps: Deps, job: ImportJob): { decodeId: number; created: boolean } {
  return deps.db.transaction((tx) => {
    const survey = tx.select().from(surveys).where(eq(surveys.id, job.surveyId)).get()!;
    if (survey.activeDecodeId !== null) return { decodeId: survey.activeDecodeId, created: false };
    const d = tx.insert(decodes).values({ surveyId: job.surveyId, reason: 'import', createdBy: job.actorId, createdAt: deps.clock.now() }).returning().get();
    tx.update(surveys).set({ activeDecodeId: d.id }).where(eq(surveys.id, job.surveyId)).run();
    return { decodeId: d.id, created: true };
  });
}

const MULTI_ROWS = 64;

/** Prepared multi-row INSERTs for one import (ids are integers from the database, inlined). */
function batchWriter(deps: Deps, job: ImportJob, decodeId: number) {
  const client = deps.db.$client;
  const sampleRow = `(${job.importId},${job.surveyId},${Array(SAMPLE_WIDTH).fill('?').join(',')})`;
  const readingRow = `(${job.surveyId},${decodeId},${job.importId},${Array(READING_WIDTH).fill('?').join(',')})`;
  const sampleSql = 'insert into samples (import_id, survey_id, line, time_ms, probe_id, point, gain_code, counts, ma, volts, int_ms, temp_c, x_m, y_m, plan_id, role, note) values ';
  const readingSql = 'insert into readings (survey_id, decode_id, import_id, point, x_m, y_m, plan_id, role, time_ms, probe_id, lux, u_lux, lux_bound, flag, gain_code, sample_count, chosen_sample, coefficient_set_id, budget, note) values ';
  const stmts = {
    sampleMany: client.prepare(sampleSql + Array(MULTI_ROWS).fill(sampleRow).join(',')),
    sampleOne: client.prepare(sampleSql + sampleRow),
    readingMany: client.prepare(readingSql + Array(MULTI_ROWS).fill(readingRow).join(',')),
    readingOne: client.prepare(readingSql + readingRow),
  };
  const insert = (values: unknown[], width: number, many: typeof stmts.sampleMany, one: typeof stmts.sampleOne) => {
    const step = width * MULTI_ROWS;
    let i = 0;
    for (; i + step <= values.length; i += step) many.run(values.slice(i, i + step));
    for (; i < values.length; i += width) one.run(values.slice(i, i + width));
  };
  return client.transaction((samplesFlat: unknown[], readingsFlat: unknown[]) => {
    insert(samplesFlat, SAMPLE_WIDTH, stmts.sampleMany, stmts.sampleOne);
    insert(readingsFlat, READING_WIDTH, stmts.readingMany, stmts.readingOne);
  });
}

async function runImport(deps: Deps, job: ImportJob): Promise<ImportOutcome> {
  const { decodeId, created } = ensureActiveDecode(deps, job);
  deps.db.update(logImports).set({ status: 'running', progress: 0 }).where(eq(logImports.id, job.importId)).run();
  const write = batchWriter(deps, job, decodeId);
  const calibration = loadDecodingCalibration(deps.db, job.organizationId);
  const w = getWorker();
  w.ref();
  let lastProgressWrite = 0;
  const end = await new Promise<Extract<WorkerToMain, { type: 'end' }> | { type: 'crash'; message: string }>((resolve) => {
    const onMessage = (m: WorkerToMain) => {
      if (m.type === 'batch') {
        write(m.samples, m.readings);
        w.postMessage({ type: 'ack' });
      } else if (m.type === 'progress') {
        const now = Date.now();
        if (now - lastProgressWrite > 150) {
          lastProgressWrite = now;
          const progress = job.fileSize > 0 ? Math.min(0.99, m.bytesRead / job.fileSize) : 0;
          deps.db.update(logImports).set({ progress, rowsRead: m.rowsRead }).where(eq(logImports.id, job.importId)).run();
        }
      } else {
        cleanup();
        resolve(m);
      }
    };
    const onError = (err: Error) => { cleanup(); resolve({ type: 'crash', message: err.message }); };
    const onExit = (code: number) => { cleanup(); resolve({ type: 'crash', message: `the import worker exited (code ${code})` }); };
    const cleanup = () => {
      w.off('message', onMessage);
      w.off('error', onError);
      w.off('exit', onExit);
      w.unref();
    };
    w.on('message', onMessage);
    w.on('error', onError);
    w.on('exit', onExit);
    w.postMessage({ type: 'start', input: { filePath: job.filePath, timeZone: job.timeZone, calibration, plans: job.plans, defaultPlanId: job.defaultPlanId } });
  });

  if (end.type === 'crash') {
    return failImport(deps, job, { decodeId, created }, [{ line: 0, column: '', value: '', message: `The import stopped unexpectedly: ${end.message}` }], [], 0);
  }
  if (end.errorCount > 0) return failImport(deps, job, { decodeId, created }, end.errors, end.warnings, end.rowsRead, end.errorCount);

  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(logImports).set({ status: 'done', progress: 1, rowsRead: end.rowsRead, readingCount: end.readingCount, warnings: end.warnings, errors: [], finishedAt: now })
      .where(eq(logImports.id, job.importId)).run();
    recordAudit(tx, {
      organizationId: job.organizationId, actorId: job.actorId, entityType: 'log_import', entityId: job.importId, surveyId: job.surveyId, action: 'imported',
      after: { rows: end.rowsRead, readings: end.readingCount, decodeId, warnings: end.warnings.length }, at: now,
    });
  });
  return { importId: job.importId, status: 'done', readings: end.readingCount, errors: [] };
}

/** Deletes in slices so a large rejected file never blocks the event loop for long. */
async function deleteInSlices(deps: Deps, table: 'samples' | 'readings', where: string, params: unknown[]) {
  const stmt = deps.db.$client.prepare(`delete from ${table} where rowid in (select rowid from ${table} where ${where} limit 5000)`);
  while (stmt.run(params).changes > 0) await yieldToEventLoop();
}

/**
 * Rejects an import: removes every sample and reading it wrote (and the decode it made, if
 * that decode holds nothing else), so the survey is exactly as before; keeps the errors.
 */
export async function failImport(deps: Deps, job: ImportJob, decode: { decodeId: number; created: boolean } | null, errors: ImportProblem[], warnings: ImportWarning[], rowsRead: number, errorCount = errors.length): Promise<ImportOutcome> {
  await deleteInSlices(deps, 'readings', 'import_id = ?', [job.importId]);
  await deleteInSlices(deps, 'samples', 'import_id = ?', [job.importId]);
  const reported: (ImportProblem | { line: number; column: string; value: string; message: string })[] = [...errors];
  if (errorCount > errors.length) reported.push({ line: 0, column: '', value: '', message: `${errorCount - errors.length} more problems were found and not listed` });
  deps.db.transaction((tx) => {
    if (decode?.created) {
      const left = tx.select({ n: sql<number>`count(*)` }).from(readings).where(eq(readings.decodeId, decode.decodeId)).get()!.n;
      if (left === 0) {
        tx.update(surveys).set({ activeDecodeId: null }).where(and(eq(surveys.id, job.surveyId), eq(surveys.activeDecodeId, decode.decodeId))).run();
        tx.delete(decodes).where(eq(decodes.id, decode.decodeId)).run();
      }
    }
    tx.update(logImports).set({ status: 'failed', progress: 1, rowsRead, readingCount: 0, warnings, errors: reported, finishedAt: deps.clock.now() })
      .where(eq(logImports.id, job.importId)).run();
  });
  return { importId: job.importId, status: 'failed', readings: 0, errors };
}

/** At start-up: imports a previous process left queued or running cannot finish; reject them cleanly. */
export async function failInterruptedImports(deps: Deps) {
  const stale = deps.db.select().from(logImports).where(inArray(logImports.status, ['queued', 'running'])).all();
  for (const imp of stale) {
    if (pendingOf(deps.db).has(imp.id)) continue;
    const survey = deps.db.select().from(surveys).where(eq(surveys.id, imp.surveyId)).get()!;
    const job: ImportJob = { importId: imp.id, surveyId: imp.surveyId, organizationId: survey.organizationId, actorId: imp.createdBy, filePath: '', fileSize: 0, timeZone: 'UTC', plans: [], defaultPlanId: null };
    const decode = survey.activeDecodeId === null ? null : { decodeId: survey.activeDecodeId, created: true };
    await failImport(deps, job, decode, [{ line: 0, column: '', value: '', message: 'The server restarted during this import; upload the file again' }], [], imp.rowsRead);
  }
}
