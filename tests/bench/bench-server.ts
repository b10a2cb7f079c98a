// What the server benchmarks share: a server on a fresh file database, the benchmark's probes,
// a generated log, percentiles and the server's peak RSS.
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { spawn } from 'node:child_process';
import type Database from 'better-sqlite3';
import { benchLogLines, simProbe } from '../../server/db/demo/simulate-log';
import { DEMO_COUNTING_PROBES } from '../../server/db/demo/demo-probes';

export const benchProbes = [{ ...simProbe(DEMO_COUNTING_PROBES[0]), serial: 'BENCH-A' }, { ...simProbe(DEMO_COUNTING_PROBES[1]), serial: 'BENCH-B' }] as [ReturnType<typeof simProbe>, ReturnType<typeof simProbe>];

export const freePort = () => new Promise<number>((resolve) => {
  const s = net.createServer().listen(0, '127.0.0.1', () => { const p = (s.address() as net.AddressInfo).port; s.close(() => resolve(p)); });
});

/** The p-th percentile (nearest rank) of the values. */
export const pct = (xs: number[], p: number) => { if (xs.length === 0) return NaN; const s = [...xs].sort((a, b) => a - b); return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]; };

/** Resets the process's peak RSS (Linux clear_refs 5); elsewhere the peak includes everything before. */
export function resetPeakRss(pid: number) {
  try { fs.writeFileSync(`/proc/${pid}/clear_refs`, '5'); } catch { /* not Linux */ }
}

/** Peak RSS (VmHWM) of the process and all its threads, MB. */
export function peakRssMb(pid: number): number {
  try { return Math.round(Number(/VmHWM:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0) / 1024); } catch { return NaN; }
}

/** The server's current RSS (MB) and thread count, from /proc (NaN elsewhere). */
export function rssAndThreads(pid: number): { rssMb: number; threads: number } {
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
    return { rssMb: Math.round(Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? NaN) / 1024), threads: Number(/Threads:\s+(\d+)/.exec(status)?.[1] ?? NaN) };
  } catch { return { rssMb: NaN, threads: NaN }; }
}

/**
 * Waits until the start-up work of a fresh server has ended: no job of the runner due within a
 * minute or running (the demo's verdicts computed ahead, its mail), and the thread count unchanged
 * for longer than the import and compute threads' idle time (5 s), so a measurement that follows
 * is of its own work and not of the demo seed's threads still ending. At most `maxMs`.
 */
export async function waitUntilSettled(pid: number, db: Database.Database, maxMs = 60_000): Promise<{ waitedMs: number; rssMb: number; threads: number }> {
  const start = performance.now();
  let last = rssAndThreads(pid).threads;
  let changedAt = start;
  for (;;) {
    await new Promise((r) => setTimeout(r, 250));
    const now = performance.now();
    const { threads, rssMb } = rssAndThreads(pid);
    if (threads !== last) { last = threads; changedAt = now; }
    const pending = (db.prepare("select count(*) as n from jobs where status = 'running' or (status = 'queued' and run_at <= ?)").get(Date.now() + 60_000) as { n: number }).n;
    if ((pending === 0 && now - changedAt >= 7_000) || now - start >= maxMs) return { waitedMs: now - start, rssMb, threads };
  }
}

/** Starts `server/index.ts` on loopback with a fresh database in `dir` and waits for /api/health. */
export async function startBenchServer(dir: string, env: Record<string, string> = {}) {
  const port = await freePort();
  const dbPath = path.join(dir, 'luxtrail.db');
  // As `npm start` runs it: MALLOC_ARENA_MAX=2 (README, Configuration) and NODE_ENV=production, so its job runner runs
  // (verdicts computed ahead, mail); no SMTP_URL, so mail is only logged.
  // BENCH_SERVER_ARGS: extra node options for the server alone, e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof".
  const nodeArgs = (process.env.BENCH_SERVER_ARGS ?? '').split(' ').filter(Boolean);
  const { SMTP_URL: _smtp, ...parentEnv } = process.env;
  const server = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', 'server/index.ts'], {
    env: { ...parentEnv, HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: dbPath, DATA_DIR: path.join(dir, 'data'), LOG_LEVEL: 'warn', NODE_ENV: 'production', MALLOC_ARENA_MAX: '2', UPLOAD_LIMIT_MB: '400', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  server.stdout.on('data', (d) => { out += d; if (out.length > 200_000) out = out.slice(-100_000); });
  server.stderr.on('data', (d) => { out += d; if (out.length > 200_000) out = out.slice(-100_000); });
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; ; i++) {
    try { if ((await fetch(`${base}/api/health`)).ok) break; } catch { /* starting */ }
    if (i > 900) throw new Error(`server did not start:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    base, origin: `http://localhost:${port}`, dbPath, pid: server.pid!,
    output: () => out,
    stop: async () => { server.kill('SIGTERM'); await new Promise((r) => server.once('exit', r)); },
  };
}

/** The benchmark's own probes (the demo probes' coefficients) in the organisation of `email`. */
export function addBenchProbes(db: Database.Database, email: string, start: number) {
  const orgId = (db.prepare('select organization_id as o from users where email = ?').get(email) as { o: number }).o;
  const probeIds: number[] = [];
  const setIds: number[] = [];
  for (const p of benchProbes) {
    const id = Number(db.prepare("insert into probes (organization_id, serial, kind, description, full_scale_counts, saturation_counts, floor_counts, gains, created_at, updated_at) values (?, ?, 'counts', 'bench', ?, ?, ?, ?, 0, 0)")
      .run(orgId, p.serial, p.probe.fullScaleCounts, p.probe.saturationCounts, p.probe.floorCounts, JSON.stringify(p.probe.gains)).lastInsertRowid);
    probeIds.push(id);
    setIds.push(Number(db.prepare("insert into coefficient_sets (probe_id, version, status, effective_from, due_date, t_ref_ms, alpha_per_k, t_cal_c, gains, certificate_number, created_at) values (?, 1, 'approved', ?, ?, ?, ?, ?, ?, 'BENCH', 0)")
      .run(id, start - 86_400_000, start + 400 * 86_400_000, p.set.tRefMs, p.set.alphaPerK, p.set.tCalC, JSON.stringify(p.set.gains)).lastInsertRowid));
  }
  return { probeIds, setIds };
}

/** Writes lines to a file in blocks of 10,000, waiting for the stream to drain (a million-row log never sits in memory). */
export async function writeLines(file: string, lines: Iterable<string>) {
  const out = fs.createWriteStream(file);
  let buf: string[] = [];
  for (const line of lines) {
    buf.push(line);
    if (buf.length >= 10_000) {
      if (!out.write(`${buf.join('\n')}\n`)) await new Promise<void>((r) => out.once('drain', () => r()));
      buf = [];
    }
  }
  out.end(buf.length ? `${buf.join('\n')}\n` : '');
  await new Promise<void>((r) => out.once('finish', () => r()));
}

/** Writes a generated log of `rows` rows (bursts, saturations, two probes) naming `planName`. */
export async function writeBenchLog(file: string, rows: number, probes: typeof benchProbes, start: number, planName: string) {
  await writeLines(file, benchLogLines(rows, probes, start, 7, planName));
}
