import fs from 'node:fs';
import { and, desc, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { benchRuns, probes } from '../../db/schema/calibration';
import { storedFiles, users } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { fitBench, type BenchFitResult } from '@shared/core/bench-fit';
import { isDecodeError } from '@shared/core/errors';
import {
  LINEARITY_FLAG_LIMIT, type BenchRowDto, type BenchRunDetailDto, type BenchRunDto, type BenchRunFields, type GainFitDto,
} from '@shared/schemas/bench-runs';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { keepUploadedFile, sniffFile, storedPath } from '../../lib/file-store';
import { decodeText, TEXT_HEAD_BYTES, textEncodingOf } from '../../lib/text-encoding';
import { recordAudit } from '../audit/audit-service';
import { findProbe } from '../probes/probes-service';
import { parseBenchCsv } from './bench-csv';

/** What a bench run keeps of the core's fit: per-code figures and the points for the charts. */
export type StoredBenchFit = { options: BenchRunFields; issues: string[]; gains: GainFitDto[]; draft: BenchFitResult['draft'] };

type UploadedFile = { path: string; originalname: string };

/** Shapes the core's fit for storage and the screen; residuals are the core's, paired with their rows. */
function storedFit(rows: BenchRowDto[], result: BenchFitResult, options: BenchRunFields, nominal: Map<number, number>, probeCodes: number[]): StoredBenchFit {
  const gains = result.gains.map((g): GainFitDto => {
    // fitBench groups rows by code in file order, so its residuals line up with this list.
    const mine = rows.filter((r) => r.gain === g.code);
    return {
      code: g.code, nominalGain: nominal.get(g.code) ?? null, n: g.n, responsivity: g.responsivity, luxPerCount: g.luxPerCount, uLuxPerCount: g.uLuxPerCount,
      darkCounts: g.darkCounts, uDarkCounts: g.uDarkCounts, correlation: g.correlation, residualSdCounts: g.residualSdCounts, rSquared: g.fit.rSquared,
      linearity: g.linearity, suggestedURel: g.suggestedURel, ratio: g.ratio,
      points: mine.map((r, i) => ({ line: r.line, referenceLux: r.referenceLux, counts: r.counts, fitted: r.counts - g.fit.residuals[i], residual: g.fit.residuals[i] })),
    };
  });
  const issues = [...result.issues];
  for (const g of gains) {
    if (g.linearity > LINEARITY_FLAG_LIMIT) issues.push(`Gain code ${g.code}: largest relative residual ${(g.linearity * 100).toFixed(2)} % exceeds the ${LINEARITY_FLAG_LIMIT * 100} % linearity flag.`);
  }
  const missing = probeCodes.filter((c) => !gains.some((g) => g.code === c));
  if (missing.length) issues.push(`No bench rows for gain code(s) ${missing.join(', ')}: a coefficient set cannot be drafted from this run alone.`);
  return { options, issues, gains, draft: result.draft };
}

type BenchRunRow = typeof benchRuns.$inferSelect;

function present(row: BenchRunRow, file: { filename: string; sha256: string }, createdBy: string | null): BenchRunDto {
  const fit = row.fit as StoredBenchFit;
  return {
    id: row.id, probeId: row.probeId, filename: file.filename, sha256: file.sha256, rowCount: row.rowCount,
    options: fit.options, gains: fit.gains, issues: fit.issues, linearityLimit: LINEARITY_FLAG_LIMIT,
    createdBy, createdAt: new Date(row.createdAt).toISOString(),
  };
}

/**
 * Checks, parses and fits an uploaded bench CSV; stores the raw file, rows and fit only when
 * every row is valid and the core could fit every gain code. Otherwise nothing is stored.
 */
export async function uploadBenchRun(deps: Deps, user: SessionUser, probeId: number, file: UploadedFile, options: BenchRunFields): Promise<BenchRunDetailDto> {
  try {
    const probe = findProbe(deps.db, user, probeId);
    if (probe.kind !== 'counts') throw conflict('Bench runs fit counting probes; enter an analog transmitter\'s calibration as a manual coefficient set');
    if (probe.status === 'retired') throw conflict(`Probe ${probe.serial} is retired`);
    const contentType = await sniffFile(file.path, 'csv');
    const bytes = fs.readFileSync(file.path);
    const text = decodeText(bytes, textEncodingOf(bytes.subarray(0, TEXT_HEAD_BYTES)) ?? 'utf-8');
    const gains = probe.gains ?? [];
    const parsed = parseBenchCsv(text, { gainCodes: gains.map((g) => g.code), saturationCounts: probe.saturationCounts!, fullScaleCounts: probe.fullScaleCounts! });
    if (parsed.errorCount > 0) {
      const e = parsed.errors[0];
      throw unprocessable(
        `The bench file has ${parsed.errorCount} problem(s); nothing was stored. First: line ${e.line}${e.column ? `, column ${e.column}` : ''}${e.value !== null ? ` ("${e.value}")` : ''}: ${e.message}`,
        { errors: parsed.errors, errorCount: parsed.errorCount },
      );
    }
    let result: BenchFitResult;
    try {
      result = fitBench(parsed.rows.map((r) => ({ gain: r.gain, referenceLux: r.referenceLux, counts: r.counts, intMs: r.intMs, ...(r.tempC !== null ? { tempC: r.tempC } : {}) })),
        { tRefMs: options.tRefMs, referenceURel: options.referenceURel, alphaPerK: options.alphaPerK, tCalC: options.tCalC, gains });
    } catch (err) {
      if (isDecodeError(err)) throw unprocessable(`The bench data cannot be fitted; nothing was stored: ${err.message}`, { errors: [{ line: null, column: null, value: null, message: err.message }], errorCount: 1 });
      throw err;
    }
    const fit = storedFit(parsed.rows, result, options, new Map(gains.map((g) => [g.code, g.nominalGain])), gains.map((g) => g.code));
    const stored = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: file.path, filename: file.originalname || 'bench-run.csv', contentType });
    const now = deps.clock.now();
    const id = deps.db.transaction((tx) => {
      const row = tx.insert(benchRuns).values({ probeId: probe.id, fileId: stored.id, rowCount: parsed.rows.length, rows: parsed.rows, fit, createdBy: user.id, createdAt: now }).returning().get();
      recordAudit(tx, {
        organizationId: user.organizationId, actorId: user.id, entityType: 'bench_run', entityId: row.id, probeId: probe.id, action: 'uploaded',
        after: { filename: stored.filename, sha256: stored.sha256, rowCount: row.rowCount, options, gainCodes: fit.gains.map((g) => g.code), issues: fit.issues }, at: now,
      });
      return row.id;
    });
    return getBenchRun(deps, user, id);
  } finally {
    fs.rmSync(file.path, { force: true });
  }
}

