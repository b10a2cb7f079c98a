import { eq } from 'drizzle-orm';
import type { RouteExamples } from './types';
import type { TestApp } from '../helpers';
import { DEMO } from '../helpers';
import { buildSurvey, insertTarget, OFFICE_AND_CORRIDOR, officeAndCorridorReadings, userId } from '../support/factories';
import { targets } from '@server/db/schema/targets';

let n = 0;
const unique = () => `${Date.now().toString(36)}_${(n++).toString(36)}`;

/** A fresh survey of the demo organisation with an office and a corridor, submitted by the surveyor unless a draft is asked for. */
const fixture = (t: TestApp, status: 'draft' | 'submitted' = 'submitted') =>
  buildSurvey(t, { ownerEmail: DEMO.surveyor, status, siteName: `Matrix site ${unique()}`, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });

/** A report job of the demo organisation, started by its admin (and polled until done when asked). */
async function reportJob(t: TestApp, done: boolean): Promise<{ id: string }> {
  const admin = await t.signIn(DEMO.admin);
  const job = (await admin.post(`/api/surveys/${fixture(t).surveyId}/report-jobs`).send({ unit: 'lx' })).body as { id: string; status: string };
  for (let state = job; done && state.status === 'running'; state = (await admin.get(`/api/report-jobs/${job.id}`)).body) await new Promise((r) => setTimeout(r, 50));
  return job;
}

/** An entry of the demo organisation's own, inserted directly so every role's example has one. */
function ownTarget(t: TestApp): number {
  const org = userId(t, DEMO.admin).organizationId;
  return insertTarget(t, org, `matrix_${unique()}`, 'Matrix entry');
}

export const complianceExamples: RouteExamples = {
  'GET /targets': () => ({ path: '/api/targets' }),
  'POST /targets': () => ({ path: '/api/targets', body: { useType: `matrix_${unique()}`, name: 'Matrix spec', emValue: 40, sourceUnit: 'fc', source: 'Client spec M-1' }, okStatus: 201 }),
  'PATCH /targets/:id': (t) => ({ path: `/api/targets/${ownTarget(t)}`, body: { name: 'Renamed entry' } }),
  'GET /zones/:zoneId/target': (t) => ({ path: `/api/zones/${fixture(t).zoneIds.office}/target` }),
  'PUT /zones/:zoneId/target': (t) => {
    const shipped = t.db.select().from(targets).where(eq(targets.useType, 'technical_drawing')).get()!;
    return { path: `/api/zones/${fixture(t).zoneIds.office}/target`, body: { targetId: shipped.id } };
  },
  'GET /organization': () => ({ path: '/api/organization' }),
  'PATCH /organization': () => ({ path: '/api/organization', body: { decisionRule: 'guarded' } }),
  'GET /compliance/sites': () => ({ path: '/api/compliance/sites' }),
  'GET /compliance/maintenance': () => ({ path: '/api/compliance/maintenance' }),
  'GET /surveys/:id/compliance': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/compliance` }),
  'GET /surveys/:id/zones/:zoneId/compliance': (t) => {
    const f = fixture(t);
    return { path: `/api/surveys/${f.surveyId}/zones/${f.zoneIds.corridor}/compliance` };
  },
  'POST /surveys/:id/submit': (t) => ({ path: `/api/surveys/${fixture(t, 'draft').surveyId}/submit`, body: {} }),
  'POST /surveys/:id/sign-off': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/sign-off`, body: { comment: 'matrix' } }),
  'POST /surveys/:id/return': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/return`, body: { comment: 'Please re-measure' } }),
  'GET /surveys/:id/report.pdf': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/report.pdf` }),
  'GET /surveys/:id/compliance/zones.csv': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/compliance/zones.csv` }),
  'GET /surveys/:id/compliance/readings.csv': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/compliance/readings.csv` }),
  'POST /surveys/:id/report-jobs': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/report-jobs`, body: { unit: 'lx' }, okStatus: 202 }),
  'GET /report-jobs/:jobId': async (t) => ({ path: `/api/report-jobs/${(await reportJob(t, false)).id}` }),
  'GET /report-jobs/:jobId/file': async (t) => ({ path: `/api/report-jobs/${(await reportJob(t, true)).id}/file` }),
  'POST /surveys/:id/report/send': (t) => ({ path: `/api/surveys/${fixture(t).surveyId}/report/send`, body: { recipients: ['board@fernmoor.test'] }, okStatus: 202 }),
};
