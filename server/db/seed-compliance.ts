import { and, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { surveys } from './schema/surveys';
import { users } from './schema/organizations';
import { seedShippedTargets } from '../modules/targets/targets-service';
import { signOffSurvey } from '../modules/workflow/workflow-service';
import type { SessionUser } from '@shared/schemas/auth';

/** The survey the demo signs off, so the autumn walk-through has a previous survey to compare with. */
export const DEMO_SIGNED_OFF_SURVEY = 'Spring walk-through 2026';

/**
 * Compliance demo data: the shipped target library, and the spring walk-through signed off by
 * the demo facility manager through the workflow service (frozen verdicts, audit, e-mail).
 * The autumn walk-through stays submitted for the facility manager to review.
 */
export async function seedCompliance(deps: Deps, ctx: SeedContext) {
  seedShippedTargets(deps.db, ctx.now);
  const spring = deps.db.select().from(surveys).where(and(eq(surveys.organizationId, ctx.demoOrgId), eq(surveys.name, DEMO_SIGNED_OFF_SURVEY))).get();
  if (!spring || spring.status !== 'submitted') return;
  const fm = deps.db.select().from(users).where(eq(users.email, 'facilities@luxtrail.test')).get()!;
  const actor: SessionUser = { id: fm.id, email: fm.email, name: fm.name, role: fm.role, organizationId: ctx.demoOrgId, organizationName: 'Fernmoor Civic Trust' };
  await signOffSurvey(deps, actor, spring.id, { comment: 'Spring levels reviewed with the Trust\'s buildings committee.' });
}
