import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { emergencyElements, emergencyResponses } from '../../db/schema/emergency';
import type { SessionUser } from '@shared/schemas/auth';
import { emergencyElementBodySchema, type EmergencyElement, type EmergencyElementBody, type ParsedElementBody, type PlannedPointDto } from '@shared/schemas/emergency';
import { polygonAreaM2, validatePolygon, type PlanPoint } from '@shared/spatial/polygon';
import { plannedAreaPoints, plannedRoutePoints, polylineLength } from '@shared/spatial/emergency-points';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { findVisiblePlan, planExtent } from '../plans/plans-service';
import { resolveZoneTarget } from '../targets/targets-service';

export type ElementRow = typeof emergencyElements.$inferSelect;

/** Planned points of an element (shared/spatial: centre line and band at the spacing, area grid less the border). */
export function plannedPointsOf(e: Pick<ElementRow, 'kind' | 'code' | 'geometry' | 'widthM' | 'borderM' | 'spacingM'>): PlannedPointDto[] {
  switch (e.kind) {
    case 'escape_route': return plannedRoutePoints(e.code, e.geometry, e.widthM ?? 0, e.spacingM ?? 2);
    case 'open_area': return plannedAreaPoints(e.code, e.geometry, e.borderM ?? 0.5, e.spacingM ?? 2);
    case 'high_risk_area': return plannedAreaPoints(e.code, e.geometry, 0, e.spacingM ?? 1);
    case 'safety_equipment': return [{ label: `${e.code}-E01`, role: 'equipment', xM: e.geometry[0][0], yM: e.geometry[0][1] }];
  }
}

/** Planned points of an element body before it is stored (the demo log is simulated from them). */
export function plannedPointsOfBody(input: EmergencyElementBody): PlannedPointDto[] {
  const b = emergencyElementBodySchema.parse(input);
  const geometry = b.kind === 'escape_route' ? b.line : b.kind === 'safety_equipment' ? [b.point] : b.polygon;
  return plannedPointsOf({
    kind: b.kind, code: b.code, geometry, widthM: b.kind === 'escape_route' ? b.widthM : null,
    borderM: b.kind === 'open_area' ? b.borderM : null, spacingM: b.kind === 'safety_equipment' ? null : b.spacingM,
  });
}

/** The normal lighting's maintained illuminance a high-risk area is judged against: its own figure, else its zone's target. */
export function effectiveNormalEmLux(db: Db, organizationId: number, e: Pick<ElementRow, 'normalEmLux' | 'normalZoneId'>): number | null {
  if (e.normalEmLux !== null) return e.normalEmLux;
  if (e.normalZoneId === null) return null;
  const zone = db.select().from(zones).where(eq(zones.id, e.normalZoneId)).get();
  if (!zone) return null;
  return resolveZoneTarget(db, organizationId, zone)?.emLux ?? null;
}

export function presentElement(db: Db, organizationId: number, e: ElementRow): EmergencyElement {
  return {
    id: e.id, planId: e.planId, kind: e.kind, code: e.code, name: e.name, geometry: e.geometry, widthM: e.widthM, stair: e.stair,
    borderM: e.borderM, spacingM: e.spacingM, normalEmLux: e.normalEmLux, normalZoneId: e.normalZoneId,
    effectiveNormalEmLux: e.kind === 'high_risk_area' ? effectiveNormalEmLux(db, organizationId, e) : null,
    equipment: e.equipment,
    lengthM: e.kind === 'escape_route' ? polylineLength(e.geometry) : e.kind === 'safety_equipment' ? null : polygonAreaM2(e.geometry),
    plannedPoints: plannedPointsOf(e),
    createdAt: new Date(e.createdAt).toISOString(),
  };
}

