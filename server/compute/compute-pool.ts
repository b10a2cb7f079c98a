import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createHash } from 'node:crypto';
import { MessageChannel } from 'node:worker_threads';
import type { Piscina } from 'piscina';
import type { Db } from '../db/client';

/**
 * Heavy pure work off the request path. A task is a named function of (db, input) that reads
 * what it needs through its own connection and returns a structured-clonable answer. With a file
 * database it runs on a piscina worker thread holding its own better-sqlite3 connection (WAL lets
 * it read while the main thread serves); with an in-memory database (tests) it runs inline.
 * A module defines its tasks with computeTask and declares them in server/modules.ts
 * (`computeTasks`), where the pool threads find them by name (compute-worker.ts): nothing
 * registers itself by being imported. Callers only see runCompute(db, task, input) -> Promise.
 */
/** Reports how far a task has got, 0 to 1. */
export type Progress = (fraction: number) => void;
/**
 * `wholeSurvey`: the task holds every reading of a survey at once (judging, the PDF). Such tasks run
 * on a thread of their own, one at a time: so two large heaps are never built together, and a PDF
 * never waits behind a queue of page reads (which run on the other thread).
 */
export type ComputeTask<I = never, O = unknown> = { name: string; run: (db: Db, input: I, progress: Progress) => O | Promise<O>; wholeSurvey?: boolean };

/** A named task (a plain value: declaring it in server/modules.ts is what lets the pool threads run it). */
export function computeTask<I, O>(name: string, run: (db: Db, input: I, progress: Progress) => O | Promise<O>, options: { wholeSurvey?: boolean } = {}): ComputeTask<I, O> {
  return { name, run, ...(options.wholeSurvey ? { wholeSurvey: true } : {}) };
}

/** Set on a pool thread: tasks called from a task run there, inline. */
let inline = false;
export function runTasksInline() { inline = true; }

/**
 * Two threads: the machine this runs on has two cores, and a PDF being built should not hold up
 * the readings pages. One thread takes the whole-survey tasks, one at a time (each holds a large
 * survey's readings); the others (COMPUTE_THREADS - 1, at least one) take the rest.
 * Young generation as in the import threads: their objects die young.
 * A thread ends after POOL_IDLE_MS without work: after a large survey its heap holds hundreds of MB
 * that an idle server should give back, and a new thread starts in well under a second.
 */
const POOL_IDLE_MS = 5_000;
const POOL_THREADS = Number(process.env.COMPUTE_THREADS ?? 2);
const pools = new Map<string, Piscina>();
const inFlight = new Map<string, Promise<unknown>>();

const here = path.dirname(fileURLToPath(import.meta.url));
let bundle: Promise<string> | null = null;

/**
 * compute-worker.ts and our code it imports bundled once into an ES module (esbuild, packages
 * left external), written under node_modules/.cache so the packages resolve from there: the
 * thread needs no TypeScript loader under tsx, vitest or the benchmarks.
 */
function workerFile(): Promise<string> {
  bundle ??= import('esbuild').then((esbuild) => esbuild.build({
    entryPoints: [path.join(here, 'compute-worker.ts')], bundle: true, platform: 'node', format: 'esm', target: 'node20',
    packages: 'external', write: false, logLevel: 'silent', tsconfig: path.join(here, '../../tsconfig.json'),
  })).then((r) => {
    const code = r.outputFiles[0].text;
    const dir = path.join(here, '../../node_modules/.cache/luxtrail');
    fs.mkdirSync(dir, { recursive: true });
    const file = path.join(dir, `compute-worker-${createHash('sha256').update(code).digest('hex').slice(0, 12)}.mjs`);
    if (!fs.existsSync(file)) fs.writeFileSync(file, code);
    return file;
  }, (err: unknown) => {
    bundle = null;
    throw err;
  });
  return bundle;
}

async function poolFor(databasePath: string, wholeSurvey: boolean): Promise<Piscina> {
  const file = await workerFile();
  const key = `${databasePath}\u0000${wholeSurvey ? 'whole-survey' : 'other'}`;
  let pool = pools.get(key);
  if (!pool) {
    const { Piscina: Pool } = await import('piscina');
    pool = pools.get(key);
    if (pool) return pool;
    pool = new Pool({
      filename: file, minThreads: 0, maxThreads: wholeSurvey ? 1 : Math.max(1, POOL_THREADS - 1), idleTimeout: POOL_IDLE_MS, workerData: { databasePath },
      execArgv: [], resourceLimits: { maxYoungGenerationSizeMb: 32 },
    });
    pools.set(key, pool);
  }
  return pool;
}

/**
 * Runs a registered task: on a worker thread for a file database, inline for an in-memory one.
 * Identical calls running at the same moment share one run (50 people opening the same verdicts).
 */
export function runCompute<I, O>(db: Db, task: ComputeTask<I, O>, input: I, onProgress?: Progress): Promise<O> {
  const client = db.$client;
  const name = task.name;
  const id = `${client.name}\u0000${name}\u0000${JSON.stringify(input)}`;
  const running = inFlight.get(id);
  if (running) return running as Promise<O>;
  const progress = onProgress ?? (() => undefined);
  const run = (async () => {
    if (client.memory || inline) return await task.run(db, input, progress);
    const pool = await poolFor(client.name, task.wholeSurvey ?? false);
    const channel = new MessageChannel();
    channel.port1.on('message', (f: number) => progress(f));
    try {
      return (await pool.run({ name, input, port: channel.port2 }, { transferList: [channel.port2] as never })) as O;
    } finally {
      channel.port1.close();
    }
  })();
  inFlight.set(id, run);
  void run.finally(() => inFlight.delete(id)).catch(() => undefined);
  return run;
}

/** Work queued or running on the pool threads (health and the load benchmark report it). */
export function computeQueue(): { queued: number; threads: number } {
  let queued = 0;
  let threads = 0;
  for (const p of pools.values()) { queued += p.queueSize; threads += p.threads.length; }
  return { queued, threads };
}

/** Stops the pool threads (clean shutdown). */
export async function closeComputePools(): Promise<void> {
  const all = [...pools.values()];
  pools.clear();
  await Promise.all(all.map((p) => p.destroy()));
}

/** Up to this many readings, work over a survey's readings runs inline (a few ms at most); above it, on a compute thread. */
export const INLINE_READINGS = 20_000;

/**
 * Runs a task inline for a survey of at most `inlineUpTo` readings (cheaper than a hop to a
 * thread), else on a compute thread (runCompute): what reads every reading of a large survey
 * never holds the event loop.
 */
export async function runComputeBySize<I, O>(db: Db, readings: number, task: ComputeTask<I, O>, input: I, inlineUpTo = INLINE_READINGS): Promise<O> {
  return readings <= inlineUpTo ? task.run(db, input, () => undefined) : runCompute(db, task, input);
}
