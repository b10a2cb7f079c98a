import type { RouteExamples } from './types';
import type { TestApp } from '../helpers';
import { DEMO } from '../helpers';
import { insertSite, orgOf, conditions, emergencySite, insertTimedReadings, ROUTE } from '../support/factories';
import { EN_1838_2013 } from '@shared/core/emergency';

let n = 0;
const adminClients = new WeakMap<TestApp, ReturnType<TestApp['signIn']>>();
function adminOf(t: TestApp) {
  if (!adminClients.has(t)) adminClients.set(t, t.signIn(DEMO.admin));
  return adminClients.get(t)!;
}

async function withRoute(t: TestApp) {
  const admin = await adminOf(t);
  const { siteId, planId } = await emergencySite(t, admin, `Matrix emergency ${n++}`);
  const el = await admin.post(`/api/plans/${planId}/emergency-elements`).send(ROUTE);
  return { siteId, planId, elementId: el.body.id as number, admin };
}

async function withSurvey(t: TestApp) {
  const f = await withRoute(t);
  const s = await f.admin.post('/api/emergency/surveys').send({ siteId: f.siteId, name: 'Matrix night test', criteriaSetKey: EN_1838_2013.key, conditions: conditions() });
  return { ...f, surveyId: s.body.surveyId as number };
}

const ownSet = { name: 'Matrix set', source: 'Matrix policy', requiredPasses: ['end_of_duration'], checks: [EN_1838_2013.checks[0]], notes: [] };

export const emergencyExamples: RouteExamples = {
  'GET /plans/:id/emergency-elements': async (t) => ({ path: `/api/plans/${(await withRoute(t)).planId}/emergency-elements` }),
  'POST /plans/:id/emergency-elements': async (t) => {
    const admin = await adminOf(t);
    return { path: `/api/plans/${(await emergencySite(t, admin, `Matrix emergency ${n++}`)).planId}/emergency-elements`, body: ROUTE, okStatus: 201 };
  },
  'PUT /emergency-elements/:id': async (t) => ({ path: `/api/emergency-elements/${(await withRoute(t)).elementId}`, body: { ...ROUTE, widthM: 1.2 } }),
  'DELETE /emergency-elements/:id': async (t) => ({ path: `/api/emergency-elements/${(await withRoute(t)).elementId}`, okStatus: 204 }),
  'GET /emergency/criteria-sets': () => ({ path: '/api/emergency/criteria-sets' }),
  'POST /emergency/criteria-sets': () => ({ path: '/api/emergency/criteria-sets', body: ownSet, okStatus: 201 }),
  'PUT /emergency/criteria-sets/:key': async (t) => {
    const made = await (await adminOf(t)).post('/api/emergency/criteria-sets').send(ownSet);
    return { path: `/api/emergency/criteria-sets/${made.body.key as string}`, body: { ...ownSet, name: 'Matrix set, revised' } };
  },
  'GET /emergency/surveys': () => ({ path: '/api/emergency/surveys' }),
  'POST /emergency/surveys': (t) => ({ path: '/api/emergency/surveys', body: { siteId: insertSite(t, orgOf(t, DEMO.admin), `Matrix site ${n++}`), name: 'Matrix', criteriaSetKey: EN_1838_2013.key, conditions: conditions() }, okStatus: 201 }),
  'GET /emergency/surveys/:id': async (t) => ({ path: `/api/emergency/surveys/${(await withSurvey(t)).surveyId}` }),
  'PATCH /emergency/surveys/:id': async (t) => ({ path: `/api/emergency/surveys/${(await withSurvey(t)).surveyId}`, body: { criteriaSetKey: 'nfpa-101-7.9.2' } }),
  'PUT /emergency/surveys/:id/responses/:elementId': async (t) => {
    const f = await withSurvey(t);
    return { path: `/api/emergency/surveys/${f.surveyId}/responses/${f.elementId}`, body: { toHalfS: 1, toFullS: 10 } };
  },
  'PUT /emergency/surveys/:id/logs/:importId/pass': async (t) => {
    const f = await withSurvey(t);
    const importId = insertTimedReadings(t, f.surveyId, f.planId, [{ point: 'R1-C01', lux: 1.2, atMin: 170 }]);
    return { path: `/api/emergency/surveys/${f.surveyId}/logs/${importId}/pass`, body: { pass: 'end_of_duration' } };
  },
  'GET /emergency/surveys/:id/report.pdf': async (t) => ({ path: `/api/emergency/surveys/${(await withSurvey(t)).surveyId}/report.pdf` }),
  'GET /sites/:id/emergency-tests': (t) => ({ path: `/api/sites/${insertSite(t, orgOf(t, DEMO.admin), `Matrix site ${n++}`)}/emergency-tests` }),
  'POST /sites/:id/emergency-tests': (t) => ({ path: `/api/sites/${insertSite(t, orgOf(t, DEMO.admin), `Matrix site ${n++}`)}/emergency-tests`, body: { kind: 'functional', testedOn: '2026-11-19', testedBy: 'Matrix', result: 'pass' }, okStatus: 201 }),
  'GET /emergency/tests-due': () => ({ path: '/api/emergency/tests-due' }),
  'GET /emergency/test-schedule': () => ({ path: '/api/emergency/test-schedule' }),
  'PUT /emergency/test-schedule': () => ({ path: '/api/emergency/test-schedule', body: { functionalEveryDays: 30, fullDurationEveryMonths: 12 } }),
  'POST /emergency/reminders/run': () => ({ path: '/api/emergency/reminders/run' }),
};
