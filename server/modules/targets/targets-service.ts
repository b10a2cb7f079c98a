import { and, asc, eq, inArray, isNull, or } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { targets } from '../../db/schema/targets';
import { plans, zones } from '../../db/schema/plans';
import { sites } from '../../db/schema/sites';
import { luxToFootcandles } from '@shared/core/units';
import type { SessionUser } from '@shared/schemas/auth';
import type { CreateTargetBody, SetZoneTargetBody, TargetEntry, UpdateTargetBody, ZoneTargetResponse } from '@shared/schemas/targets';
import { designValue, designValueProblems } from '@shared/core/illuminance-scale';
import { badRequest, conflict, forbidden, notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { emToLux, SHIPPED_TARGETS } from './target-library';
import { SURFACE_U0_MIN } from '@shared/core/planes';

export type TargetRow = typeof targets.$inferSelect;

export function presentTarget(row: TargetRow): TargetEntry {
  return {
    id: row.id,
    useType: row.useType,
    name: row.name,
    emLux: row.emLux,
    sourceUnit: row.sourceUnit,
    // Round away float noise of the fc -> lx -> fc trip (the stored lux came from the fc value).
    emSourceValue: row.sourceUnit === 'fc' ? Number(luxToFootcandles(row.emLux).toPrecision(10)) : row.emLux,
    u0Min: row.u0Min,
    emModifiedLux: row.emModifiedLux,
    ezLux: row.ezLux,
    emWallLux: row.emWallLux,
    emCeilingLux: row.emCeilingLux,
    surfaceU0Min: SURFACE_U0_MIN,
    ra: row.ra,
    rugl: row.rugl,
    ...(row.dfTargetPercent !== null ? { dfTargetPercent: row.dfTargetPercent } : {}),
    source: row.source,
    confidence: row.confidence,
    shipped: row.organizationId === null,
  };
}

const visibleTo = (organizationId: number) => or(isNull(targets.organizationId), eq(targets.organizationId, organizationId));

/** Shipped entries and the organisation's own, own entries first within a use type. */
export function listTargets(db: Db, organizationId: number): TargetEntry[] {
  return db.select().from(targets).where(visibleTo(organizationId)).orderBy(asc(targets.useType), asc(targets.id)).all()
    .sort((a, b) => a.useType.localeCompare(b.useType) || Number(a.organizationId === null) - Number(b.organizationId === null))
    .map(presentTarget);
}

export function getVisibleTarget(db: Db, organizationId: number, id: number): TargetRow | undefined {
  return db.select().from(targets).where(and(eq(targets.id, id), visibleTo(organizationId))).get();
}

function assertUseTypeFree(db: Db, organizationId: number, useType: string, exceptId?: number) {
  const clash = db.select({ id: targets.id }).from(targets).where(and(eq(targets.organizationId, organizationId), eq(targets.useType, useType))).all()
    .find((r) => r.id !== exceptId);
  if (clash) throw conflict(`Your organisation already has an entry for use type "${useType}" (target ${clash.id}); edit that one instead`, { targetId: clash.id });
}

export function createTarget(deps: Deps, actor: SessionUser, body: CreateTargetBody): TargetEntry {
  assertUseTypeFree(deps.db, actor.organizationId, body.useType);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const created = tx.insert(targets).values({
      organizationId: actor.organizationId, useType: body.useType, name: body.name, emLux: emToLux(body.emValue, body.sourceUnit),
      sourceUnit: body.sourceUnit, u0Min: body.u0Min, dfTargetPercent: body.dfTargetPercent, source: body.source, confidence: body.confidence, createdAt: now,
      emModifiedLux: body.emModifiedLux, ezLux: body.ezLux, emWallLux: body.emWallLux, emCeilingLux: body.emCeilingLux, ra: body.ra, rugl: body.rugl,
    }).returning().get();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'target', entityId: created.id, action: 'created', after: created, at: now });
    return created;
  });
  return presentTarget(row);
}

