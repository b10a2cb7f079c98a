// Ingest benchmark (`npm run bench:ingest`; INGEST_ROWS=200000 for a quicker run). Prints figures;
// asserts nothing. Generates a log of N rows (bursts, saturations, two probes), uploads it over
// HTTP to a server this script starts, waits for `done` while polling GET /api/health every 50 ms,
// then times a baseline: papaparse streaming the same file and inserting N rows with one prepared
// statement in one transaction. Targets (2-core machine): ratio <= 1.5, peak RSS <= 350 MB, health p99 <= 250 ms.
// Two variants of the same log: rows with x_m, y_m and plan, and label-only rows naming planned points
// (the label join inside the streaming import), each against its own baseline.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import Papa from 'papaparse';
import { benchLogLines } from '../../server/db/demo/simulate-log';
import { addBenchProbes, benchProbes, pct, startBenchServer, waitUntilSettled, writeBenchLog, writeLines } from './bench-server';

const N = Number(process.env.INGEST_ROWS ?? 1_000_000);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-ingest-'));
const logPath = path.join(dir, 'bench-log.csv');
const labelLogPath = path.join(dir, 'bench-log-labels.csv');
const START = Date.parse('2026-11-10T00:00:00Z');
/** Every row names the demo site's outdoor plan (60 m x 40 m, the bench points' frame). */
const BENCH_PLAN = 'Car park and entrance';

/**
 * The same rows with x_m, y_m and plan emptied and each point label replaced by a planned point's
 * label (the n-th distinct point takes the n-th label, cycling), so the bursts stay as they were.
 */
async function writeLabelLog(labels: readonly string[]) {
  let last = '';
  let k = -1;
  await writeLines(labelLogPath, (function* () {
    for (const line of benchLogLines(N, benchProbes, START, 7, BENCH_PLAN)) {
      const c = line.split(',');
      if (c[0] !== 'timestamp') {
        if (c[2] !== last) { last = c[2]; k++; }
        c[2] = labels[k % labels.length];
        c[6] = '';
        c[7] = '';
        c[8] = '';
      }
      yield c.join(',');
    }
  })());
}

async function main() {
  console.log(`Generating ${N.toLocaleString('en-GB')} rows…`);
  await writeBenchLog(logPath, N, benchProbes, START, BENCH_PLAN);
  const bytes = fs.statSync(logPath).size;
  console.log(`Log: ${(bytes / 1e6).toFixed(1)} MB`);

  try {
    await runVariants();
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

/** Each variant on a server of its own, so its peak RSS is its import's and not what an earlier import left behind. */
async function runVariants() {
  await runOnFreshServer('coords', async (srv) => {
    // Variant 1: every row carries x_m, y_m and plan.
    const coords = await importOnce(srv, logPath, await srv.createSurvey('Ingest benchmark'));
    report('Rows with coordinates', coords, await baselineOf(logPath, 'baseline'));
  });
  await runOnFreshServer('labels', async (srv) => {
    // Label-only rows naming the planned points of the outdoor plan's zones.
    const labelSurvey = await srv.createSurvey('Ingest benchmark, label-only');
    const plans = await (await fetch(`${srv.base}/api/sites/${srv.siteId}/plans`, { headers: srv.headers })).json() as { items: { id: number; name: string }[] };
    const outdoor = plans.items.find((p) => p.name === BENCH_PLAN)!;
    const gen = await (await fetch(`${srv.base}/api/surveys/${labelSurvey}/planned-points/generate`, { method: 'POST', headers: { ...srv.headers, 'Content-Type': 'application/json' }, body: JSON.stringify({ planId: outdoor.id }) })).json() as { items: { label: string }[] };
    const labels = gen.items.map((p) => p.label);
    console.log(`\nPlanned ${labels.length} points on "${BENCH_PLAN}"; writing the label-only log…`);
    await writeLabelLog(labels);
    const byLabel = await importOnce(srv, labelLogPath, labelSurvey);
    report('Label-only rows (planned points)', byLabel, await baselineOf(labelLogPath, 'baseline-labels'));
  });
}

type BenchServer = { base: string; pid: number; headers: Record<string, string>; siteId: number; createSurvey: (name: string) => Promise<number> };

/** Starts the server on a fresh database (the demo seed and the benchmark's probes), signs in, runs `work`, stops the server. */
async function runOnFreshServer(name: string, work: (srv: BenchServer) => Promise<void>) {
  const serverDir = path.join(dir, name);
  fs.mkdirSync(serverDir);
  const server = await startBenchServer(serverDir);
  const { base, origin } = server;
  try {
    // The benchmark's own probes, with the demo probes' coefficients.
    const db = new Database(server.dbPath);
    db.pragma('busy_timeout = 5000');
    addBenchProbes(db, 'surveyor@luxtrail.test', START);
    // The demo seed's import and compute threads and its queued jobs end first: the import's RSS is then its own.
    const settled = await waitUntilSettled(server.pid, db);
    console.log(`\nServer settled ${(settled.waitedMs / 1000).toFixed(1)} s after start-up (RSS ${settled.rssMb} MB, ${settled.threads} threads)`);
    db.close();

    const login = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'Content-Type': 'application/json', Origin: origin }, body: JSON.stringify({ email: 'surveyor@luxtrail.test', password: 'luxtrail-demo' }) });
    const cookie = (login.headers.get('set-cookie') ?? '').split(';')[0];
    const headers = { Cookie: cookie, Origin: origin };
    const sites = await (await fetch(`${base}/api/sites`, { headers })).json() as { items: { id: number }[] };

    const siteId = sites.items[0].id;
    const createSurvey = async (surveyName: string) => (await (await fetch(`${base}/api/surveys`, { method: 'POST', headers: { ...headers, 'Content-Type': 'application/json' }, body: JSON.stringify({ siteId, name: surveyName }) })).json() as { id: number }).id;
    await work({ base, pid: server.pid, headers, siteId, createSurvey });
  } catch (err) {
    console.error(server.output().slice(-3000));
    throw err;
  } finally {
    await server.stop();
  }
}

