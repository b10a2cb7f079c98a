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
  'PUT /surveys/:id/installation': async (t) => ({ path: `/api/surveys/${await draftSurveyId(t)}/installation`, body: { state: 'new', maintenanceFactor: 0.8 } }),
};

const LOG_HEADER = 'timestamp,probe,point,gain,counts';

/** A small log unique to each call, so duplicate detection never answers 409 here. */
function uniqueLog(serial: string): Buffer {
  const at = new Date(Date.parse('2026-11-19T07:00:00Z') + (n++) * 60_000).toISOString();
  return Buffer.from(`${LOG_HEADER}\n${at},${serial},EX-${unique()},2,16000\n`);
}

const withLog = new WeakMap<TestApp, Promise<{ surveyId: number; importId: number }>>();

/** A survey with one accepted log, imported through the API once per test app (read-only examples share it). */
function surveyWithLog(t: TestApp): Promise<{ surveyId: number; importId: number }> {
  let p = withLog.get(t);
  if (!p) withLog.set(t, (p = importOneLog(t)));
  return p;
}

async function importOneLog(t: TestApp): Promise<{ surveyId: number; importId: number }> {
  const { createTestProbes, TEST_SERIALS } = await import('../support/factories');
  const { waitForImport } = await import('@server/modules/imports/imports-service');
  createTestProbes(t);
  const surveyId = await draftSurveyId(t);
  const admin = await t.signIn(DEMO.admin);
  const res = await admin.post(`/api/surveys/${surveyId}/logs`).attach('file', uniqueLog(TEST_SERIALS.tripod), { filename: 'ex.csv', contentType: 'text/csv' });
  await waitForImport(t.deps, res.body.importId);
  return { surveyId, importId: res.body.importId };
}

Object.assign(surveyExamples, {
  'POST /surveys/:id/logs': async (t: TestApp) => {
    const { createTestProbes, TEST_SERIALS } = await import('../support/factories');
    createTestProbes(t);
    return { path: `/api/surveys/${await draftSurveyId(t)}/logs`, files: { file: { content: uniqueLog(TEST_SERIALS.tripod), filename: 'ex.csv', contentType: 'text/csv' } }, okStatus: 202 };
  },
  'GET /imports/:id': async (t: TestApp) => ({ path: `/api/imports/${(await surveyWithLog(t)).importId}` }),
  'GET /surveys/:id/readings': async (t: TestApp) => ({ path: `/api/surveys/${(await surveyWithLog(t)).surveyId}/readings` }),
  'GET /surveys/:id/readings/series': async (t: TestApp) => ({ path: `/api/surveys/${(await surveyWithLog(t)).surveyId}/readings/series` }),
  'GET /surveys/:id/readings.csv': async (t: TestApp) => ({ path: `/api/surveys/${(await surveyWithLog(t)).surveyId}/readings.csv` }),
  'POST /surveys/:id/redecode': async (t: TestApp) => ({ path: `/api/surveys/${(await surveyWithLog(t)).surveyId}/redecode` }),
  'GET /surveys/:id/decode-changes': async (t: TestApp) => ({ path: `/api/surveys/${(await surveyWithLog(t)).surveyId}/decode-changes` }),
} satisfies RouteExamples);
