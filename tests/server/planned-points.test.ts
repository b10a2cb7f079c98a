import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { insertSite, orgOf, pngOf, tableCounts } from './support/factories';
import { surveys } from '@server/db/schema/surveys';
import { auditEvents } from '@server/db/schema/organizations';

let t: TestApp;
let admin: TestClient;
let siteId: number;
let planId: number;
const zone: Record<string, number> = {};

const rect = (x: number, y: number, w: number, h: number) => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];

async function newSurvey(body: Record<string, unknown> = {}) {
  const res = await admin.post('/api/surveys').send({ siteId, name: `Grid survey ${Math.random().toString(36).slice(2, 7)}`, ...body });
  expect(res.status).toBe(201);
  return res.body.id as number;
}

// The demo seed imports two logs: give it time on a busy machine.
beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signIn(DEMO.admin);
  siteId = insertSite(t, orgOf(t, DEMO.admin), 'Grid test site');
  // 300 px × 200 px at 0.1 m/px: a 30 m × 20 m plan.
  const plan = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(300, 200, 3), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Level 0').field('widthM', '30');
  expect(plan.status).toBe(201);
  planId = plan.body.id;
  const zones = {
    office: { name: 'Office 1', kind: 'room', useType: 'office_writing', polygon: rect(0, 0, 11, 11) },
    desk: { name: 'Desk', kind: 'task_area', useType: 'office_writing', polygon: rect(2, 2, 5, 5) },
    ell: { name: 'Lab', kind: 'room', useType: 'technical_drawing', polygon: [[12, 0], [22, 0], [22, 4], [16, 4], [16, 10], [12, 10]] },
    corridor: { name: 'Corridor', kind: 'room', useType: 'corridor', polygon: rect(0, 12, 18, 2) },
  };
  for (const [k, z] of Object.entries(zones)) {
    const res = await admin.post(`/api/plans/${planId}/zones`).send(z);
    expect(res.status).toBe(201);
    zone[k] = res.body.id;
  }
}, 180_000);

