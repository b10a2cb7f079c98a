import { and, asc, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import type { SessionUser } from '@shared/schemas/auth';
import type { UpdateZoneBody, Zone, ZoneBody } from '@shared/schemas/zones';
import { polygonAreaM2, validatePolygon, type PlanPoint } from '@shared/spatial/polygon';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { findVisiblePlan, planExtent } from '../plans/plans-service';

type ZoneRow = typeof zones.$inferSelect;

function present(z: ZoneRow): Zone {
  return {
    id: z.id, planId: z.planId, name: z.name, kind: z.kind, useType: z.useType, targetId: z.targetId,
    planeHeightM: z.planeHeightM, wallBandM: z.wallBandM, polygon: z.polygon, areaM2: polygonAreaM2(z.polygon),
    createdAt: new Date(z.createdAt).toISOString(),
  };
}

function findVisibleZone(db: Db, user: SessionUser, zoneId: number) {
  const zone = db.select().from(zones).where(eq(zones.id, zoneId)).get();
  if (!zone) throw notFound('Zone');
  try {
    return { zone, plan: findVisiblePlan(db, user, zone.planId) };
  } catch {
    throw notFound('Zone');
  }
}

/** Checks the outline against the plan: 422 naming every problem; the plan needs a scale first. */
function checkedPolygon(plan: typeof plans.$inferSelect, polygon: PlanPoint[]): PlanPoint[] {
  const extent = planExtent(plan);
  if (!extent) throw conflict('Set the plan\'s scale before drawing zones: zone corners are in metres');
  const check = validatePolygon(polygon, extent);
  if (!check.ok) throw unprocessable(`Invalid zone outline: ${check.problems.join('; ')}`, { problems: check.problems });
  return check.polygon;
}

export function listZones(db: Db, user: SessionUser, planId: number): Zone[] {
  findVisiblePlan(db, user, planId);
  return db.select().from(zones).where(eq(zones.planId, planId)).orderBy(asc(zones.id)).all().map(present);
}

export function createZone(deps: Deps, user: SessionUser, planId: number, body: ZoneBody): Zone {
  const plan = findVisiblePlan(deps.db, user, planId);
  const polygon = checkedPolygon(plan, body.polygon);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const z = tx.insert(zones).values({ planId, name: body.name, kind: body.kind, useType: body.useType, planeHeightM: body.planeHeightM, wallBandM: body.wallBandM, polygon, createdAt: now }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'zone', entityId: z.id, action: 'created', after: { ...body, polygon, planId }, at: now });
    return z;
  });
  return present(row);
}

export function updateZone(deps: Deps, user: SessionUser, zoneId: number, body: UpdateZoneBody): Zone {
  const { zone, plan } = findVisibleZone(deps.db, user, zoneId);
  const polygon = body.polygon ? checkedPolygon(plan, body.polygon) : undefined;
  const set = { ...body, ...(polygon ? { polygon } : {}) };
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(zones).set(set).where(and(eq(zones.id, zoneId), eq(zones.planId, plan.id))).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'zone', entityId: zoneId, action: 'updated', before: present(zone), after: set, at: now });
  });
  return present(deps.db.select().from(zones).where(eq(zones.id, zoneId)).get()!);
}

export function deleteZone(deps: Deps, user: SessionUser, zoneId: number): void {
  const { zone } = findVisibleZone(deps.db, user, zoneId);
  deps.db.transaction((tx) => {
    tx.delete(zones).where(eq(zones.id, zoneId)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'zone', entityId: zoneId, action: 'deleted', before: present(zone), at: deps.clock.now() });
  });
}