export function updateTarget(deps: Deps, actor: SessionUser, id: number, body: UpdateTargetBody): TargetEntry {
  const before = getVisibleTarget(deps.db, actor.organizationId, id);
  if (!before) throw notFound('Target');
  if (before.organizationId === null) {
    throw forbidden('Shipped library entries are read-only; add your own entry for this use type (e.g. a client\'s specification) instead');
  }
  if (body.useType && body.useType !== before.useType) assertUseTypeFree(deps.db, actor.organizationId, body.useType, id);
  const unit = body.sourceUnit ?? before.sourceUnit;
  // Changing only the unit keeps the stated value: 30 lx becomes 30 fc, as the admin sees it.
  const emValue = body.emValue ?? presentTarget(before).emSourceValue;
  const set = {
    ...(body.useType !== undefined ? { useType: body.useType } : {}),
    ...(body.name !== undefined ? { name: body.name } : {}),
    ...(body.emValue !== undefined || body.sourceUnit !== undefined ? { emLux: emToLux(emValue, unit), sourceUnit: unit } : {}),
    ...(body.u0Min !== undefined ? { u0Min: body.u0Min } : {}),
    ...(body.dfTargetPercent !== undefined ? { dfTargetPercent: body.dfTargetPercent } : {}),
    ...(body.emModifiedLux !== undefined ? { emModifiedLux: body.emModifiedLux } : {}),
    ...(body.ezLux !== undefined ? { ezLux: body.ezLux } : {}),
    ...(body.emWallLux !== undefined ? { emWallLux: body.emWallLux } : {}),
    ...(body.emCeilingLux !== undefined ? { emCeilingLux: body.emCeilingLux } : {}),
    ...(body.ra !== undefined ? { ra: body.ra } : {}),
    ...(body.rugl !== undefined ? { rugl: body.rugl } : {}),
    ...(body.source !== undefined ? { source: body.source } : {}),
    ...(body.confidence !== undefined ? { confidence: body.confidence } : {}),
  };
  const newEm = set.emLux ?? before.emLux;
  const newModified = set.emModifiedLux !== undefined ? set.emModifiedLux : before.emModifiedLux;
  if (newModified !== null && newModified < newEm) {
    throw badRequest(`The modified value ${newModified} lx cannot be below the required value Em ${Number(newEm.toPrecision(6))} lx`, { field: 'emModifiedLux' });
  }
  const row = deps.db.transaction((tx) => {
    const after = tx.update(targets).set(set).where(eq(targets.id, id)).returning().get();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'target', entityId: id, action: 'updated', before, after, at: deps.clock.now() });
    return after;
  });
  return presentTarget(row);
}

/** A zone of the caller's organisation (zone -> plan -> site), or 404. */
export function getOrganizationZone(db: Db, organizationId: number, zoneId: number) {
  return db.select({ zone: zones, siteId: plans.siteId }).from(zones)
    .innerJoin(plans, eq(plans.id, zones.planId)).innerJoin(sites, eq(sites.id, plans.siteId))
    .where(and(eq(zones.id, zoneId), eq(sites.organizationId, organizationId))).get();
}

/**
 * The entry a zone is judged against: the zone's chosen entry if it has one, else the
 * organisation's own entry for its use type, else the shipped one; undefined when none exists.
 */
export function resolveZoneTarget(db: Db, organizationId: number, zone: { useType: string; targetId: number | null }): TargetRow | undefined {
  return resolveZoneTargets(db, organizationId, [zone])[0];
}

/**
 * resolveZoneTarget for many zones with one query (the verdicts' inputs resolve every zone of a
 * site on each request): the entries visible to the organisation that any of the zones could take.
 */
export function resolveZoneTargets(db: Db, organizationId: number, zoneList: readonly { useType: string; targetId: number | null }[]): (TargetRow | undefined)[] {
  if (zoneList.length === 0) return [];
  const useTypes = [...new Set(zoneList.map((z) => z.useType))];
  const chosenIds = [...new Set(zoneList.flatMap((z) => (z.targetId === null ? [] : [z.targetId])))];
  const visible = db.select().from(targets)
    .where(and(visibleTo(organizationId), chosenIds.length ? or(inArray(targets.useType, useTypes), inArray(targets.id, chosenIds)) : inArray(targets.useType, useTypes)))
    .orderBy(asc(targets.id)).all();
  return pickZoneTargets(visible, organizationId, zoneList);
}

