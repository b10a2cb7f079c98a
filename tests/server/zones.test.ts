import { describe, it, expect, beforeAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { insertSite, orgOf, pngOf } from './support/factories';
import { zones } from '@server/db/schema/plans';
import { auditEvents } from '@server/db/schema/organizations';

let t: TestApp;
let surveyor: TestClient;
let planId: number;
let unscaledPlanId: number;

const officeA = { name: 'Office A', kind: 'room', useType: 'office_writing', polygon: [[20, 0], [28, 0], [28, 6], [20, 6]] };

beforeAll(async () => {
  t = await createTestApp();
  surveyor = await t.signIn(DEMO.surveyor);
  const siteId = insertSite(t, orgOf(t, DEMO.surveyor));
  const scaled = await surveyor.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(360, 200), { filename: 'g.png', contentType: 'image/png' }).field('name', 'Ground').field('widthM', '36');
  planId = scaled.body.id;
  const unscaled = await surveyor.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(100, 100, 3), { filename: 'u.png', contentType: 'image/png' }).field('name', 'Unscaled');
  unscaledPlanId = unscaled.body.id;
});

describe('POST /api/plans/:id/zones', () => {
  it('create, with a valid rectangle, stores it with the default working plane 0.75 m and wall band 0.5 m, and its area', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send(officeA);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ planId, name: 'Office A', kind: 'room', useType: 'office_writing', planeHeightM: 0.75, wallBandM: 0.5, areaM2: 48, targetId: null });
    const audit = t.db.select().from(auditEvents).where(eq(auditEvents.entityType, 'zone')).all();
    expect(audit.some((a) => a.entityId === res.body.id && a.action === 'created')).toBe(true);
  });

  it('create, with a closing corner repeating the first, stores the outline without it', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, name: 'Closed', polygon: [[0, 0], [5, 0], [5, 5], [0, 0]] });
    expect(res.status).toBe(201);
    expect(res.body.polygon).toEqual([[0, 0], [5, 0], [5, 5]]);
  });

  it('create, with two corners, answers 422 with a clear message and stores nothing', async () => {
    const before = t.db.select().from(zones).all().length;
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, polygon: [[0, 0], [5, 5]] });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/at least 3 distinct corners/);
    expect(t.db.select().from(zones).all().length).toBe(before);
  });

  it('create, with a self-intersecting outline, answers 422 saying where it crosses itself', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, polygon: [[0, 0], [10, 10], [10, 0], [0, 10]] });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/crosses itself near \(5, 5\) m/);
    expect(res.body.error.details.problems).toHaveLength(1);
  });

  it('create, with a corner outside the 36 m x 20 m plan, answers 422 naming the corner', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, polygon: [[30, 15], [40, 15], [40, 19], [30, 19]] });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/Corner 2 \(40, 15\) m lies outside the plan/);
  });

  it('create, on a plan without a scale, answers 409 asking to set the scale first', async () => {
    const res = await surveyor.post(`/api/plans/${unscaledPlanId}/zones`).send(officeA);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/scale/);
  });

  it('create, with an unknown use type or kind, answers 400 naming the field', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, useType: 'ballroom' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/"useType"/);
    const kind = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, kind: 'garden' });
    expect(kind.body.error.message).toMatch(/"kind"/);
  });

  it('create, with a negative wall band, answers 400', async () => {
    const res = await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, wallBandM: -1 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/wallBandM/);
  });

  it('create, by a facility manager, answers 403', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    expect((await fm.post(`/api/plans/${planId}/zones`).send(officeA)).status).toBe(403);
  });
});

describe('PATCH and DELETE /api/zones/:id', () => {
  it('update, of the name and wall band, keeps the outline', async () => {
    const z = (await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, name: 'Before' })).body;
    const res = await surveyor.patch(`/api/zones/${z.id}`).send({ name: 'After', wallBandM: 0 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'After', wallBandM: 0, polygon: officeA.polygon });
  });

  it('update, to a self-intersecting outline, answers 422 and leaves the stored outline as it was', async () => {
    const z = (await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, name: 'Keep' })).body;
    const res = await surveyor.patch(`/api/zones/${z.id}`).send({ polygon: [[0, 0], [10, 10], [10, 0], [0, 10]] });
    expect(res.status).toBe(422);
    expect(t.db.select().from(zones).where(eq(zones.id, z.id)).get()!.polygon).toEqual(officeA.polygon);
  });

  it('update, with an empty body, answers 400', async () => {
    const z = (await surveyor.post(`/api/plans/${planId}/zones`).send(officeA)).body;
    expect((await surveyor.patch(`/api/zones/${z.id}`).send({})).status).toBe(400);
  });

  it('delete, of a zone, removes it from the plan\'s list', async () => {
    const z = (await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, name: 'Doomed' })).body;
    expect((await surveyor.delete(`/api/zones/${z.id}`)).status).toBe(204);
    const list = (await surveyor.get(`/api/plans/${planId}/zones`)).body.items;
    expect(list.some((x: { id: number }) => x.id === z.id)).toBe(false);
  });

  it('update and delete, of another organisation\'s zone (guessed id), answer 404 and change nothing', async () => {
    const z = (await surveyor.post(`/api/plans/${planId}/zones`).send({ ...officeA, name: 'Mine' })).body;
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.patch(`/api/zones/${z.id}`).send({ name: 'Theirs' })).status).toBe(404);
    expect((await other.delete(`/api/zones/${z.id}`)).status).toBe(404);
    expect(t.db.select().from(zones).where(eq(zones.id, z.id)).get()!.name).toBe('Mine');
  });

  it('list, by a facility manager (sites.read), gives the zones', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.get(`/api/plans/${planId}/zones`);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
  });
});