/** The columns an element body sets, after checking its geometry against the plan (422 naming each problem). */
function checkedValues(db: Db, plan: typeof plans.$inferSelect, body: ParsedElementBody) {
  const extent = planExtent(plan);
  if (!extent) throw conflict('Set the plan\'s scale before drawing emergency routes and areas: they are in metres');
  const outside = (points: PlanPoint[]) => points.map((p, i) => ({ p, i })).filter(({ p }) => p[0] < -1e-6 || p[1] < -1e-6 || p[0] > extent.widthM + 1e-6 || p[1] > extent.heightM + 1e-6)
    .map(({ p, i }) => `Point ${i + 1} (${p[0]}, ${p[1]}) m lies outside the plan (0 to ${extent.widthM.toFixed(2)} m across, 0 to ${extent.heightM.toFixed(2)} m up)`);
  const base = { kind: body.kind, code: body.code, name: body.name };
  switch (body.kind) {
    case 'escape_route': {
      const problems = outside(body.line);
      if (polylineLength(body.line) < 0.1) problems.push('The centre line is shorter than 0.1 m');
      if (problems.length) throw unprocessable(`Invalid escape route: ${problems.join('; ')}`, { problems });
      return { ...base, geometry: body.line, widthM: body.widthM, stair: body.stair, borderM: null, spacingM: body.spacingM, normalEmLux: null, normalZoneId: null, equipment: null };
    }
    case 'open_area':
    case 'high_risk_area': {
      const check = validatePolygon(body.polygon, extent);
      if (!check.ok) throw unprocessable(`Invalid area outline: ${check.problems.join('; ')}`, { problems: check.problems });
      if (body.kind === 'open_area') return { ...base, geometry: check.polygon, widthM: null, stair: false, borderM: body.borderM, spacingM: body.spacingM, normalEmLux: null, normalZoneId: null, equipment: null };
      if (body.normalEmLux === null && body.normalZoneId === null) throw unprocessable('A high-risk task area names the normal lighting\'s maintained illuminance (normalEmLux) or the zone whose target gives it (normalZoneId)', { problems: ['normalEmLux or normalZoneId is required'] });
      if (body.normalZoneId !== null) {
        const zone = db.select().from(zones).where(and(eq(zones.id, body.normalZoneId), eq(zones.planId, plan.id))).get();
        if (!zone) throw unprocessable(`Zone ${body.normalZoneId} is not a zone of plan "${plan.name}"`, { problems: ['normalZoneId names no zone of this plan'] });
      }
      return { ...base, geometry: check.polygon, widthM: null, stair: false, borderM: 0, spacingM: body.spacingM, normalEmLux: body.normalEmLux, normalZoneId: body.normalZoneId, equipment: null };
    }
    case 'safety_equipment': {
      const problems = outside([body.point]);
      if (problems.length) throw unprocessable(`Invalid safety-equipment point: ${problems.join('; ')}`, { problems });
      return { ...base, geometry: [body.point], widthM: null, stair: false, borderM: null, spacingM: null, normalEmLux: null, normalZoneId: null, equipment: body.equipment };
    }
  }
}

function assertCodeFree(db: Db, planId: number, code: string, exceptId?: number) {
  const clash = db.select({ id: emergencyElements.id, name: emergencyElements.name }).from(emergencyElements)
    .where(and(eq(emergencyElements.planId, planId), eq(emergencyElements.code, code))).all().find((r) => r.id !== exceptId);
  if (clash) throw conflict(`Code "${code}" is already used by "${clash.name}" on this plan: point labels start with it, so each element needs its own`);
}

export function listElements(db: Db, user: SessionUser, planId: number): EmergencyElement[] {
  findVisiblePlan(db, user, planId);
  return db.select().from(emergencyElements).where(eq(emergencyElements.planId, planId)).orderBy(asc(emergencyElements.id)).all().map((e) => presentElement(db, user.organizationId, e));
}

/** Elements of all the given plans (a site's), for judging. */
export function elementsOfPlans(db: Db, planIds: number[]): ElementRow[] {
  if (planIds.length === 0) return [];
  return db.select().from(emergencyElements).where(inArray(emergencyElements.planId, planIds)).orderBy(asc(emergencyElements.id)).all();
}

function findVisibleElement(db: Db, user: SessionUser, id: number) {
  const e = db.select().from(emergencyElements).where(eq(emergencyElements.id, id)).get();
  if (!e) throw notFound('Emergency element');
  try {
    return { element: e, plan: findVisiblePlan(db, user, e.planId) };
  } catch {
    throw notFound('Emergency element');
  }
}

export function createElement(deps: Deps, user: SessionUser, planId: number, input: EmergencyElementBody): EmergencyElement {
  const plan = findVisiblePlan(deps.db, user, planId);
  const body = emergencyElementBodySchema.parse(input);
  const values = checkedValues(deps.db, plan, body);
  assertCodeFree(deps.db, planId, values.code);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const e = tx.insert(emergencyElements).values({ planId, ...values, createdAt: now }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_element', entityId: e.id, action: 'created', after: { planId, ...values }, at: now });
    return e;
  });
  return presentElement(deps.db, user.organizationId, row);
}

/** Replaces an element's definition (same kind); its planned points follow. */
export function updateElement(deps: Deps, user: SessionUser, id: number, input: EmergencyElementBody): EmergencyElement {
  const { element, plan } = findVisibleElement(deps.db, user, id);
  const body = emergencyElementBodySchema.parse(input);
  if (body.kind !== element.kind) throw unprocessable(`An element keeps its kind (${element.kind}); delete it and draw a new one to change it`, { problems: ['kind cannot change'] });
  const values = checkedValues(deps.db, plan, body);
  assertCodeFree(deps.db, plan.id, values.code, id);
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(emergencyElements).set(values).where(eq(emergencyElements.id, id)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_element', entityId: id, action: 'updated', before: element, after: values, at: now });
  });
  return presentElement(deps.db, user.organizationId, deps.db.select().from(emergencyElements).where(eq(emergencyElements.id, id)).get()!);
}

export function deleteElement(deps: Deps, user: SessionUser, id: number): void {
  const { element } = findVisibleElement(deps.db, user, id);
  const held = deps.db.select({ id: emergencyResponses.id }).from(emergencyResponses).where(eq(emergencyResponses.elementId, id)).all().length;
  if (held > 0) throw conflict(`"${element.name}" has response times recorded in ${held} survey(s): it stays so those surveys keep their record`);
  deps.db.transaction((tx) => {
    tx.delete(emergencyElements).where(eq(emergencyElements.id, id)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_element', entityId: id, action: 'deleted', before: element, at: deps.clock.now() });
  });
}
