import fs from 'node:fs';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Deps } from '../../deps';
import { coefficientSets, probes } from '../../db/schema/calibration';
import { storedFiles, users } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { can } from '@shared/policy';
import { createCoefficientSelector } from '@shared/core/coefficient-sets';
import type { CoefficientSetDto, CreateCoefficientSetBody, GainCoefficientsInput } from '@shared/schemas/coefficient-sets';
import { conflict, fourEyes, notFound, unprocessable } from '../../http/errors';
import { keepUploadedFile, sniffFile, storedPath } from '../../lib/file-store';
import { recordAudit } from '../audit/audit-service';
import { findProbe, type ProbeRow } from '../probes/probes-service';
import { toCoreCoefficientSet } from '../probes/probe-calibration';
import { benchRunFit } from '../bench-runs/bench-runs-service';

type SetRow = typeof coefficientSets.$inferSelect;

const iso = (ms: number) => new Date(ms).toISOString();
const drafter = alias(users, 'drafter');
const approver = alias(users, 'approver');

/** The four-eyes rule answers 403 with its own code, so the screen can say why. */


/** The record fields an audit event keeps for a set (before/after). */
function auditView(s: SetRow) {
  return {
    version: s.version, status: s.status, effectiveFrom: iso(s.effectiveFrom), dueDate: iso(s.dueDate), tRefMs: s.tRefMs, alphaPerK: s.alphaPerK, tCalC: s.tCalC,
    gains: s.gains, certificateNumber: s.certificateNumber, certificateFileId: s.certificateFileId, benchRunId: s.benchRunId, note: s.note,
    draftedBy: s.draftedBy, approvedBy: s.approvedBy, approvedAt: s.approvedAt === null ? null : iso(s.approvedAt),
  };
}

function presentSets(deps: Deps, probeId: number, where: ReturnType<typeof and>): CoefficientSetDto[] {
  const rows = deps.db.select({
    set: coefficientSets, drafter: { id: drafter.id, name: drafter.name, email: drafter.email }, approver: { id: approver.id, name: approver.name, email: approver.email },
    certFilename: storedFiles.filename, certSize: storedFiles.size, certSha: storedFiles.sha256,
  }).from(coefficientSets).leftJoin(drafter, eq(drafter.id, coefficientSets.draftedBy)).leftJoin(approver, eq(approver.id, coefficientSets.approvedBy))
    .leftJoin(storedFiles, eq(storedFiles.id, coefficientSets.certificateFileId))
    .where(where).orderBy(desc(coefficientSets.version)).all();
  const approved = deps.db.select().from(coefficientSets).where(and(eq(coefficientSets.probeId, probeId), eq(coefficientSets.status, 'approved')))
    .orderBy(asc(coefficientSets.effectiveFrom), asc(coefficientSets.version)).all().map(toCoreCoefficientSet);
  const inForce = createCoefficientSelector(approved).select(deps.clock.now());
  return rows.map(({ set: s, drafter: d, approver: a, certFilename, certSize, certSha }) => ({
    id: s.id, probeId: s.probeId, version: s.version, status: s.status, effectiveFrom: iso(s.effectiveFrom), dueDate: iso(s.dueDate),
    tRefMs: s.tRefMs, alphaPerK: s.alphaPerK, tCalC: s.tCalC, gains: s.gains, certificateNumber: s.certificateNumber,
    certificate: certFilename !== null && certSize !== null && certSha !== null ? { filename: certFilename, size: certSize, sha256: certSha } : null,
    benchRunId: s.benchRunId, note: s.note,
    draftedBy: d?.id != null ? d : null, approvedBy: a?.id != null ? a : null, approvedAt: s.approvedAt === null ? null : iso(s.approvedAt),
    inForce: inForce?.id === String(s.id), createdAt: iso(s.createdAt),
  }));
}

/** Every version of a probe's sets, newest first; drafts only for those who may draft. */
export function listCoefficientSets(deps: Deps, user: SessionUser, probeId: number): CoefficientSetDto[] {
  findProbe(deps.db, user, probeId);
  const draftsVisible = can(user.role, 'coefficients.write');
  return presentSets(deps, probeId, and(eq(coefficientSets.probeId, probeId), draftsVisible ? undefined : eq(coefficientSets.status, 'approved')));
}

