// Seed step: the library's ground-floor emergency lighting, a night test in two passes through the real import, and the test logbook.
import fs from 'node:fs';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import type { Deps } from '../deps';
import type { SeedContext } from './seed-context';
import { plans } from './schema/plans';
import { surveys } from './schema/surveys';
import { sites } from './schema/sites';
import type { SessionUser } from '@shared/schemas/auth';
import { DEMO_SITE } from './demo/library-layout';
import { DEMO_EMERGENCY_ELEMENTS, DEMO_EMERGENCY_PLAN, DEMO_RATED_MIN, simulateEmergencyLog } from './demo/emergency-layout';
import { toLogCsv } from './demo/simulate-log';
import { createElement } from '../modules/emergency/elements-service';
import { createEmergencySurvey, setResponseTimes } from '../modules/emergency/emergency-surveys-service';
import { addLogbookEntry, localDate } from '../modules/emergency/logbook-service';
import { addDays } from '@shared/core/emergency-schedule';
import { uploadLog } from '../modules/imports/imports-service';
import { EN_1838_2013 } from '@shared/core/emergency';

export const DEMO_EMERGENCY_SURVEY = 'Emergency lighting night test';
/** When the demo night test cut the mains: 19:00 UTC (19:00 in the library in winter), nine days before the seed. */
export const demoMainsOff = (now: number) => Date.parse(`${addDays(localDate(now, DEMO_SITE.timeZone), -9)}T19:00:00Z`);

function actor(ctx: SeedContext, email: string, role: SessionUser['role']): SessionUser {
  return { id: ctx.usersByEmail[email], email, name: email === 'facilities@luxtrail.test' ? 'Marguerite Oakhurst' : 'Tobias Wrenfield', role, organizationId: ctx.demoOrgId, organizationName: 'Fernmoor Civic Trust' };
}

export async function seedEmergency(deps: Deps, ctx: SeedContext) {
  const surveyor = actor(ctx, 'surveyor@luxtrail.test', 'surveyor');
  const fm = actor(ctx, 'facilities@luxtrail.test', 'facility_manager');
  const site = deps.db.select().from(sites).where(and(eq(sites.organizationId, ctx.demoOrgId), eq(sites.name, DEMO_SITE.name))).get();
  const plan = site && deps.db.select().from(plans).where(and(eq(plans.siteId, site.id), eq(plans.name, DEMO_EMERGENCY_PLAN))).get();
  if (!site || !plan) return;
  const ids: Record<string, number> = {};
  for (const body of DEMO_EMERGENCY_ELEMENTS) ids[body.code] = createElement(deps, surveyor, plan.id, body).id;

  const mainsOff = demoMainsOff(ctx.now);
  const survey = createEmergencySurvey(deps, surveyor, {
    siteId: site.id, name: DEMO_EMERGENCY_SURVEY, startedOn: new Date(mainsOff).toISOString().slice(0, 10), criteriaSetKey: EN_1838_2013.key,
    conditions: { systemType: 'self_contained', ratedDurationMin: DEMO_RATED_MIN, mainsOffAt: new Date(mainsOff).toISOString(), normalLightingOff: true, daylightExcluded: true, notes: 'After closing; normal lighting switched off at the board, supply to the emergency circuit cut at 19:00.' },
  });
  for (const code of ['R1', 'S1', 'A1']) setResponseTimes(deps, surveyor, survey.surveyId, ids[code], { toHalfS: 1.2, toFullS: code === 'S1' ? 6 : 9 });
  const csv = toLogCsv(simulateEmergencyLog(mainsOff), DEMO_SITE.timeZone);
  const dir = path.join(deps.config.dataDir, 'uploads');
  fs.mkdirSync(dir, { recursive: true });
  const tmp = path.join(dir, `seed-emergency-${survey.surveyId}.csv`);
  fs.writeFileSync(tmp, csv);
  const { done } = await uploadLog(deps, surveyor, survey.surveyId, { path: tmp, originalname: 'library-emergency-night.csv', size: csv.length });
  const outcome = await done;
  if (outcome.status !== 'done') console.warn(`Demo emergency log was rejected: ${outcome.errors.slice(0, 3).map((e) => `line ${e.line} ${e.column}: ${e.message}`).join('; ')}`);
  deps.db.update(surveys).set({ status: 'submitted', submittedBy: surveyor.id, submittedAt: ctx.now }).where(eq(surveys.id, survey.surveyId)).run();

  // The logbook: the last functional test 40 days ago, so it is overdue by 10 days; the annual test in date.
  const today = localDate(ctx.now, DEMO_SITE.timeZone);
  const entries = [
    { kind: 'full_duration', testedOn: addDays(today, -250), testedBy: 'Halden Electrical Ltd', result: 'pass', failedFittings: [], remarks: 'Three-hour discharge; all fittings lit to the end.' },
    { kind: 'functional', testedOn: addDays(today, -100), testedBy: 'Marguerite Oakhurst', result: 'pass', failedFittings: [], remarks: '' },
    { kind: 'functional', testedOn: addDays(today, -70), testedBy: 'Marguerite Oakhurst', result: 'fail', failedFittings: ['EL-G07 (corridor, east end)'], remarks: 'Fitting dark on the test; battery replaced two days later.' },
    { kind: 'functional', testedOn: addDays(today, -40), testedBy: 'Marguerite Oakhurst', result: 'pass', failedFittings: [], remarks: '' },
  ] as const;
  for (const e of entries) addLogbookEntry(deps, fm, site.id, { ...e, failedFittings: [...e.failedFittings] });
}
