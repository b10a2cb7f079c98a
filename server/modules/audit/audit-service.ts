import { and, desc, eq, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { auditEvents, users } from '../../db/schema/organizations';

export type AuditEntry = {
  organizationId: number;
  actorId: number | null;
  entityType: string;
  entityId: number;
  action: string;
  before?: unknown;
  after?: unknown;
  probeId?: number | null;
  surveyId?: number | null;
  at: number;
};

type Tx = Pick<Db, 'insert'>;

/** Appends one event; pass the transaction of the change so both land or neither. */
export function recordAudit(tx: Tx, e: AuditEntry): void {
  tx.insert(auditEvents).values({
    organizationId: e.organizationId,
    actorId: e.actorId,
    entityType: e.entityType,
    entityId: e.entityId,
    action: e.action,
    before: e.before ?? null,
    after: e.after ?? null,
    probeId: e.probeId ?? null,
    surveyId: e.surveyId ?? null,
    createdAt: e.at,
  }).run();
}

/** Entity types whose before/after carry calibration coefficients. */
const COEFFICIENT_ENTITIES = new Set(['coefficient_set', 'bench_run']);

/**
 * Lists the trail, newest first. `showCoefficients: false` (roles without coefficients.read)
 * keeps the events but withholds the coefficient values in their before/after.
 */
export function listAudit(db: Db, organizationId: number, filter: { probeId?: number; surveyId?: number; entityType?: string; limit: number; offset: number; showCoefficients: boolean }) {
  const where: SQL[] = [eq(auditEvents.organizationId, organizationId)];
  if (filter.probeId) where.push(eq(auditEvents.probeId, filter.probeId));
  if (filter.surveyId) where.push(eq(auditEvents.surveyId, filter.surveyId));
  if (filter.entityType) where.push(eq(auditEvents.entityType, filter.entityType));
  return db.select({
    id: auditEvents.id, entityType: auditEvents.entityType, entityId: auditEvents.entityId, action: auditEvents.action,
    probeId: auditEvents.probeId, surveyId: auditEvents.surveyId, before: auditEvents.before, after: auditEvents.after,
    createdAt: auditEvents.createdAt, actorName: users.name, actorEmail: users.email,
  }).from(auditEvents).leftJoin(users, eq(users.id, auditEvents.actorId)).where(and(...where))
    .orderBy(desc(auditEvents.createdAt), desc(auditEvents.id)).limit(filter.limit).offset(filter.offset).all()
    .map((r) => {
      const withheld = !filter.showCoefficients && COEFFICIENT_ENTITIES.has(r.entityType);
      return {
        ...r,
        before: withheld && r.before !== null ? { withheld: 'coefficient values are visible to calibration staff only' } : r.before,
        after: withheld && r.after !== null ? { withheld: 'coefficient values are visible to calibration staff only' } : r.after,
        createdAt: new Date(r.createdAt).toISOString(),
      };
    });
}