describe('generating grids', () => {
  it('under the 2011 reading (the organisation default): a 10 m room less its band has 10 × 10 points labelled OF1-A1..OF1-J10', async () => {
    const surveyId = await newSurvey();
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.office });
    expect(res.status).toBe(200);
    expect(res.body.rounding).toBe('next_higher');
    const grid = res.body.grids[0];
    // Less the 0.5 m band: 10 m × 10 m, d = 10 m, p = 1 m (EN 12464-1 formula).
    expect(grid).toMatchObject({ code: 'OF1', layout: 'full', dM: 10, generatedCount: 100, pointCount: 100, changed: false, reason: null });
    expect(grid.spacingM).toBeCloseTo(1, 12);
    const labels = res.body.items.map((p: { label: string }) => p.label);
    expect(labels).toContain('OF1-A1');
    expect(labels).toContain('OF1-J10');
    const a1 = res.body.items.find((p: { label: string }) => p.label === 'OF1-A1');
    expect([a1.xM, a1.yM]).toEqual([1, 10]);
    const audit = t.db.select().from(auditEvents).where(and(eq(auditEvents.surveyId, surveyId), eq(auditEvents.entityType, 'survey_grid'))).all();
    expect(audit.map((a) => a.action)).toEqual(['generated']);
  });

  it('under both readings of the rounding: a 5 m task area gives 9 × 9 (next higher) or 8 × 8 (nearest); d/p = 8.12 (derived from the EN 12464-1 formula)', async () => {
    const surveyId = await newSurvey();
    const higher = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.desk });
    expect(higher.body.grids[0]).toMatchObject({ pointCount: 81, countsByRounding: { next_higher: 81, nearest: 64 }, roundingsDiffer: true });
    expect(higher.body.grids[0].notes.join(' ')).toMatch(/differ here: 81 points \(next higher\) against 64 \(nearest\)/);
    const nearest = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.desk, rounding: 'nearest' });
    expect(nearest.status).toBe(200);
    expect(nearest.body.rounding).toBe('nearest');
    expect(nearest.body.grids[0]).toMatchObject({ rounding: 'nearest', pointCount: 64, code: 'DE' });
    // The survey records the rule, and the change is in the audit trail.
    expect(t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.gridRounding).toBe('nearest');
    const events = t.db.select().from(auditEvents).where(eq(auditEvents.surveyId, surveyId)).all().map((a) => a.action);
    expect(events).toEqual(expect.arrayContaining(['generated', 'grid_rule_changed', 'regenerated']));
  });

  it('the organisation default decides a new survey\'s rule', async () => {
    expect((await admin.patch('/api/organization').send({ gridRounding: 'nearest' })).body.gridRounding).toBe('nearest');
    const surveyId = await newSurvey();
    expect((await admin.get(`/api/surveys/${surveyId}`)).body.gridRounding).toBe('nearest');
    await admin.patch('/api/organization').send({ gridRounding: 'next_higher' });
    expect((await admin.get(`/api/surveys/${await newSurvey()}`)).body.gridRounding).toBe('next_higher');
  });

  it('an L-shaped room keeps only the centres of its two arms (51 of the 10 × 10 box)', async () => {
    const surveyId = await newSurvey();
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.ell });
    expect(res.body.grids[0]).toMatchObject({ code: 'LA', pointCount: 51 });
    // Nothing in the cut-away corner (x > 16 and y > 4, less the band).
    expect(res.body.items.filter((p: { xM: number; yM: number }) => p.xM > 15.5 && p.yM > 3.5)).toEqual([]);
  });

  it('a narrow corridor: 425 points as a full grid, 12 on its centreline, and the zone says it is narrow', async () => {
    const surveyId = await newSurvey();
    const full = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.corridor });
    expect(full.body.grids[0]).toMatchObject({ pointCount: 425, narrow: true });
    const line = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.corridor, layout: 'centreline' });
    expect(line.body.grids[0]).toMatchObject({ layout: 'centreline', pointCount: 12, changed: false });
    expect(line.body.items.every((p: { yM: number }) => p.yM === 13)).toBe(true);
    // A wide room has no centreline alternative.
    const refused = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.office, layout: 'centreline' });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toMatch(/Office 1.*narrower than 2.5 m/);
  });

  it('a whole plan at once: one grid per zone, every label unique within the survey', async () => {
    const surveyId = await newSurvey();
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ planId });
    expect(res.status).toBe(200);
    expect(res.body.grids.map((g: { code: string }) => g.code).sort()).toEqual(['CO', 'DE', 'LA', 'OF1']);
    const labels = res.body.items.map((p: { label: string }) => p.label.toLowerCase());
    expect(new Set(labels).size).toBe(labels.length);
  });
});

