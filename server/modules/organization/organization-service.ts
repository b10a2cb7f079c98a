import { eq } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { organizations } from '../../db/schema/organizations';
import { RULE_TEXT } from '@shared/core/decision';
import type { SessionUser } from '@shared/schemas/auth';
import type { DecisionRule, Organization, UpdateOrganizationBody } from '@shared/schemas/organization';
import { notFound } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';

export function getOrganization(db: Db, organizationId: number): Organization {
  const row = db.select().from(organizations).where(eq(organizations.id, organizationId)).get();
  if (!row) throw notFound('Organisation');
  return { id: row.id, name: row.name, decisionRule: row.decisionRule, ruleText: RULE_TEXT[row.decisionRule], gridRounding: row.gridRounding };
}

export function decisionRuleOf(db: Db, organizationId: number): DecisionRule {
  return getOrganization(db, organizationId).decisionRule;
}

/**
 * Changes the decision rule for surveys judged from now on (signed-off surveys keep the rule they
 * froze) and/or the default grid rounding for surveys created from now on (each survey keeps its own).
 */
export function updateOrganization(deps: Deps, actor: SessionUser, body: UpdateOrganizationBody): Organization {
  const before = getOrganization(deps.db, actor.organizationId);
  deps.db.transaction((tx) => {
    if (body.decisionRule !== undefined) {
      tx.update(organizations).set({ decisionRule: body.decisionRule }).where(eq(organizations.id, actor.organizationId)).run();
      recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'organization', entityId: actor.organizationId, action: 'decision_rule_changed', before: { decisionRule: before.decisionRule }, after: { decisionRule: body.decisionRule }, at: deps.clock.now() });
    }
    if (body.gridRounding !== undefined) {
      tx.update(organizations).set({ gridRounding: body.gridRounding }).where(eq(organizations.id, actor.organizationId)).run();
      recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'organization', entityId: actor.organizationId, action: 'grid_rule_changed', before: { gridRounding: before.gridRounding }, after: { gridRounding: body.gridRounding }, at: deps.clock.now() });
    }
  });
  return getOrganization(deps.db, actor.organizationId);
}
