import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { coefficientSets, probes } from '../../db/schema/calibration';
import type { SessionUser } from '@shared/schemas/auth';
import { can } from '@shared/policy';
import {
  DASHBOARD_DUE_SOON_DAYS, probeFieldIssues, probeFieldsSchema,
  type CreateProbeBody, type ProbeDto, type ProbeFields, type ProbeStatus, type UpdateProbeBody,
} from '@shared/schemas/probes';
import { badRequest, conflict, notFound } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { probesWithCalibration } from './calibration-state';

export type ProbeRow = typeof probes.$inferSelect;

const iso = (ms: number) => new Date(ms).toISOString();

/** Without probes.read_all (surveyors) only the probes one may use, in service, are visible; null: all. */
export function visibleStatuses(user: SessionUser): ProbeStatus[] | null {
  return can(user.role, 'probes.read_all') ? null : ['in_service'];
}

/** The probe if it belongs to the caller's organisation and the caller may see it; else 404. */
export function findProbe(db: Db, user: SessionUser, probeId: number): ProbeRow {
  const row = db.select().from(probes).where(and(eq(probes.id, probeId), eq(probes.organizationId, user.organizationId))).get();
  const statuses = visibleStatuses(user);
  if (!row || (statuses && !statuses.includes(row.status))) throw notFound('Probe');
  return row;
}

/** The fields of a stored probe that the API exposes and the audit trail records. */
function probeFields(row: ProbeRow): ProbeFields {
  return {
    serial: row.serial, kind: row.kind, description: row.description, status: row.status,
    fullScaleCounts: row.fullScaleCounts, saturationCounts: row.saturationCounts, floorCounts: row.floorCounts,
    gains: row.gains, rangeLowLux: row.rangeLowLux, rangeHighLux: row.rangeHighLux, scale: row.scale, accuracyPercent: row.accuracyPercent,
    meterClass: row.meterClass,
  };
}

/** Keeps only the fields of the probe's kind (a counting probe has no analog range, and back). */
function kindFields(p: ProbeFields) {
  const counting = p.kind === 'counts';
  const analog = p.kind === 'current_4_20' || p.kind === 'voltage_0_10';
  return {
    fullScaleCounts: counting ? p.fullScaleCounts ?? null : null,
    saturationCounts: counting ? p.saturationCounts ?? null : null,
    floorCounts: counting ? p.floorCounts ?? null : null,
    gains: counting ? [...(p.gains ?? [])].sort((a, b) => a.code - b.code) : null,
    rangeLowLux: counting ? null : p.rangeLowLux ?? null,
    rangeHighLux: counting ? null : p.rangeHighLux ?? null,
    scale: analog ? p.scale ?? null : null,
    accuracyPercent: analog ? p.accuracyPercent ?? null : null,
    meterClass: p.kind === 'manual' ? p.meterClass ?? null : null,
  };
}

function presentProbes(deps: Deps, rows: ProbeRow[]): ProbeDto[] {
  return probesWithCalibration(deps, rows, DASHBOARD_DUE_SOON_DAYS).map(({ probe: r, sets, status, current }) => ({
    id: r.id,
    serial: r.serial, kind: r.kind, description: r.description, status: r.status,
    fullScaleCounts: r.fullScaleCounts, saturationCounts: r.saturationCounts, floorCounts: r.floorCounts, gains: r.gains,
    rangeLowLux: r.rangeLowLux, rangeHighLux: r.rangeHighLux, scale: r.scale, accuracyPercent: r.accuracyPercent, meterClass: r.meterClass,
    currentSet: current ? { id: current.id, version: current.version, effectiveFrom: iso(current.effectiveFrom), dueDate: iso(current.dueDate), certificateNumber: current.certificateNumber } : null,
    calibrationState: status.state,
    draftCount: sets.filter((s) => s.status === 'draft').length,
    createdAt: iso(r.createdAt),
    updatedAt: iso(r.updatedAt),
  }));
}