describe('editing a grid and its reason', () => {
  async function officeGrid() {
    const surveyId = await newSurvey();
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.office });
    return { surveyId, points: res.body.items as { id: number; label: string; xM: number; yM: number }[], gridId: res.body.grids[0].id as number };
  }

  it('moving a point without a reason is refused (422 naming the zone) and nothing changes; with a reason it is kept and audited', async () => {
    const { surveyId, points } = await officeGrid();
    const p = points[0];
    const before = tableCounts(t);
    const refused = await admin.patch(`/api/surveys/${surveyId}/planned-points/${p.id}`).send({ xM: 1.4, yM: 9.6 });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toMatch(/zone "Office 1".*reason/);
    expect(tableCounts(t)).toEqual(before);
    const list = await admin.get(`/api/surveys/${surveyId}/planned-points`);
    expect(list.body.items.find((x: { id: number }) => x.id === p.id)).toMatchObject({ xM: 1, yM: 10 });

    const ok = await admin.patch(`/api/surveys/${surveyId}/planned-points/${p.id}`).send({ xM: 1.4, yM: 9.6, reason: 'Bookcase over the grid point' });
    expect(ok.status).toBe(200);
    const after = await admin.get(`/api/surveys/${surveyId}/planned-points`);
    expect(after.body.grids[0]).toMatchObject({ changed: true, reason: 'Bookcase over the grid point' });
    const moved = t.db.select().from(auditEvents).where(and(eq(auditEvents.surveyId, surveyId), eq(auditEvents.action, 'point_moved'))).get()!;
    expect(moved.after).toMatchObject({ label: 'OF1-A1', reason: 'Bookcase over the grid point' });
    // Once justified, further edits need no new reason.
    expect((await admin.delete(`/api/surveys/${surveyId}/planned-points/${points[1].id}`)).status).toBe(204);
  });

  it('labels stay stable when other points are edited; an added point gets the next free label; a label used twice is refused', async () => {
    const { surveyId, points, gridId } = await officeGrid();
    await admin.put(`/api/surveys/${surveyId}/grids/${gridId}/reason`).send({ reason: 'Furniture layout' }).expect(200);
    await admin.delete(`/api/surveys/${surveyId}/planned-points/${points.find((p) => p.label === 'OF1-B2')!.id}`).expect(204);
    const added = await admin.post(`/api/surveys/${surveyId}/planned-points`).send({ zoneId: zone.office, xM: 5.2, yM: 5.2 });
    expect(added.status).toBe(201);
    expect(added.body.label).toBe('OF1-N1');
    const list = await admin.get(`/api/surveys/${surveyId}/planned-points`);
    const b3 = list.body.items.find((p: { label: string }) => p.label === 'OF1-B3');
    expect(b3.id).toBe(points.find((p) => p.label === 'OF1-B3')!.id);
    const twice = await admin.post(`/api/surveys/${surveyId}/planned-points`).send({ zoneId: zone.office, xM: 6, yM: 6, label: 'of1-b3' });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/of1-b3 is already used by planned point OF1-B3/);
  });

  it('a point outside its plan or its zone is refused naming where; a zone of another organisation is 404', async () => {
    const { surveyId, points, gridId } = await officeGrid();
    await admin.put(`/api/surveys/${surveyId}/grids/${gridId}/reason`).send({ reason: 'Test' }).expect(200);
    const outPlan = await admin.patch(`/api/surveys/${surveyId}/planned-points/${points[0].id}`).send({ xM: 31, yM: 2 });
    expect(outPlan.status).toBe(422);
    expect(outPlan.body.error.message).toMatch(/Point OF1-A1 at \(31, 2\) m lies outside plan "Level 0"/);
    const outZone = await admin.post(`/api/surveys/${surveyId}/planned-points`).send({ zoneId: zone.office, xM: 20, yM: 2 });
    expect(outZone.status).toBe(422);
    expect(outZone.body.error.message).toMatch(/outside zone "Office 1"/);
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.office })).status).toBe(404);
    expect((await other.get(`/api/surveys/${surveyId}/planned-points`)).status).toBe(404);
  });

  it('a plan without a scale is refused (409 naming the plan)', async () => {
    const bare = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(40, 30, 9), { filename: 'b.png', contentType: 'image/png' }).field('name', 'Unscaled loft');
    const surveyId = await newSurvey();
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ planId: bare.body.id });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/Plan "Unscaled loft" has no scale/);
  });

  it('a signed-off survey refuses every change to its planned points', async () => {
    const { surveyId, points } = await officeGrid();
    t.db.update(surveys).set({ status: 'signed_off' }).where(eq(surveys.id, surveyId)).run();
    const before = tableCounts(t);
    for (const res of [
      await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: zone.office }),
      await admin.patch(`/api/surveys/${surveyId}/planned-points/${points[0].id}`).send({ xM: 2, yM: 2, reason: 'late' }),
      await admin.delete(`/api/surveys/${surveyId}/planned-points/${points[0].id}?reason=late`),
    ]) {
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/signed off/);
    }
    expect(tableCounts(t)).toEqual(before);
  });
});