function loadBenchRun(deps: Deps, user: SessionUser, benchRunId: number) {
  const found = deps.db.select({ run: benchRuns, filename: storedFiles.filename, sha256: storedFiles.sha256, createdBy: users.name })
    .from(benchRuns).innerJoin(probes, eq(probes.id, benchRuns.probeId)).innerJoin(storedFiles, eq(storedFiles.id, benchRuns.fileId))
    .leftJoin(users, eq(users.id, benchRuns.createdBy))
    .where(and(eq(benchRuns.id, benchRunId), eq(probes.organizationId, user.organizationId))).get();
  if (!found) throw notFound('Bench run');
  findProbe(deps.db, user, found.run.probeId);
  return found;
}

export function getBenchRun(deps: Deps, user: SessionUser, benchRunId: number): BenchRunDetailDto {
  const f = loadBenchRun(deps, user, benchRunId);
  return { ...present(f.run, f, f.createdBy), rows: f.run.rows as BenchRowDto[] };
}

/** The stored run's fit, for drafting a coefficient set from it (same organisation and probe). */
export function benchRunFit(deps: Deps, user: SessionUser, benchRunId: number): { probeId: number; fit: StoredBenchFit } {
  const f = loadBenchRun(deps, user, benchRunId);
  return { probeId: f.run.probeId, fit: f.run.fit as StoredBenchFit };
}

export function listBenchRuns(deps: Deps, user: SessionUser, probeId: number): BenchRunDto[] {
  findProbe(deps.db, user, probeId);
  return deps.db.select({ run: benchRuns, filename: storedFiles.filename, sha256: storedFiles.sha256, createdBy: users.name })
    .from(benchRuns).innerJoin(storedFiles, eq(storedFiles.id, benchRuns.fileId)).leftJoin(users, eq(users.id, benchRuns.createdBy))
    .where(eq(benchRuns.probeId, probeId)).orderBy(desc(benchRuns.createdAt), desc(benchRuns.id)).all()
    .map((f) => present(f.run, f, f.createdBy));
}

/** Path and name of the raw bench file as uploaded. */
export function benchRunFile(deps: Deps, user: SessionUser, benchRunId: number) {
  const f = loadBenchRun(deps, user, benchRunId);
  return { path: storedPath(deps, f.sha256), filename: f.filename };
}
