import { fileURLToPath } from 'node:url';
import { MessageChannel, Worker } from 'node:worker_threads';
import * as esbuild from 'esbuild';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { decodes, logImports, readings, surveys } from '../../db/schema/surveys';
import { plannedPoints } from '../../db/schema/grids';
import { loadDecodingCalibration } from '../probes/probe-calibration';
import { recordAudit } from '../audit/audit-service';
import type { WorkerToMain } from './log-parser';
import { queueWarmVerdicts } from '../compliance/warm-verdicts';
import { boundImportRecord, type ImportProblem, type ImportWarning } from './import-record';
import { createBatchWriter } from './batch-writer';
import type { WriterControl, WriterData } from './import-writer';
import { placeBurstsOnMarks, type MarkMatchingOptions } from '../field/mark-placement';
import { DEFAULT_MATCH_WINDOW_MS } from '@shared/core/mark-matching';
import { keepReadingCount } from '../surveys/reading-counts';

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
  /** Bursts left without a place go to the survey's "measured here now" marks by time (absent: default window, no offset). */
  markMatching?: MarkMatchingOptions;
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

/**
 * Young-generation sizes of the two import threads (V8's default is about 48 MB each). Their rows
 * die young (64 KiB chunks, 1,024-row batches), so smaller ones cost little time and keep the
 * server's peak RSS under 350 MB while a 1,000,000-row log is imported (tests/bench/ingest.bench.ts:
 * the parse thread at 12 MB spent about a fifth of its time collecting, at 24 to 48 MB a tenth;
 * the writer at 6 MB was markedly slower, at 16 MB somewhat).
 */
const PARSE_YOUNG_GENERATION_MB = 24;
const WRITER_YOUNG_GENERATION_MB = 32;

/**
 * A thread's code: its TypeScript entry and what it imports bundled into one CommonJS script
 * (esbuild, once per process and entry), so the thread runs without a TypeScript loader and its
 * hooks thread under tsx (server), vitest (tests) and the benchmark alike. The native SQLite
 * driver stays outside the bundle (the writer loads it with createRequire).
 */
const bundles = new Map<string, Promise<string>>();
function bundledThreadCode(entry: 'import-worker.ts' | 'import-writer.ts'): Promise<string> {
  let code = bundles.get(entry);
  if (!code) {
    code = esbuild.build({
      entryPoints: [fileURLToPath(new URL(`./${entry}`, import.meta.url))],
      bundle: true, platform: 'node', format: 'cjs', target: 'node20', write: false, logLevel: 'silent', external: ['better-sqlite3'],
    }).then((r) => r.outputFiles[0].text, (err: unknown) => {
      bundles.delete(entry);
      throw err;
    });
    bundles.set(entry, code);
  }
  return code;
}

async function getWorker(): Promise<Worker> {
  if (worker) return worker;
  const code = await bundledThreadCode('import-worker.ts');
  if (worker) return worker;
  worker = new Worker(code, { eval: true, execArgv: [], resourceLimits: { maxYoungGenerationSizeMb: PARSE_YOUNG_GENERATION_MB } });
  const w = worker;
  w.on('exit', () => { if (worker === w) worker = null; });
  w.unref();
  return w;
}

