import { describe, it, expect, beforeAll } from 'vitest';
import { DEMO, type TestApp, type TestClient } from './helpers';
import { keptSamples, newDraftSurvey, tableCounts, TEST_SERIALS, uploadAndWait, insertSite, orgOf, pngOf, appWithTestProbes } from './support/factories';
import { waitForImport } from '@server/modules/imports/imports-service';
import type { Plan } from '@shared/schemas/plans';

let t: TestApp;
let c: TestClient;
/** The demo library's plans (seeded): Ground floor, First floor, Car park and entrance; their frames overlap. */
let plans: Record<string, Plan>;
beforeAll(async () => {
  ({ t, c } = await appWithTestProbes());
  const site = (await c.get('/api/sites')).body.items.find((s: { name: string }) => s.name === 'Fernmoor Community Library');
  const items: Plan[] = (await c.get(`/api/sites/${site.id}/plans`)).body.items;
  plans = Object.fromEntries(items.map((p) => [p.name, p]));
});

let minute = 0;
/** A valid counting row (T-4102, about 500 lx) at a fresh time, with the given position and plan cell. */
function row(point: string, xy: [number, number] | null, plan = '') {
  minute++;
  const ts = new Date(Date.parse('2026-11-02T08:00:00Z') + minute * 60_000).toISOString();
  return [ts, TEST_SERIALS.tripod, point, '2', '16000', xy ? xy[0] : '', xy ? xy[1] : '', plan].join(',');
}
const log = (...rows: string[]) => `timestamp,probe,point,gain,counts,x_m,y_m,plan\n${rows.join('\n')}\n`;

async function upload(surveyId: number, content: string, planId?: string) {
  const req = c.post(`/api/surveys/${surveyId}/logs`);
  if (planId !== undefined) void req.field('planId', planId);
  const res = await req.attach('file', Buffer.from(content), { filename: 'plans.csv', contentType: 'text/csv' });
  if (res.status === 202) await waitForImport(t.deps, res.body.importId);
  return res;
}

async function planIdsByPoint(surveyId: number): Promise<Record<string, number | null>> {
  const items = (await c.get(`/api/surveys/${surveyId}/readings?limit=1000`)).body.items as { point: string; planId: number | null }[];
  return Object.fromEntries(items.map((r) => [r.point, r.planId]));
}

describe('log import: the plan column', () => {
  it('plan column, when it names plans in any case with spaces around, stores each reading on its plan', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, log(row('G-1', [5, 5], '  ground FLOOR '), row('F-1', [5, 5], 'First floor'), row('C-1', [47, 14], 'car park and entrance')));
    expect(status).toMatchObject({ status: 'done', errors: [], planId: null });
    expect(await planIdsByPoint(surveyId)).toEqual({ 'G-1': plans['Ground floor'].id, 'F-1': plans['First floor'].id, 'C-1': plans['Car park and entrance'].id });
    // The samples keep the plan too, so a re-decode can carry it.
    const kept = keptSamples(t, surveyId);
    expect(kept.map((s) => s.planId).sort()).toEqual([plans['Ground floor'].id, plans['First floor'].id, plans['Car park and entrance'].id].sort());
  });

  it('plan column, when a row names a plan the site does not have, rejects the file naming line, column and value and stores no reading', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const before = tableCounts(t);
    const { status } = await uploadAndWait(t, c, surveyId, log(row('G-1', [5, 5], 'Ground floor'), row('B-1', [2, 2], 'Basement')));
    expect(status.status).toBe('failed');
    expect(status.errors).toEqual([expect.objectContaining({ line: 3, column: 'plan', value: 'Basement' })]);
    expect(status.errors[0].message).toMatch(/"Basement" is not a plan of this site \(its plans: Ground floor, First floor, Car park and entrance\)/);
    const after = tableCounts(t);
    expect({ ...after, log_imports: after.log_imports - 1, stored_files: after.stored_files - 1 }).toEqual(before);
  });

  it('plan column, when empty on a site with several plans and no plan chosen, leaves the reading unplaced (null) rather than guessing', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, log(row('U-1', [5, 5]), row('U-2', null)));
    expect(status.status).toBe('done');
    expect(await planIdsByPoint(surveyId)).toEqual({ 'U-1': null, 'U-2': null });
    const map = (await c.get(`/api/surveys/${surveyId}/map?planId=${plans['Ground floor'].id}`)).body;
    expect(map).toMatchObject({ readings: [], withoutPlan: 1, withoutPosition: 1 });
    const compliance = (await c.get(`/api/surveys/${surveyId}/compliance`)).body;
    expect(compliance.warnings.join(' ')).toMatch(/1 task reading\(s\) have a position but no plan/);
  });
});