/** The resolution itself, from the entries visible to the organisation (in id order). */
export function pickZoneTargets(visible: readonly TargetRow[], organizationId: number, zoneList: readonly { useType: string; targetId: number | null }[]): (TargetRow | undefined)[] {
  const byId = new Map(visible.map((t) => [t.id, t]));
  return zoneList.map((zone) => {
    const chosen = zone.targetId === null ? undefined : byId.get(zone.targetId);
    if (chosen) return chosen;
    const candidates = visible.filter((t) => t.useType === zone.useType);
    return candidates.find((t) => t.organizationId === organizationId) ?? candidates.find((t) => t.organizationId === null);
  });
}

/** The value a zone is judged against (EN 12464-1:2021 required / modified, shared/core designValue). */
export function zoneDesignValue(target: TargetRow, zone: { chosenEmLux: number | null; contextModifiers: string[] }) {
  return designValue({ requiredLux: target.emLux, modifiedLux: target.emModifiedLux, chosenLux: zone.chosenEmLux, modifiers: zone.contextModifiers });
}

export function zoneTarget(db: Db, organizationId: number, zoneId: number): ZoneTargetResponse {
  const found = getOrganizationZone(db, organizationId, zoneId);
  if (!found) throw notFound('Zone');
  const z = found.zone;
  const target = resolveZoneTarget(db, organizationId, z);
  return {
    zoneId, useType: z.useType, targetId: z.targetId, target: target ? presentTarget(target) : null,
    chosenEmLux: z.chosenEmLux, contextModifiers: z.contextModifiers, contextNote: z.contextNote,
    design: target ? zoneDesignValue(target, z) : null,
  };
}

/**
 * Chooses which library entry a zone is judged against and the value its design chose with the
 * context modifiers behind it (signed-off surveys keep what they froze). A chosen value the entry
 * does not allow answers 422 naming why.
 */
export function setZoneTarget(deps: Deps, actor: SessionUser, zoneId: number, body: SetZoneTargetBody): ZoneTargetResponse {
  const found = getOrganizationZone(deps.db, actor.organizationId, zoneId);
  if (!found) throw notFound('Zone');
  const { targetId, chosenEmLux, contextModifiers, contextNote } = body;
  if (targetId !== null && !getVisibleTarget(deps.db, actor.organizationId, targetId)) {
    throw badRequest(`Target ${targetId} is not in your organisation's library`, { targetId });
  }
  if (chosenEmLux !== null) {
    const target = resolveZoneTarget(deps.db, actor.organizationId, { useType: found.zone.useType, targetId });
    if (!target) throw unprocessable(`Zone ${zoneId} has no library entry, so it has no required value to step from`, { field: 'chosenEmLux' });
    const problems = designValueProblems({ requiredLux: target.emLux, modifiedLux: target.emModifiedLux, chosenLux: chosenEmLux, modifiers: contextModifiers });
    if (problems.length > 0) throw unprocessable(`The chosen value ${chosenEmLux} lx cannot be used with "${target.name}": ${problems.join(' ')}`, { field: 'chosenEmLux', problems });
  }
  const before = { targetId: found.zone.targetId, chosenEmLux: found.zone.chosenEmLux, contextModifiers: found.zone.contextModifiers, contextNote: found.zone.contextNote };
  const after = { targetId, chosenEmLux, contextModifiers, contextNote };
  deps.db.transaction((tx) => {
    tx.update(zones).set(after).where(eq(zones.id, zoneId)).run();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'zone', entityId: zoneId, action: 'target_chosen', before, after, at: deps.clock.now() });
  });
  return zoneTarget(deps.db, actor.organizationId, zoneId);
}

/** Inserts the shipped library once (entries without an organisation); returns how many were added. */
export function seedShippedTargets(db: Db, now: number): number {
  const existing = new Set(db.select({ useType: targets.useType }).from(targets).where(isNull(targets.organizationId)).all().map((r) => r.useType));
  const missing = SHIPPED_TARGETS.filter((t) => !existing.has(t.useType));
  if (missing.length) {
    db.insert(targets).values(missing.map((t) => ({
      organizationId: null, useType: t.useType, name: t.name, emLux: emToLux(t.em, t.sourceUnit), sourceUnit: t.sourceUnit,
      u0Min: t.u0Min, dfTargetPercent: t.dfTargetPercent, source: t.source, confidence: t.confidence, createdAt: now, ...(t.en2021 ?? {}),
    }))).run();
  }
  return missing.length;
}
