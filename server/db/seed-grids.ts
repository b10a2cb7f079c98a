// Seed step: a survey planned with EN 12464-1 grids whose log names the planned points by label only.
import fs from 'node:fs';
import path from 'node:path';
import { and, asc, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { sites } from './schema/sites';
import { plans, zones } from './schema/plans';
import { plannedPoints } from './schema/grids';
import { DEMO_SITE } from './demo/library-layout';
import { LABEL_WALK, simulateLabelWalk } from './demo/label-walk';
import { toLogCsv } from './demo/simulate-log';
import { createSurvey } from '../modules/surveys/surveys-service';
import { generateGrids } from '../modules/planned-points/planned-points-service';
import { uploadLog } from '../modules/imports/imports-service';
import type { SessionUser } from '@shared/schemas/auth';

/**
 * The label walk (after the plans and the other logs): grids generated for three ground-floor rooms,
 * then a log whose rows carry only the planned points' labels, imported through the real import so
 * every reading reaches the plan by the label join.
 */
export async function seedLabelWalk(deps: Deps, ctx: SeedContext) {
  const surveyor: SessionUser = { id: ctx.usersByEmail['surveyor@luxtrail.test'], email: 'surveyor@luxtrail.test', name: 'seed', role: 'surveyor', organizationId: ctx.demoOrgId, organizationName: '' };
  const site = deps.db.select().from(sites).where(and(eq(sites.organizationId, ctx.demoOrgId), eq(sites.name, DEMO_SITE.name))).get();
  const ground = site && deps.db.select().from(plans).where(and(eq(plans.siteId, site.id), eq(plans.name, 'Ground floor'))).get();
  if (!site || !ground) return;
  const survey = createSurvey(deps, surveyor, { siteId: site.id, name: LABEL_WALK.name, startedOn: LABEL_WALK.startedOn, conditions: { daylightExcluded: true, notes: 'After dark; the logging meter records labels only, points planned on the walk sheet' } });
  const zoneRows = deps.db.select().from(zones).where(eq(zones.planId, ground.id)).orderBy(asc(zones.id)).all().filter((z) => (LABEL_WALK.zones as readonly string[]).includes(z.name));
  for (const z of zoneRows) await generateGrids(deps, surveyor, survey.id, { zoneId: z.id });
  const points = deps.db.select({ label: plannedPoints.label, xM: plannedPoints.xM, yM: plannedPoints.yM, zoneName: zones.name }).from(plannedPoints)
    .innerJoin(zones, eq(zones.id, plannedPoints.zoneId)).where(eq(plannedPoints.surveyId, survey.id)).orderBy(asc(plannedPoints.id)).all();
  const csv = toLogCsv(simulateLabelWalk(points, Date.parse(LABEL_WALK.startIso)), DEMO_SITE.timeZone);
  const dir = path.join(deps.config.dataDir, 'uploads');
  fs.mkdirSync(dir, { recursive: true });
  const tmp = path.join(dir, `seed-labels-${survey.id}.csv`);
  fs.writeFileSync(tmp, csv);
  const { done } = await uploadLog(deps, surveyor, survey.id, { path: tmp, originalname: `${LABEL_WALK.startedOn}-label-walk.csv`, size: csv.length });
  const outcome = await done;
  if (outcome.status !== 'done') console.warn(`Demo label walk was rejected: ${outcome.errors.slice(0, 3).map((e) => `line ${e.line} ${e.column}: ${e.message}`).join('; ')}`);
}
