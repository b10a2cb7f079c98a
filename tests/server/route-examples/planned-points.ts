import type { RouteExamples } from './types';
import type { TestApp } from '../helpers';
import { DEMO } from '../helpers';
import { insertDecode, insertProbe, insertSite, orgOf, pngOf } from '../support/factories';
import { eq } from 'drizzle-orm';
import { readings, surveys } from '@server/db/schema/surveys';

let n = 0;

// One admin session per test app: signing in (argon2) for every example would slow the matrix.
const adminClients = new WeakMap<TestApp, ReturnType<TestApp['signIn']>>();
function adminOf(t: TestApp) {
  if (!adminClients.has(t)) adminClients.set(t, t.signIn(DEMO.admin));
  return adminClients.get(t)!;
}

/** One 10 m plan with a 4 m × 3 m room per test app (uploading a plan per example would slow the matrix). */
const bases = new WeakMap<TestApp, Promise<{ siteId: number; planId: number; zoneId: number }>>();
function baseOf(t: TestApp) {
  if (!bases.has(t)) {
    bases.set(t, (async () => {
      const admin = await adminOf(t);
      const siteId = insertSite(t, orgOf(t, DEMO.admin), 'Grid site');
      const plan = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(100, 80, 11), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Grid plan').field('widthM', '10');
      const zone = await admin.post(`/api/plans/${plan.body.id}/zones`).send({ name: 'Grid room', kind: 'room', useType: 'office_writing', polygon: [[1, 1], [5, 1], [5, 4], [1, 4]] });
      return { siteId, planId: plan.body.id as number, zoneId: zone.body.id as number };
    })());
  }
  return bases.get(t)!;
}

/** A fresh survey on the shared plan with the room's grid generated and justified (so edits need no reason). */
async function exampleGrid(t: TestApp) {
  const admin = await adminOf(t);
  const { siteId, planId, zoneId } = await baseOf(t);
  const survey = await admin.post('/api/surveys').send({ siteId, name: `Grid survey ${n++}` });
  const gen = await admin.post(`/api/surveys/${survey.body.id}/planned-points/generate`).send({ zoneId });
  if (gen.status !== 200) throw new Error(`example grid failed: ${gen.status} ${JSON.stringify(gen.body)}`);
  await admin.put(`/api/surveys/${survey.body.id}/grids/${gen.body.grids[0].id}/reason`).send({ reason: 'Example reason' });
  return { surveyId: survey.body.id as number, planId, zoneId, gridId: gen.body.grids[0].id as number, pointId: gen.body.items[0].id as number };
}

export const plannedPointExamples: RouteExamples = {
  'GET /surveys/:id/planned-points': async (t) => ({ path: `/api/surveys/${(await exampleGrid(t)).surveyId}/planned-points` }),
  'POST /surveys/:id/planned-points/generate': async (t) => {
    const g = await exampleGrid(t);
    return { path: `/api/surveys/${g.surveyId}/planned-points/generate`, body: { planId: g.planId } };
  },
  'POST /surveys/:id/planned-points': async (t) => {
    const g = await exampleGrid(t);
    return { path: `/api/surveys/${g.surveyId}/planned-points`, body: { zoneId: g.zoneId, xM: 3, yM: 2.5 }, okStatus: 201 };
  },
  'PATCH /surveys/:id/planned-points/:pointId': async (t) => {
    const g = await exampleGrid(t);
    return { path: `/api/surveys/${g.surveyId}/planned-points/${g.pointId}`, body: { xM: 2, yM: 2 } };
  },
  'DELETE /surveys/:id/planned-points/:pointId': async (t) => {
    const g = await exampleGrid(t);
    return { path: `/api/surveys/${g.surveyId}/planned-points/${g.pointId}`, okStatus: 204 };
  },
  'PUT /surveys/:id/grids/:gridId/reason': async (t) => {
    const g = await exampleGrid(t);
    return { path: `/api/surveys/${g.surveyId}/grids/${g.gridId}/reason`, body: { reason: 'Shelving moved in' } };
  },
};

/** A survey with one reading that has no position (written directly) on the example grid's site. */
async function exampleUnplaced(t: TestApp) {
  const g = await exampleGrid(t);
  const survey = t.db.select().from(surveys).where(eq(surveys.id, g.surveyId)).get()!;
  const probeId = insertProbe(t, survey.organizationId, 'LX-P');
  const { decodeId } = insertDecode(t, survey.id, [{
    point: 'LOOSE-1', xM: null, yM: null, planId: null, role: 'task', timeMs: t.clock.now() + n++, probeId,
    lux: 420, uLux: 30, luxBound: 'exact', flag: 'ok', gainCode: 2, sampleCount: 1, budget: [{ name: 'calibration', uRel: 0.04 }],
  }]);
  const reading = t.db.select({ id: readings.id }).from(readings).where(eq(readings.decodeId, decodeId)).get()!;
  return { ...g, readingId: reading.id };
}

export const placementExamples: RouteExamples = {
  'GET /surveys/:id/unplaced': async (t) => ({ path: `/api/surveys/${(await exampleUnplaced(t)).surveyId}/unplaced` }),
  'PUT /surveys/:id/readings/:readingId/placement': async (t) => {
    const g = await exampleUnplaced(t);
    return { path: `/api/surveys/${g.surveyId}/readings/${g.readingId}/placement`, body: { planId: g.planId, xM: 2, yM: 2 } };
  },
  'PUT /surveys/:id/readings/:readingId/exclusion': async (t) => {
    const g = await exampleUnplaced(t);
    return { path: `/api/surveys/${g.surveyId}/readings/${g.readingId}/exclusion`, body: { excluded: true, reason: 'Door left open' } };
  },
};

export const walkSheetExamples: RouteExamples = {
  'GET /surveys/:id/walk-sheet.pdf': async (t) => ({ path: `/api/surveys/${(await exampleGrid(t)).surveyId}/walk-sheet.pdf` }),
  'GET /surveys/:id/planned-points.csv': async (t) => ({ path: `/api/surveys/${(await exampleGrid(t)).surveyId}/planned-points.csv` }),
};