/** Uploads one log to a survey and times it to `done`, polling the health route meanwhile. */
async function importOnce(srv: BenchServer, file: string, surveyId: number) {
  const { base, headers } = srv;
  const latencies: number[] = [];
  /** When each poll started, ms after the upload began (negative: before it). */
  const pollAt: number[] = [];
  let t0 = performance.now();
  let polling = true;
  const poller = (async () => {
    while (polling) {
      const p0 = performance.now();
      await fetch(`${base}/api/health`);
      latencies.push(performance.now() - p0);
      pollAt.push(p0 - t0);
      await new Promise((r) => setTimeout(r, 50));
    }
  })();
  const rssBeforeKb = Number(/VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${srv.pid}/status`, 'utf8'))?.[1] ?? 0);
  // Peak RSS of the import alone: reset the high-water mark first (Linux clear_refs 5).
  try { fs.writeFileSync(`/proc/${srv.pid}/clear_refs`, '5'); } catch { /* not Linux: the peak includes start-up */ }
  t0 = performance.now();
  const form = new FormData();
  form.append('file', await fs.openAsBlob(file, { type: 'text/csv' }), path.basename(file));
  const up = await fetch(`${base}/api/surveys/${surveyId}/logs`, { method: 'POST', headers, body: form });
  const { importId } = await up.json() as { importId: number };
  const acceptedMs = performance.now() - t0;
  if (!importId) throw new Error(`upload failed: ${up.status}`);
  let status: { status: string; readings: number; rowsRead: number; errors: unknown[]; warnings: unknown[]; placement: { byCoordinates: number; byLabel: number; none: number } | null };
  for (;;) {
    status = await (await fetch(`${base}/api/imports/${importId}`, { headers })).json() as typeof status;
    if (status.status === 'done' || status.status === 'failed') break;
    await new Promise((r) => setTimeout(r, 100));
  }
  const importMs = performance.now() - t0;
  polling = false;
  await poller;
  const rssKb = Number(/VmHWM:\s+(\d+)/.exec(fs.readFileSync(`/proc/${srv.pid}/status`, 'utf8'))?.[1] ?? 0);
  if (status.status !== 'done') throw new Error(`import failed: ${JSON.stringify(status.errors.slice(0, 3))}`);
  return { status, importMs, acceptedMs, rssKb, rssBeforeKb, latencies, pollAt };
}

/** Baseline: papaparse streaming + one prepared statement in one transaction, same rows. */
async function baselineOf(file: string, name: string) {
  const bdb = new Database(path.join(dir, `${name}.db`));
  bdb.pragma('journal_mode = WAL');
  bdb.pragma('synchronous = NORMAL');
  bdb.exec('create table samples (id integer primary key autoincrement, import_id integer not null, line integer, time_ms integer, probe text, point text, gain_code integer, counts integer, x_m real, y_m real, plan text, int_ms real, temp_c real, role text, note text); create index samples_import_idx on samples (import_id)');
  const insert = bdb.prepare('insert into samples (import_id, line, time_ms, probe, point, gain_code, counts, x_m, y_m, plan, int_ms, temp_c, role, note) values (1, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)');
  const b0 = performance.now();
  let rows = 0;
  bdb.exec('begin');
  await new Promise<void>((resolve, reject) => {
    Papa.parse<string[]>(fs.createReadStream(file, { encoding: 'utf8', highWaterMark: 1 << 20 }) as unknown as File, {
      chunk(res) {
        for (const r of res.data) {
          // Columns as LOG_HEADER: timestamp, probe, point, gain, counts, ma, x_m, y_m, plan, int_ms, temp_c, role, note.
          if (r.length < 13 || r[0] === 'timestamp') continue;
          rows++;
          insert.run(rows + 1, Date.parse(r[0]), r[1], r[2], Number(r[3]), Number(r[4]), r[6] === '' ? null : Number(r[6]), r[7] === '' ? null : Number(r[7]), r[8], Number(r[9]), Number(r[10]), r[11], r[12] || null);
        }
      },
      complete: () => resolve(),
      error: reject,
    });
  });
  bdb.exec('commit');
  const baselineMs = performance.now() - b0;
  bdb.close();
  return { baselineMs, rows };
}

function report(title: string, r: Awaited<ReturnType<typeof importOnce>>, b: Awaited<ReturnType<typeof baselineOf>>) {
  const { status, importMs, acceptedMs, rssKb, rssBeforeKb, latencies, pollAt } = r;
  console.log(`\n== ${title} ==`);
  console.log(`Rows ${status.rowsRead.toLocaleString('en-GB')} -> readings ${status.readings.toLocaleString('en-GB')} (baseline inserted ${b.rows.toLocaleString('en-GB')} rows)`);
  if (status.placement) console.log(`Placed by coordinates ${status.placement.byCoordinates.toLocaleString('en-GB')}, by label ${status.placement.byLabel.toLocaleString('en-GB')}, not placed ${status.placement.none.toLocaleString('en-GB')}; warnings ${status.warnings.length}`);
  console.log(`Import wall time (upload to done): ${(importMs / 1000).toFixed(2)} s (upload answered 202 after ${(acceptedMs / 1000).toFixed(2)} s)`);
  console.log(`Baseline (papaparse + one prepared statement, one transaction): ${(b.baselineMs / 1000).toFixed(2)} s`);
  console.log(`Ratio import / baseline: ${(importMs / b.baselineMs).toFixed(2)}  (target <= 1.5)`);
  console.log(`Server peak RSS (VmHWM): ${(rssKb / 1024).toFixed(0)} MB  (target <= 350 MB; ${(rssBeforeKb / 1024).toFixed(0)} MB before the upload)`);
  console.log(`GET /api/health during import: n=${latencies.length}, p50 ${pct(latencies, 50).toFixed(1)} ms, p99 ${pct(latencies, 99).toFixed(1)} ms, max ${Math.max(...latencies).toFixed(1)} ms  (target p99 <= 250 ms)`);
  const slowest = latencies.map((ms, i) => ({ ms, at: pollAt[i] })).sort((a, b2) => b2.ms - a.ms).slice(0, 5);
  console.log(`Slowest health polls (ms, started at s after the upload began): ${slowest.map((x) => `${x.ms.toFixed(0)} @ ${(x.at / 1000).toFixed(1)}`).join(', ')}`);
}

main().catch((err) => { console.error(err); process.exit(1); });