describe('log upload: the planId field', () => {
  it('planId, when given, is the plan of rows with an empty plan cell; rows that name a plan keep theirs', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const res = await upload(surveyId, log(row('D-1', [3, 3]), row('D-2', null), row('D-3', [3, 3], 'Ground floor')), String(plans['First floor'].id));
    expect(res.status).toBe(202);
    const status = (await c.get(`/api/imports/${res.body.importId}`)).body;
    expect(status).toMatchObject({ status: 'done', planId: plans['First floor'].id });
    expect(await planIdsByPoint(surveyId)).toEqual({ 'D-1': plans['First floor'].id, 'D-2': plans['First floor'].id, 'D-3': plans['Ground floor'].id });
  });

  it('planId, when it is a plan of another site, another organisation\'s plan, unknown or not a number, is refused before anything is stored', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const otherSite = insertSite(t, orgOf(t, DEMO.surveyor), 'Another library');
    const elsewhere = (await c.post(`/api/sites/${otherSite}/plans`).field('name', 'Elsewhere floor').field('widthM', '10').attach('file', pngOf(40, 40, 31), { filename: 'p.png', contentType: 'image/png' })).body as Plan;
    const otherAdmin = await t.signIn(DEMO.otherAdmin);
    const theirSite = (await otherAdmin.get('/api/sites')).body.items[0];
    const theirs = (await otherAdmin.get(`/api/sites/${theirSite.id}/plans`)).body.items[0] as Plan;
    const cases: [string, number, RegExp][] = [
      [String(elsewhere.id), 400, /belongs to another site/],
      [String(theirs.id), 404, /not found/],
      ['999999', 404, /not found/],
      ['first floor', 400, /planId/],
    ];
    for (const [planId, code, message] of cases) {
      const before = tableCounts(t);
      const res = await upload(surveyId, log(row('X-1', [1, 1])), planId);
      expect(res.status, planId).toBe(code);
      expect(res.body.error.message).toMatch(message);
      expect(tableCounts(t)).toEqual(before);
    }
  });
});

describe('log import: a site with exactly one plan', () => {
  it('single plan, when rows name none, puts positioned rows on it and leaves rows without a position unplaced', async () => {
    const siteId = (await c.post('/api/sites').send({ name: 'One-floor hall', timeZone: 'Europe/London' })).body.id as number;
    const only = (await c.post(`/api/sites/${siteId}/plans`).field('name', 'Hall').field('widthM', '20').attach('file', pngOf(100, 60, 32), { filename: 'hall.png', contentType: 'image/png' })).body as Plan;
    const surveyId = (await c.post('/api/surveys').send({ siteId, name: 'Hall check' })).body.id as number;
    const { status } = await uploadAndWait(t, c, surveyId, `timestamp,probe,point,gain,counts,x_m,y_m\n${[row('H-1', [4, 4]), row('H-2', null)].map((r) => r.slice(0, r.lastIndexOf(','))).join('\n')}\n`);
    expect(status.status).toBe('done');
    expect(await planIdsByPoint(surveyId)).toEqual({ 'H-1': only.id, 'H-2': null });
    const map = (await c.get(`/api/surveys/${surveyId}/map`)).body;
    expect(map.readings.map((r: { point: string }) => r.point)).toEqual(['H-1']);
  });
});

describe('re-decoding keeps the plans', () => {
  it('re-decode, of readings on several plans, gives the new decode the same plan per reading', async () => {
    const surveyId = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, surveyId, log(row('R-1', [5, 5], 'Ground floor'), row('R-2', [5, 5], 'First floor'), row('R-3', [5, 5])));
    const before = await planIdsByPoint(surveyId);
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post(`/api/surveys/${surveyId}/redecode`);
    expect(res.status).toBe(200);
    expect(res.body.decodeId).not.toBe(res.body.previousDecodeId);
    expect(await planIdsByPoint(surveyId)).toEqual(before);
    expect(before).toEqual({ 'R-1': plans['Ground floor'].id, 'R-2': plans['First floor'].id, 'R-3': null });
  });
});
