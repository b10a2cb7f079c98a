import fs from 'node:fs';
import path from 'node:path';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { surveys } from './schema/surveys';
import { eq } from 'drizzle-orm';
import { createSite } from '../modules/sites/sites-service';
import { createSurvey } from '../modules/surveys/surveys-service';
import { uploadLog } from '../modules/imports/imports-service';
import { seedPlan } from './seed-plans';
import { COMMISSIONING_MF_PARTS, COMMISSIONING_PLAN, COMMISSIONING_SITE, COMMISSIONING_SURVEY, commissioningLogCsv } from './demo/commissioning';
import type { SessionUser } from '@shared/schemas/auth';

/**
 * Commissioning demo (EN 12464-1:2021 targets): a refitted office measured new, judged against
 * Em / MF with MF from its parts, with wall, ceiling and cylindrical readings and a desk cluster
 * whose surrounding and background bands are judged too. Imported through the real import path
 * and submitted for the facility manager.
 */
export async function seedCommissioning(deps: Deps, ctx: SeedContext) {
  const surveyor: SessionUser = { id: ctx.usersByEmail['surveyor@luxtrail.test'], email: 'surveyor@luxtrail.test', name: 'seed', role: 'surveyor', organizationId: ctx.demoOrgId, organizationName: '' };
  const site = createSite(deps, surveyor, COMMISSIONING_SITE);
  await seedPlan(deps, surveyor, site.id, COMMISSIONING_PLAN);
  const survey = createSurvey(deps, surveyor, {
    siteId: site.id, name: COMMISSIONING_SURVEY.name, startedOn: COMMISSIONING_SURVEY.startedOn,
    conditions: { daylightExcluded: true, notes: 'After dark, new luminaires burnt in for 100 hours, supply at 231 V' },
    installation: { state: 'new', parts: COMMISSIONING_MF_PARTS },
  });
  const dir = path.join(deps.config.dataDir, 'uploads');
  fs.mkdirSync(dir, { recursive: true });
  const tmp = path.join(dir, `seed-commissioning-${survey.id}.csv`);
  const csv = commissioningLogCsv();
  fs.writeFileSync(tmp, csv);
  const { done } = await uploadLog(deps, surveyor, survey.id, { path: tmp, originalname: `${COMMISSIONING_SURVEY.startedOn}-kiln-street-commissioning.csv`, size: csv.length });
  const outcome = await done;
  if (outcome.status !== 'done') console.warn(`Commissioning demo log was rejected: ${outcome.errors.slice(0, 3).map((e) => `line ${e.line} ${e.column}: ${e.message}`).join('; ')}`);
  deps.db.update(surveys).set({ status: 'submitted', submittedBy: surveyor.id, submittedAt: ctx.now }).where(eq(surveys.id, survey.id)).run();
}