/** The set if it belongs to a probe of the caller's organisation (and the caller may see it); else 404. */
function findSet(deps: Deps, user: SessionUser, setId: number): { set: SetRow; probe: ProbeRow } {
  const row = deps.db.select({ set: coefficientSets }).from(coefficientSets).innerJoin(probes, eq(probes.id, coefficientSets.probeId))
    .where(and(eq(coefficientSets.id, setId), eq(probes.organizationId, user.organizationId))).get();
  if (!row) throw notFound('Coefficient set');
  const probe = findProbe(deps.db, user, row.set.probeId);
  if (row.set.status === 'draft' && !can(user.role, 'coefficients.write')) throw notFound('Coefficient set');
  return { set: row.set, probe };
}

function getSet(deps: Deps, user: SessionUser, setId: number): CoefficientSetDto {
  const { probe } = findSet(deps, user, setId);
  return presentSets(deps, probe.id, eq(coefficientSets.id, setId))[0];
}

/** The per-code coefficients must cover exactly the probe's gain codes (analog: one entry, code 0). */
function checkGainsCoverProbe(probe: ProbeRow, gains: GainCoefficientsInput[]) {
  const given = gains.map((g) => g.code);
  const dup = given.find((c, i) => given.indexOf(c) !== i);
  if (dup !== undefined) throw unprocessable(`Gain code ${dup} has two rows of coefficients`, [{ path: 'gains', message: `Gain code ${dup} appears twice` }]);
  const expected = probe.kind === 'counts' ? (probe.gains ?? []).map((g) => g.code) : [0];
  const missing = expected.filter((c) => !given.includes(c));
  const extra = given.filter((c) => !expected.includes(c));
  if (missing.length || extra.length) {
    const what = [missing.length ? `missing code(s) ${missing.join(', ')}` : '', extra.length ? `unknown code(s) ${extra.join(', ')}` : ''].filter(Boolean).join('; ');
    const hint = probe.kind === 'counts' ? `probe ${probe.serial} has gain codes ${expected.join(', ')}` : `${probe.kind === 'manual' ? 'a hand-held meter' : 'an analog probe'} takes one row with code 0 (its calibration uncertainty)`;
    throw unprocessable(`The coefficients do not match the probe: ${what} (${hint})`, [{ path: 'gains', message: what }]);
  }
}

/** Drafts a new version from typed-in values or from a stored bench run's fit. */
export function createCoefficientSetDraft(deps: Deps, user: SessionUser, probeId: number, body: CreateCoefficientSetBody): CoefficientSetDto {
  const probe = findProbe(deps.db, user, probeId);
  if (probe.status === 'retired') throw conflict(`Probe ${probe.serial} is retired; it takes no new coefficient sets`);
  let values: Pick<SetRow, 'tRefMs' | 'alphaPerK' | 'tCalC' | 'gains' | 'benchRunId'>;
  if (body.source === 'bench_run') {
    const run = benchRunFit(deps, user, body.benchRunId);
    if (run.probeId !== probe.id) throw unprocessable(`Bench run ${body.benchRunId} belongs to another probe`, [{ path: 'benchRunId', message: 'Choose a bench run of this probe' }]);
    const gains = run.fit.draft.map((g) => ({ code: g.code, darkCounts: g.darkCounts, luxPerCount: g.luxPerCount, uRel: g.uRel, ...(g.uDarkCounts !== undefined ? { uDarkCounts: g.uDarkCounts } : {}) }));
    checkGainsCoverProbe(probe, gains);
    values = { tRefMs: run.fit.options.tRefMs, alphaPerK: run.fit.options.alphaPerK, tCalC: run.fit.options.tCalC, gains, benchRunId: body.benchRunId };
  } else {
    checkGainsCoverProbe(probe, body.gains);
    values = { tRefMs: body.tRefMs, alphaPerK: body.alphaPerK, tCalC: body.tCalC, gains: [...body.gains].sort((a, b) => a.code - b.code), benchRunId: null };
  }
  const now = deps.clock.now();
  const id = deps.db.transaction((tx) => {
    const last = tx.select({ v: sql<number>`coalesce(max(${coefficientSets.version}), 0)` }).from(coefficientSets).where(eq(coefficientSets.probeId, probe.id)).get()!.v;
    const row = tx.insert(coefficientSets).values({
      probeId: probe.id, version: last + 1, status: 'draft', effectiveFrom: Date.parse(body.effectiveFrom), dueDate: Date.parse(body.dueDate),
      ...values, certificateNumber: body.certificateNumber.trim(), note: body.note ?? '', draftedBy: user.id, createdAt: now,
    }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'coefficient_set', entityId: row.id, probeId: probe.id, action: 'drafted', after: auditView(row), at: now });
    return row.id;
  });
  return getSet(deps, user, id);
}