/** Writer threads by database file; an in-memory database (tests) is written on the main thread. */
const writers = new Map<string, Worker>();
async function getWriter(deps: Deps): Promise<Worker | null> {
  const client = deps.db.$client;
  if (client.memory) return null;
  let w = writers.get(client.name);
  if (w) return w;
  const code = await bundledThreadCode('import-writer.ts');
  w = writers.get(client.name);
  if (w) return w;
  const workerData: WriterData = { databasePath: client.name, resolveFrom: fileURLToPath(import.meta.url) };
  // No TypeScript loader inherited from the server's --import (execArgv).
  w = new Worker(code, { eval: true, workerData, execArgv: [], resourceLimits: { maxYoungGenerationSizeMb: WRITER_YOUNG_GENERATION_MB } });
  writers.set(client.name, w);
  const started = w;
  w.on('exit', () => { if (writers.get(client.name) === started) writers.delete(client.name); });
  w.unref();
  return w;
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

/**
 * The import threads end when no import has run for this long: each keeps a V8 heap of tens of MB
 * (after a large file, over a hundred), which an idle server should not hold; starting them again
 * costs well under a second, next to an import's seconds.
 */
export const IMPORT_THREADS_IDLE_MS = 5_000;
let idleTimer: NodeJS.Timeout | null = null;

/** Ends the parse worker and the writer threads (none is busy: called only with the queue empty and nothing running). */
function endIdleImportThreads() {
  idleTimer = null;
  if (running || queue.length > 0) return;
  if (worker) void worker.terminate();
  worker = null;
  for (const w of writers.values()) w.postMessage({ type: 'end' } satisfies WriterControl);
  writers.clear();
}

/** Whether import threads are alive (tests check they end when idle). */
export function importThreadsAlive(): number {
  return (worker ? 1 : 0) + writers.size;
}

async function pump() {
  if (running) return;
  const next = queue.shift();
  if (!next) {
    if (!idleTimer) idleTimer = setTimeout(endIdleImportThreads, IMPORT_THREADS_IDLE_MS).unref();
    return;
  }
  if (idleTimer) { clearTimeout(idleTimer); idleTimer = null; }
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

async function runImport(deps: Deps, job: ImportJob): Promise<ImportOutcome> {
  // First, so a worker that cannot start leaves nothing behind to undo.
  const w = await getWorker();
  const writer = await getWriter(deps);
  const { decodeId, created } = ensureActiveDecode(deps, job);
  deps.db.update(logImports).set({ status: 'running', progress: 0 }).where(eq(logImports.id, job.importId)).run();
  const target = { importId: job.importId, surveyId: job.surveyId, decodeId };
  const write = writer ? null : createBatchWriter(deps.db.$client, target);
  const calibration = loadDecodingCalibration(deps.db, job.organizationId);
  w.ref();
  writer?.ref();
  let lastProgressWrite = 0;
  const end = await new Promise<Extract<WorkerToMain, { type: 'end' }> | { type: 'crash'; message: string }>((resolve) => {
    const onMessage = (m: WorkerToMain) => {
      if (m.type === 'batch') {
        write!(m.batch);
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
    // The parse worker waits on the writer's acknowledgements: if the writer dies, stop it too.
    const onWriterGone = (err: Error | number) => { cleanup(); void w.terminate(); resolve({ type: 'crash', message: `the import writer stopped (${err instanceof Error ? err.message : `code ${err}`})` }); };
    const cleanup = () => {
      w.off('message', onMessage);
      w.off('error', onError);
      w.off('exit', onExit);
      writer?.off('error', onWriterGone);
      writer?.off('exit', onWriterGone);
      w.unref();
      writer?.unref();
    };
    w.on('message', onMessage);
    w.on('error', onError);
    w.on('exit', onExit);
    // The survey's planned points as they are now: rows naming one by label take its plan and position.
    const planned = deps.db.select({ label: plannedPoints.label, planId: plannedPoints.planId, xM: plannedPoints.xM, yM: plannedPoints.yM, plane: plannedPoints.plane, azimuthDeg: plannedPoints.azimuthDeg }).from(plannedPoints).where(eq(plannedPoints.surveyId, job.surveyId)).all();
    const input = { filePath: job.filePath, timeZone: job.timeZone, calibration, plans: job.plans, defaultPlanId: job.defaultPlanId, plannedPoints: planned };
    if (writer) {
      writer.on('error', onWriterGone);
      writer.on('exit', onWriterGone);
      const channel = new MessageChannel();
      writer.postMessage({ type: 'start', target, port: channel.port2 } satisfies WriterControl, [channel.port2]);
      w.postMessage({ type: 'start', input, fileSize: job.fileSize, writerPort: channel.port1 }, [channel.port1]);
    } else {
      w.postMessage({ type: 'start', input, fileSize: job.fileSize });
    }
  });

  if (end.type === 'crash') {
    return failImport(deps, job, { decodeId, created }, [{ line: 0, column: '', value: '', message: `The import stopped unexpectedly: ${end.message}` }], [], 0);
  }
  if (end.errorCount > 0) return failImport(deps, job, { decodeId, created }, end.errors, end.warnings, end.rowsRead, end.errorCount, end.warningCount);

  const now = deps.clock.now();
  const { warnings } = boundImportRecord({ errors: [], warnings: end.warnings, warningCount: end.warningCount });
  deps.db.transaction((tx) => {
    tx.update(logImports).set({ status: 'done', progress: 1, rowsRead: end.rowsRead, readingCount: end.readingCount, placement: end.placement, warnings, errors: [], finishedAt: now })
      .where(eq(logImports.id, job.importId)).run();
    keepReadingCount(tx, decodeId, job.importId, end.readingCount);
    // Once the import threads have ended (if no other import keeps them): at 50 clients the judging and the idle threads together passed 500 MB.
    queueWarmVerdicts(tx, deps.jobs, job.surveyId, now + IMPORT_THREADS_IDLE_MS + 1_000);
    recordAudit(tx, {
      organizationId: job.organizationId, actorId: job.actorId, entityType: 'log_import', entityId: job.importId, surveyId: job.surveyId, action: 'imported',
      after: { rows: end.rowsRead, readings: end.readingCount, decodeId, placement: end.placement, warnings: end.warningCount }, at: now,
    });
    placeBurstsOnMarks(tx, { surveyId: job.surveyId, importId: job.importId, decodeId, organizationId: job.organizationId, actorId: job.actorId },
      job.markMatching ?? { windowMs: DEFAULT_MATCH_WINDOW_MS, clockOffsetMs: 0 }, now);
  });
  return { importId: job.importId, status: 'done', readings: end.readingCount, errors: [] };
}

/** Deletes in slices so a large rejected file never blocks the event loop for long. */
async function deleteInSlices(deps: Deps, table: 'sample_blocks' | 'readings', where: string, params: unknown[]) {
  const stmt = deps.db.$client.prepare(`delete from ${table} where rowid in (select rowid from ${table} where ${where} limit 5000)`);
  while (stmt.run(params).changes > 0) await yieldToEventLoop();
}

/**
 * Rejects an import: removes every sample and reading it wrote (and the decode it made, if
 * that decode holds nothing else), so the survey is exactly as before; keeps the errors.
 */
export async function failImport(deps: Deps, job: ImportJob, decode: { decodeId: number; created: boolean } | null, errors: ImportProblem[], warnings: ImportWarning[], rowsRead: number, errorCount = errors.length, warningCount = warnings.length): Promise<ImportOutcome> {
  await deleteInSlices(deps, 'readings', 'import_id = ?', [job.importId]);
  await deleteInSlices(deps, 'sample_blocks', 'import_id = ?', [job.importId]);
  // At most 200 of each, cut, under 256 KB, with how many more there were (import-record.ts).
  const record = boundImportRecord({ errors, errorCount, warnings, warningCount });
  deps.db.transaction((tx) => {
    if (decode?.created) {
      const left = tx.select({ n: sql<number>`count(*)` }).from(readings).where(eq(readings.decodeId, decode.decodeId)).get()!.n;
      if (left === 0) {
        tx.update(surveys).set({ activeDecodeId: null }).where(and(eq(surveys.id, job.surveyId), eq(surveys.activeDecodeId, decode.decodeId))).run();
        tx.delete(decodes).where(eq(decodes.id, decode.decodeId)).run();
      }
    }
    tx.update(logImports).set({ status: 'failed', progress: 1, rowsRead, readingCount: 0, warnings: record.warnings, errors: record.errors, finishedAt: deps.clock.now() })
      .where(eq(logImports.id, job.importId)).run();
  });
  return { importId: job.importId, status: 'failed', readings: 0, errors };
}

/** At start-up: imports a previous process left queued or running cannot finish; reject them cleanly. */
export async function failInterruptedImports(deps: Deps): Promise<number> {
  const stale = deps.db.select().from(logImports).where(inArray(logImports.status, ['queued', 'running'])).all();
  let failed = 0;
  for (const imp of stale) {
    if (pendingOf(deps.db).has(imp.id)) continue;
    const survey = deps.db.select().from(surveys).where(eq(surveys.id, imp.surveyId)).get()!;
    const job: ImportJob = { importId: imp.id, surveyId: imp.surveyId, organizationId: survey.organizationId, actorId: imp.createdBy, filePath: '', fileSize: 0, timeZone: 'UTC', plans: [], defaultPlanId: null };
    const decode = survey.activeDecodeId === null ? null : { decodeId: survey.activeDecodeId, created: true };
    await failImport(deps, job, decode, [{ line: 0, column: '', value: '', message: 'The server restarted during this import; upload the file again' }], [], imp.rowsRead);
    failed++;
  }
  return failed;
}
