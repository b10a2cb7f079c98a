import { and, asc, eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { emergencyCriteriaSets } from '../../db/schema/emergency';
import type { SessionUser } from '@shared/schemas/auth';
import { BUILT_IN_CRITERIA_SETS, type EmergencyCriteriaSet } from '@shared/core/emergency';
import { criteriaSetBodySchema, type CriteriaSetBody, type CriteriaSetDto } from '@shared/schemas/emergency';
import { notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';

type SetRow = typeof emergencyCriteriaSets.$inferSelect;

const ORG_KEY_PREFIX = 'org-';

function fromRow(r: SetRow): EmergencyCriteriaSet {
  return { key: `${ORG_KEY_PREFIX}${r.id}`, name: r.name, source: r.source, requiredPasses: r.requiredPasses, checks: r.checks, notes: r.notes };
}

export function presentCriteriaSet(s: EmergencyCriteriaSet): CriteriaSetDto {
  return { ...s, builtIn: !s.key.startsWith(ORG_KEY_PREFIX) };
}

export function listCriteriaSets(db: Db, organizationId: number): EmergencyCriteriaSet[] {
  const own = db.select().from(emergencyCriteriaSets).where(eq(emergencyCriteriaSets.organizationId, organizationId)).orderBy(asc(emergencyCriteriaSets.id)).all();
  return [...BUILT_IN_CRITERIA_SETS, ...own.map(fromRow)];
}

/** The row id an organisation's key ("org-12") names, or null. */
function ownSetId(key: string): number | null {
  const m = new RegExp(`^${ORG_KEY_PREFIX}(\\d+)$`).exec(key);
  return m ? Number(m[1]) : null;
}

/** A built-in set or one of the organisation's own; null if the key names neither. */
export function findCriteriaSet(db: Db, organizationId: number, key: string): EmergencyCriteriaSet | null {
  const builtIn = BUILT_IN_CRITERIA_SETS.find((s) => s.key === key);
  if (builtIn) return builtIn;
  const id = ownSetId(key);
  if (id === null) return null;
  const row = db.select().from(emergencyCriteriaSets).where(and(eq(emergencyCriteriaSets.id, id), eq(emergencyCriteriaSets.organizationId, organizationId))).get();
  return row ? fromRow(row) : null;
}

/** The set or a 422 naming the key (a body field, so not a 404 of the route). */
export function requireCriteriaSet(db: Db, organizationId: number, key: string): EmergencyCriteriaSet {
  const s = findCriteriaSet(db, organizationId, key);
  if (!s) throw unprocessable(`Criteria set "${key}" is neither built in nor one of your organisation's`, { field: 'criteriaSetKey' });
  return s;
}

export function createCriteriaSet(deps: Deps, user: SessionUser, input: CriteriaSetBody): CriteriaSetDto {
  const body = criteriaSetBodySchema.parse(input);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const r = tx.insert(emergencyCriteriaSets).values({ organizationId: user.organizationId, ...body, createdBy: user.id, createdAt: now }).returning().get();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_criteria_set', entityId: r.id, action: 'created', after: body, at: now });
    return r;
  });
  return presentCriteriaSet(fromRow(row));
}

/**
 * Replaces one of the organisation's own sets (built-in sets answer 404 here: they are not the
 * organisation's to change; base a set of your own on one instead). Surveys judged live follow
 * the new values; signed-off surveys keep the set as frozen at sign-off.
 */
export function updateCriteriaSet(deps: Deps, user: SessionUser, key: string, input: CriteriaSetBody): CriteriaSetDto {
  const body = criteriaSetBodySchema.parse(input);
  const id = ownSetId(key);
  const prev = id === null ? undefined : deps.db.select().from(emergencyCriteriaSets).where(and(eq(emergencyCriteriaSets.id, id), eq(emergencyCriteriaSets.organizationId, user.organizationId))).get();
  if (!prev) throw notFound('Criteria set of your organisation');
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(emergencyCriteriaSets).set(body).where(eq(emergencyCriteriaSets.id, prev.id)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'emergency_criteria_set', entityId: prev.id, action: 'updated', before: { name: prev.name, source: prev.source, requiredPasses: prev.requiredPasses, checks: prev.checks, notes: prev.notes }, after: body, at: now });
  });
  return presentCriteriaSet(fromRow(deps.db.select().from(emergencyCriteriaSets).where(eq(emergencyCriteriaSets.id, prev.id)).get()!));
}

export function getCriteriaSetOrNotFound(db: Db, organizationId: number, key: string): EmergencyCriteriaSet {
  const s = findCriteriaSet(db, organizationId, key);
  if (!s) throw notFound('Criteria set');
  return s;
}