/** Approval by a second person (four-eyes). After it the set never changes. */
export function approveCoefficientSet(deps: Deps, user: SessionUser, setId: number): CoefficientSetDto {
  const { set, probe } = findSet(deps, user, setId);
  if (set.status === 'approved') throw conflict(`Version ${set.version} is already approved; approved sets never change (draft a new version to correct it)`);
  if (set.draftedBy === user.id) throw fourEyes('Four-eyes rule: a coefficient set must be approved by someone other than the person who drafted it; ask a colleague in calibration or an administrator');
  if (probe.status === 'retired') throw conflict(`Probe ${probe.serial} is retired; its drafts cannot be approved`);
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    const after = tx.update(coefficientSets).set({ status: 'approved', approvedBy: user.id, approvedAt: now })
      .where(and(eq(coefficientSets.id, set.id), eq(coefficientSets.status, 'draft'))).returning().get();
    if (!after) throw conflict('Someone else approved or discarded this draft a moment ago; reload');
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'coefficient_set', entityId: set.id, probeId: probe.id, action: 'approved', before: auditView(set), after: auditView(after), at: now });
  });
  return getSet(deps, user, setId);
}

/** Discards a draft (recorded); an approved set cannot be removed. */
export function discardCoefficientSetDraft(deps: Deps, user: SessionUser, setId: number): void {
  const { set, probe } = findSet(deps, user, setId);
  if (set.status === 'approved') throw conflict(`Version ${set.version} is approved; approved sets are kept for ever (draft a new version to supersede it)`);
  deps.db.transaction((tx) => {
    tx.delete(coefficientSets).where(and(eq(coefficientSets.id, set.id), eq(coefficientSets.status, 'draft'))).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'coefficient_set', entityId: set.id, probeId: probe.id, action: 'discarded', before: auditView(set), at: deps.clock.now() });
  });
}

/** Attaches the certificate PDF to a draft (checked by content); approved sets are immutable. */
export async function attachCertificate(deps: Deps, user: SessionUser, setId: number, file: { path: string; originalname: string }): Promise<CoefficientSetDto> {
  try {
    const { set, probe } = findSet(deps, user, setId);
    if (set.status === 'approved') throw conflict(`Version ${set.version} is approved and cannot change; attach the certificate to a new draft`);
    const contentType = await sniffFile(file.path, 'pdf');
    const stored = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: file.path, filename: file.originalname || 'certificate.pdf', contentType });
    const now = deps.clock.now();
    deps.db.transaction((tx) => {
      const after = tx.update(coefficientSets).set({ certificateFileId: stored.id })
        .where(and(eq(coefficientSets.id, set.id), eq(coefficientSets.status, 'draft'))).returning().get();
      if (!after) throw conflict('This draft was approved or discarded a moment ago; reload');
      recordAudit(tx, {
        organizationId: user.organizationId, actorId: user.id, entityType: 'coefficient_set', entityId: set.id, probeId: probe.id, action: 'certificate_attached',
        before: { certificateFileId: set.certificateFileId }, after: { certificateFileId: stored.id, filename: stored.filename, sha256: stored.sha256, size: stored.size }, at: now,
      });
    });
    return getSet(deps, user, setId);
  } finally {
    fs.rmSync(file.path, { force: true });
  }
}

export function certificateFile(deps: Deps, user: SessionUser, setId: number) {
  const { set } = findSet(deps, user, setId);
  if (set.certificateFileId === null) throw notFound('Certificate of this set');
  const file = deps.db.select().from(storedFiles).where(and(eq(storedFiles.id, set.certificateFileId), eq(storedFiles.organizationId, user.organizationId))).get();
  if (!file) throw notFound('Certificate file');
  return { path: storedPath(deps, file.sha256), filename: file.filename };
}
