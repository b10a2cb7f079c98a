import type { RouteExamples } from './types';
import type { TestApp } from '../helpers';
import { DEMO } from '../helpers';
import { insertSite, insertSurveyWithReadings, orgOf, pngOf } from '../support/factories';

let n = 0;
const room = { name: 'Example room', kind: 'room', useType: 'office_writing', polygon: [[1, 1], [5, 1], [5, 4], [1, 4]] };

// One admin session per test app: signing in (argon2) for every example would slow the matrix.
const adminClients = new WeakMap<TestApp, ReturnType<TestApp['signIn']>>();
function adminOf(t: TestApp) {
  if (!adminClients.has(t)) adminClients.set(t, t.signIn(DEMO.admin));
  return adminClients.get(t)!;
}

async function examplePlan(t: TestApp) {
  const siteId = insertSite(t, orgOf(t, DEMO.admin), `Example site ${n++}`);
  const admin = await adminOf(t);
  const res = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(100, 80, n), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Example plan').field('widthM', '10');
  if (res.status !== 201) throw new Error(`example plan upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { siteId, planId: res.body.id as number, admin };
}

async function exampleZone(t: TestApp) {
  const { planId, admin } = await examplePlan(t);
  const res = await admin.post(`/api/plans/${planId}/zones`).send(room);
  return res.body.id as number;
}

export const planExamples: RouteExamples = {
  'GET /sites/:id/plans': async (t) => ({ path: `/api/sites/${(await examplePlan(t)).siteId}/plans` }),
  'POST /sites/:id/plans': (t) => ({
    path: `/api/sites/${insertSite(t, orgOf(t, DEMO.admin))}/plans`,
    files: { file: { content: pngOf(64, 48, n++), filename: 'plan.png', contentType: 'image/png' } },
    fields: { name: 'Uploaded in the matrix', widthM: '6.4' },
    okStatus: 201,
  }),
  'GET /plans/:id': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}` }),
  'PATCH /plans/:id': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}`, body: { scalePoints: [[0, 0], [50, 0]], distanceM: 5 } }),
  'DELETE /plans/:id': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}`, okStatus: 204 }),
  'PUT /plans/:id/image': async (t) => ({
    path: `/api/plans/${(await examplePlan(t)).planId}/image`,
    files: { file: { content: pngOf(100, 80, n++), filename: 'revised.png', contentType: 'image/png' } },
  }),
  'GET /plans/:id/image': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}/image` }),
  'GET /plans/:id/zones': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}/zones` }),
  'POST /plans/:id/zones': async (t) => ({ path: `/api/plans/${(await examplePlan(t)).planId}/zones`, body: room, okStatus: 201 }),
  'PATCH /zones/:id': async (t) => ({ path: `/api/zones/${await exampleZone(t)}`, body: { name: 'Renamed room' } }),
  'DELETE /zones/:id': async (t) => ({ path: `/api/zones/${await exampleZone(t)}`, okStatus: 204 }),
  'GET /surveys/:id/map': async (t) => {
    const { siteId, planId } = await examplePlan(t);
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.admin), siteId, [{ point: 'P1', x: 2, y: 2, lux: 480 }, { point: 'P2', x: 4, y: 3, lux: 520 }], 'Matrix survey', planId);
    return { path: `/api/surveys/${surveyId}/map?planId=${planId}` };
  },
};