export function listProbes(deps: Deps, user: SessionUser, filter: { status?: ProbeStatus; kind?: ProbeRow['kind'] }): ProbeDto[] {
  const statuses = visibleStatuses(user);
  const rows = deps.db.select().from(probes).where(and(
    eq(probes.organizationId, user.organizationId),
    filter.status ? eq(probes.status, filter.status) : undefined,
    filter.kind ? eq(probes.kind, filter.kind) : undefined,
    statuses ? inArray(probes.status, statuses) : undefined,
  )).orderBy(asc(probes.serial)).all();
  return presentProbes(deps, rows);
}

export function getProbe(deps: Deps, user: SessionUser, probeId: number): ProbeDto {
  return presentProbes(deps, [findProbe(deps.db, user, probeId)])[0];
}

function assertSerialFree(db: Db, organizationId: number, serial: string, exceptId?: number) {
  const clash = db.select({ id: probes.id }).from(probes).where(and(eq(probes.organizationId, organizationId), eq(probes.serial, serial))).get();
  if (clash && clash.id !== exceptId) throw conflict(`A probe with serial ${serial} already exists in this organisation`, { field: 'serial' });
}

export function createProbe(deps: Deps, user: SessionUser, body: CreateProbeBody): ProbeDto {
  const fields = probeFieldsSchema.parse(body);
  if (fields.status === 'retired') throw badRequest('A new probe cannot start retired', [{ path: 'status', message: 'Choose in service or out of service' }]);
  assertSerialFree(deps.db, user.organizationId, fields.serial);
  const now = deps.clock.now();
  const id = deps.db.transaction((tx) => {
    const row = tx.insert(probes).values({
      organizationId: user.organizationId, serial: fields.serial, kind: fields.kind, description: fields.description, status: fields.status,
      ...kindFields(fields), createdAt: now, updatedAt: now,
    }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'probe', entityId: row.id, probeId: row.id, action: 'created', after: probeFields(row), at: now });
    return row.id;
  });
  return getProbe(deps, user, id);
}

/** Changes a probe. Gain codes and kind are frozen once a coefficient set refers to them; retirement is final. */
export function updateProbe(deps: Deps, user: SessionUser, probeId: number, body: UpdateProbeBody): ProbeDto {
  const before = findProbe(deps.db, user, probeId);
  if (before.status === 'retired') throw conflict(`Probe ${before.serial} is retired; a retired probe is not changed (register a new probe instead)`);
  const merged: ProbeFields = { ...probeFields(before), ...body } as ProbeFields;
  const issues = probeFieldIssues(merged);
  if (issues.length) throw badRequest(`Invalid body field "${issues[0].path}": ${issues[0].message}`, issues.map((i) => ({ part: 'body', ...i })));
  if (merged.serial !== before.serial) assertSerialFree(deps.db, user.organizationId, merged.serial, before.id);
  const hasSets = deps.db.select({ id: coefficientSets.id }).from(coefficientSets).where(eq(coefficientSets.probeId, before.id)).limit(1).get() !== undefined;
  if (hasSets) {
    if (merged.kind !== before.kind) throw conflict('The kind cannot change once the probe has coefficient sets; register a new probe instead');
    const codes = (g: ProbeFields['gains']) => (g ?? []).map((x) => x.code).sort((a, b) => a - b).join(',');
    if (codes(merged.gains) !== codes(before.gains)) {
      throw conflict('The gain codes cannot change once the probe has coefficient sets (nominal gains may); register a new probe for a different amplifier');
    }
  }
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    const after = tx.update(probes).set({
      serial: merged.serial, kind: merged.kind, description: merged.description ?? '', status: merged.status ?? before.status,
      ...kindFields(merged), updatedAt: now,
    }).where(eq(probes.id, before.id)).returning().get();
    const action = after.status === 'retired' ? 'retired' : after.status !== before.status ? 'status_changed' : 'updated';
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'probe', entityId: before.id, probeId: before.id, action, before: probeFields(before), after: probeFields(after), at: now });
  });
  return getProbe(deps, user, probeId);
}
