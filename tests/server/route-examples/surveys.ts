import type { RouteExamples } from './types';
import { DEMO, type TestApp } from '../helpers';

let n = 0;
const unique = () => `${Date.now().toString(36)}${(n++).toString(36)}`;

/** The demo library site and a draft survey made by an admin for this example. */
async function demoSiteId(t: TestApp): Promise<number> {
  const admin = await t.signIn(DEMO.admin);
  const res = await admin.get('/api/sites');
  return res.body.items.find((s: { name: string }) => s.name === 'Fernmoor Community Library').id;
}

export async function draftSurveyId(t: TestApp): Promise<number> {
  const admin = await t.signIn(DEMO.admin);
  const res = await admin.post('/api/surveys').send({ siteId: await demoSiteId(t), name: `Example survey ${unique()}` });
  return res.body.id;
}

export const surveyExamples: RouteExamples = {
  'GET /sites': () => ({ path: '/api/sites' }),
  'POST /sites': () => ({ path: '/api/sites', body: { name: `Example site ${unique()}`, timeZone: 'Europe/London' }, okStatus: 201 }),
  'GET /sites/:id': async (t) => ({ path: `/api/sites/${await demoSiteId(t)}` }),
  'GET /surveys': () => ({ path: '/api/surveys' }),
  'POST /surveys': async (t) => ({ path: '/api/surveys', body: { siteId: await demoSiteId(t), name: `Example survey ${unique()}` }, okStatus: 201 }),
  'GET /surveys/:id': async (t) => ({ path: `/api/surveys/${await draftSurveyId(t)}` }),
};
