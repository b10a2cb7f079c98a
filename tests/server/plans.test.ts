import { describe, it, expect, beforeAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { insertSite, insertSurveyWithReadings, orgOf, pngOf, userId } from './support/factories';
import { plans } from '@server/db/schema/plans';
import { auditEvents } from '@server/db/schema/organizations';

let t: TestApp;
let surveyor: TestClient;
let siteId: number;
let otherSiteId: number;

beforeAll(async () => {
  t = await createTestApp();
  surveyor = await t.signIn(DEMO.surveyor);
  siteId = insertSite(t, orgOf(t, DEMO.surveyor), 'Plan test site');
  otherSiteId = insertSite(t, orgOf(t, DEMO.otherAdmin), 'Elsewhere site');
});

function upload(c: TestClient, site: number, image: Buffer, fields: Record<string, string> = { name: 'Ground floor' }, filename = 'plan.png') {
  const req = c.post(`/api/sites/${site}/plans`).attach('file', image, { filename, contentType: 'image/png' });
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req;
}

describe('POST /api/sites/:id/plans', () => {
  it('upload, with a PNG and a width in metres, stores the plan with its pixel size and scale', async () => {
    const res = await upload(surveyor, siteId, pngOf(360, 200), { name: 'Ground floor', widthM: '36' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ siteId, name: 'Ground floor', widthPx: 360, heightPx: 200, metresPerPixel: 0.1, widthM: 36, heightM: 20, zoneCount: 0, contentType: 'image/png' });
    expect(res.body.imageSha256).toMatch(/^[0-9a-f]{64}$/);
    const audit = t.db.select().from(auditEvents).where(eq(auditEvents.entityType, 'plan')).all();
    expect(audit.some((a) => a.entityId === res.body.id && a.action === 'created')).toBe(true);
  });

  it('upload, without a width, leaves the scale unset', async () => {
    const res = await upload(surveyor, siteId, pngOf(100, 80, 1), { name: 'Unscaled' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ metresPerPixel: null, widthM: null, heightM: null });
  });

  it('upload, when the file is text named .png, answers 415 and stores nothing', async () => {
    const before = t.db.select().from(plans).all().length;
    const res = await upload(surveyor, siteId, Buffer.from('x,y\n1,2\n'), { name: 'Fake' }, 'fake.png');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/PNG, JPEG or WebP/);
    expect(t.db.select().from(plans).all().length).toBe(before);
  });

  it('upload, without a name, answers 400 naming the field', async () => {
    const res = await upload(surveyor, siteId, pngOf(50, 50), {});
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/"name"/);
  });

  it('upload, without a file, answers 400 naming the field "file"', async () => {
    const res = await surveyor.post(`/api/sites/${siteId}/plans`).field('name', 'No file');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/"file"/);
  });

  it('upload, with a width of zero, answers 400 saying the width must be positive', async () => {
    const res = await upload(surveyor, siteId, pngOf(50, 50), { name: 'Zero', widthM: '0' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/more than 0 m/);
  });

  it('upload, to another organisation\'s site, answers 404', async () => {
    const res = await upload(surveyor, otherSiteId, pngOf(50, 50));
    expect(res.status).toBe(404);
  });

  it('upload, by a facility manager, answers 403', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    expect((await upload(fm, siteId, pngOf(50, 50))).status).toBe(403);
  });
});

describe('GET /api/sites/:id/plans and /api/plans/:id/image', () => {
  it('list, for the site, gives its plans; for another organisation\'s site, answers 404', async () => {
    const mine = await surveyor.get(`/api/sites/${siteId}/plans`);
    expect(mine.status).toBe(200);
    expect(mine.body.items.length).toBeGreaterThanOrEqual(1);
    expect(mine.body.items.every((p: { siteId: number }) => p.siteId === siteId)).toBe(true);
    expect((await surveyor.get(`/api/sites/${otherSiteId}/plans`)).status).toBe(404);
  });

  it('image, for a member of the organisation, is the uploaded bytes with ETag = SHA-256 and private caching', async () => {
    const image = pngOf(120, 90, 7);
    const created = (await upload(surveyor, siteId, image, { name: 'Image test', widthM: '12' })).body;
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.get(`/api/plans/${created.id}/image`).buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('image/png');
    expect(res.headers.etag).toBe(`"${created.imageSha256}"`);
    expect(res.headers['cache-control']).toMatch(/private/);
    expect(Buffer.compare(res.body as Buffer, image)).toBe(0);
  });

  it('image, when the ETag matches, answers 304 without a body', async () => {
    const created = (await upload(surveyor, siteId, pngOf(64, 64, 9), { name: 'Etag' })).body;
    const res = await surveyor.get(`/api/plans/${created.id}/image`).set('If-None-Match', `"${created.imageSha256}"`);
    expect(res.status).toBe(304);
  });

  it('image, for a user of another organisation guessing the id, answers 404', async () => {
    const created = (await upload(surveyor, siteId, pngOf(64, 48, 11), { name: 'Private' })).body;
    const other = await t.signIn(DEMO.otherAdmin);
    const res = await other.get(`/api/plans/${created.id}/image`);
    expect(res.status).toBe(404);
    expect((await other.get(`/api/plans/${created.id}`)).status).toBe(404);
    expect((await other.get(`/api/plans/${created.id}/zones`)).status).toBe(404);
  });

  it('image, without a session, answers 401', async () => {
    expect((await t.client().get('/api/plans/1/image')).status).toBe(401);
  });
});

describe('PATCH /api/plans/:id', () => {
  it('scale by two points 300 px apart and 15 m, sets 0.05 m per pixel', async () => {
    const created = (await upload(surveyor, siteId, pngOf(400, 300, 13), { name: 'To scale' })).body;
    const res = await surveyor.patch(`/api/plans/${created.id}`).send({ scalePoints: [[50, 100], [350, 100]], distanceM: 15 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.metresPerPixel).toBeCloseTo(0.05, 12);
    expect(res.body.widthM).toBeCloseTo(20, 9);
    expect(res.body.heightM).toBeCloseTo(15, 9);
  });

  it('scale by diagonal points (3-4-5 triangle of 30, 40 px) and 10 m, sets 0.2 m per pixel', async () => {
    const created = (await upload(surveyor, siteId, pngOf(100, 100, 14), { name: 'Diagonal' })).body;
    const res = await surveyor.patch(`/api/plans/${created.id}`).send({ scalePoints: [[10, 10], [40, 50]], distanceM: 10 });
    expect(res.body.metresPerPixel).toBeCloseTo(0.2, 12);
  });

  it('scale change, when zones exist, rescales their corners so they stay on the same image pixels', async () => {
    const created = (await upload(surveyor, siteId, pngOf(200, 100, 15), { name: 'Rescale', widthM: '20' })).body;
    const zone = (await surveyor.post(`/api/plans/${created.id}/zones`).send({ name: 'Room', kind: 'room', useType: 'office_writing', polygon: [[0, 0], [10, 0], [10, 5], [0, 5]] })).body;
    await surveyor.patch(`/api/plans/${created.id}`).send({ widthM: 40 });
    const zones = (await surveyor.get(`/api/plans/${created.id}/zones`)).body.items;
    expect(zones.find((z: { id: number }) => z.id === zone.id).polygon).toEqual([[0, 0], [20, 0], [20, 10], [0, 10]]);
  });

  it('scale, when the two points are 3 px apart, answers 422 asking for points further apart', async () => {
    const created = (await upload(surveyor, siteId, pngOf(100, 100, 16), { name: 'Close' })).body;
    const res = await surveyor.patch(`/api/plans/${created.id}`).send({ scalePoints: [[10, 10], [13, 10]], distanceM: 1 });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/3\.0 pixels apart/);
  });

  it('scale, when a point lies outside the image, answers 422 naming the point', async () => {
    const created = (await upload(surveyor, siteId, pngOf(100, 100, 17), { name: 'Outside' })).body;
    const res = await surveyor.patch(`/api/plans/${created.id}`).send({ scalePoints: [[10, 10], [500, 10]], distanceM: 1 });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/Scale point 2 lies outside the image/);
  });

  it('scale, with points but no distance, answers 400 naming distanceM', async () => {
    const res = await surveyor.patch('/api/plans/1').send({ scalePoints: [[0, 0], [50, 0]] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/distanceM/);
  });

  it('rename, of another organisation\'s plan, answers 404', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const mine = (await surveyor.get(`/api/sites/${siteId}/plans`)).body.items[0];
    expect((await other.patch(`/api/plans/${mine.id}`).send({ name: 'Hijack' })).status).toBe(404);
  });
});

describe('GET /api/surveys/:id/map', () => {
  it('map, for a survey with points in a room, a task area, the wall band and beyond the plan\'s edge, marks each', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(200, 120, 21), { name: 'Map plan', widthM: '20' })).body; // 20 m x 12 m
    const room = (await surveyor.post(`/api/plans/${plan.id}/zones`).send({ name: 'Room', kind: 'room', useType: 'library_reading', polygon: [[0, 0], [20, 0], [20, 12], [0, 12]] })).body;
    const desk = (await surveyor.post(`/api/plans/${plan.id}/zones`).send({ name: 'Desk', kind: 'task_area', useType: 'office_writing', polygon: [[4, 3], [12, 3], [12, 8], [4, 8]] })).body;
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.surveyor), siteId, [
      { point: 'R1', x: 2, y: 2, lux: 400 },
      { point: 'R2', x: 16, y: 10, lux: 600 },
      { point: 'W1', x: 0.2, y: 6, lux: 100 },
      { point: 'D1', x: 8, y: 5, lux: 700 },
      { point: 'OUT', x: 50, y: 50, lux: 10 },
      { point: 'NOPOS', x: null, y: null, lux: 300 },
      { point: 'REF', x: 19, y: 11, lux: 12000, role: 'reference' },
    ], 'Map survey', plan.id);
    const res = await surveyor.get(`/api/surveys/${surveyId}/map?planId=${plan.id}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const byPoint = Object.fromEntries(res.body.readings.map((r: { point: string }) => [r.point, r]));
    expect(Object.keys(byPoint).sort()).toEqual(['D1', 'R1', 'R2', 'REF', 'W1']);
    expect(byPoint.R1).toMatchObject({ zoneId: room.id, inWallBand: false, lux: 400, luxBound: 'exact', flag: 'ok', gainCode: 2 });
    expect(byPoint.W1).toMatchObject({ zoneId: room.id, inWallBand: true });
    expect(byPoint.D1).toMatchObject({ zoneId: desk.id, inWallBand: false });
    expect(byPoint.REF).toMatchObject({ zoneId: null, role: 'reference' });
    expect(res.body.withoutPosition).toBe(1);
    expect(res.body.outsidePlan).toBe(1);
    expect(res.body.withoutPlan).toBe(0);
    const roomSummary = res.body.zones.find((z: { zoneId: number }) => z.zoneId === room.id);
    // Wall-band point W1 is left out of the room's average: (400 + 600) / 2.
    expect(roomSummary).toMatchObject({ points: 2, wallBandPoints: 1, eavg: 500, eavgBound: null });
    expect(res.body.zones.find((z: { zoneId: number }) => z.zoneId === desk.id)).toMatchObject({ points: 1, eavg: 700 });
  });

  it('map, for two plans whose frames overlap, shows each plan only the readings taken on it and counts those with no plan', async () => {
    const ground = (await upload(surveyor, siteId, pngOf(100, 100, 24), { name: 'Overlap ground', widthM: '10' })).body;
    const upper = (await upload(surveyor, siteId, pngOf(100, 100, 25), { name: 'Overlap upper', widthM: '10' })).body;
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.surveyor), siteId, [
      { point: 'G1', x: 2, y: 2, lux: 400, plan: ground.id },
      { point: 'G2', x: 5, y: 5, lux: 420, plan: ground.id },
      { point: 'U1', x: 2, y: 2, lux: 300, plan: upper.id },
      { point: 'LOST', x: 3, y: 3, lux: 350, plan: null },
      { point: 'NOPOS', x: null, y: null, lux: 10, plan: ground.id },
    ], 'Overlap survey');
    const onGround = (await surveyor.get(`/api/surveys/${surveyId}/map?planId=${ground.id}`)).body;
    const onUpper = (await surveyor.get(`/api/surveys/${surveyId}/map?planId=${upper.id}`)).body;
    // Same coordinates, different floors: the stored plan decides, never the position.
    expect(onGround.readings.map((r: { point: string }) => r.point)).toEqual(['G1', 'G2']);
    expect(onUpper.readings.map((r: { point: string }) => r.point)).toEqual(['U1']);
    for (const m of [onGround, onUpper]) expect(m).toMatchObject({ withoutPlan: 1, withoutPosition: 1, outsidePlan: 0 });
  });

  it('map, for a plan of another site, answers 422 saying so', async () => {
    const otherSite = insertSite(t, orgOf(t, DEMO.surveyor), 'Second site');
    const plan = (await upload(surveyor, otherSite, pngOf(50, 50, 22), { name: 'Elsewhere', widthM: '5' })).body;
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.surveyor), siteId, [{ point: 'A', x: 1, y: 1, lux: 1 }]);
    const res = await surveyor.get(`/api/surveys/${surveyId}/map?planId=${plan.id}`);
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/another site/);
  });

  it('map, for a plan without a scale, places nothing and says to set the scale', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(50, 50, 23), { name: 'No scale' })).body;
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.surveyor), siteId, [{ point: 'A', x: 1, y: 1, lux: 1 }]);
    const res = await surveyor.get(`/api/surveys/${surveyId}/map?planId=${plan.id}`);
    expect(res.status).toBe(200);
    expect(res.body.readings).toEqual([]);
    expect(res.body.notice).toMatch(/scale/);
  });

  it('map, of another organisation\'s survey, answers 404', async () => {
    const surveyId = insertSurveyWithReadings(t, orgOf(t, DEMO.otherAdmin), otherSiteId, [{ point: 'A', x: 1, y: 1, lux: 1 }]);
    expect((await surveyor.get(`/api/surveys/${surveyId}/map`)).status).toBe(404);
  });

  it('map, for a calibration user (no surveys.read), answers 403', async () => {
    const cal = await t.signIn(DEMO.calibration);
    expect((await cal.get('/api/surveys/1/map')).status).toBe(403);
  });
});

describe('DELETE /api/plans/:id', () => {
  it('an unused plan, when deleted, is gone from the site and the audit trail says who deleted it', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(120, 90, 40), { name: 'Uploaded by mistake', widthM: '12' })).body as { id: number };
    expect((await surveyor.delete(`/api/plans/${plan.id}`)).status).toBe(204);
    expect((await surveyor.get(`/api/plans/${plan.id}`)).status).toBe(404);
    expect(((await surveyor.get(`/api/sites/${siteId}/plans`)).body.items as { id: number }[]).some((p) => p.id === plan.id)).toBe(false);
    const audit = t.db.select().from(auditEvents).where(eq(auditEvents.entityType, 'plan')).all().find((a) => a.entityId === plan.id && a.action === 'deleted');
    expect(audit?.actorId).toBe(userId(t, DEMO.surveyor).id);
    expect(audit?.before).toMatchObject({ name: 'Uploaded by mistake', siteId });
  });

  it('a plan with zones, when deleted, answers 409 saying to delete the zones first, and keeps plan and zones', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(120, 90, 41), { name: 'With a zone', widthM: '12' })).body as { id: number };
    const zone = await surveyor.post(`/api/plans/${plan.id}/zones`).send({ name: 'Store', kind: 'room', useType: 'corridor', polygon: [[1, 1], [5, 1], [5, 4], [1, 4]] });
    expect(zone.status).toBe(201);
    const res = await surveyor.delete(`/api/plans/${plan.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('Plan "With a zone" has 1 zone(s): delete them first, then the plan');
    expect((await surveyor.get(`/api/plans/${plan.id}/zones`)).body.items).toHaveLength(1);
  });

  it('a plan holding a survey\'s readings, when deleted, answers 409 naming the survey and keeps the plan', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(120, 90, 42), { name: 'Walked plan', widthM: '12' })).body as { id: number };
    insertSurveyWithReadings(t, orgOf(t, DEMO.surveyor), siteId, [{ point: 'P1', x: 2, y: 2, lux: 300 }], 'Walk on the walked plan', plan.id);
    const res = await surveyor.delete(`/api/plans/${plan.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/holds readings of 1 survey\(s\) \(Walk on the walked plan\): it stays as their record/);
    expect((await surveyor.get(`/api/plans/${plan.id}`)).status).toBe(200);
  });

  it('another organisation\'s plan, when deleted, answers 404 and stays', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const plan = (await upload(other, otherSiteId, pngOf(120, 90, 43), { name: 'Theirs' })).body as { id: number };
    expect((await surveyor.delete(`/api/plans/${plan.id}`)).status).toBe(404);
    expect((await other.get(`/api/plans/${plan.id}`)).status).toBe(200);
  });
});

describe('PUT /api/plans/:id/image', () => {
  const replace = (c: TestClient, planId: number, image: Buffer, filename = 'revised.png') =>
    c.put(`/api/plans/${planId}/image`).attach('file', image, { filename, contentType: 'image/png' });

  it('a revised image at twice the resolution, when it replaces the plan\'s, keeps the width in metres, so zones keep their coordinates', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(200, 100, 50), { name: 'To be revised', widthM: '20' })).body as { id: number; imageSha256: string; imageUrl: string };
    const zone = (await surveyor.post(`/api/plans/${plan.id}/zones`).send({ name: 'Hall', kind: 'room', useType: 'corridor', polygon: [[1, 1], [19, 1], [19, 9], [1, 9]] })).body as { polygon: [number, number][] };
    const res = await replace(surveyor, plan.id, pngOf(400, 200, 51));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 20 m over 400 px: 0.05 m per pixel; the height follows the image (200 px = 10 m).
    expect(res.body).toMatchObject({ widthPx: 400, heightPx: 200, metresPerPixel: 0.05, widthM: 20, heightM: 10 });
    expect(res.body.imageSha256).not.toBe(plan.imageSha256);
    // The new image is served at a new address (no cache can show the old one).
    const image = await surveyor.get(res.body.imageUrl).buffer(true);
    expect(image.status).toBe(200);
    expect(image.headers.etag).toBe(`"${res.body.imageSha256}"`);
    expect(res.body.imageUrl).not.toBe(plan.imageUrl);
    const zones = (await surveyor.get(`/api/plans/${plan.id}/zones`)).body.items as { polygon: [number, number][] }[];
    expect(zones[0].polygon).toEqual(zone.polygon);
    const audit = t.db.select().from(auditEvents).where(eq(auditEvents.entityType, 'plan')).all().find((a) => a.entityId === plan.id && a.action === 'image_replaced');
    expect(audit?.before).toMatchObject({ widthPx: 200, heightPx: 100, metresPerPixel: 0.1 });
    expect(audit?.after).toMatchObject({ widthPx: 400, heightPx: 200, metresPerPixel: 0.05 });
  });

  it('an image of other proportions that would cut a zone off, when it replaces the plan\'s, answers 422 naming the zone, and the plan stays as it was', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(200, 100, 52), { name: 'Tall zone plan', widthM: '20' })).body as { id: number };
    await surveyor.post(`/api/plans/${plan.id}/zones`).send({ name: 'Deep room', kind: 'room', useType: 'corridor', polygon: [[1, 1], [5, 1], [5, 9], [1, 9]] });
    // 200 x 50 px at 20 m wide: 5 m high, but the zone reaches 9 m.
    const res = await replace(surveyor, plan.id, pngOf(200, 50, 53));
    expect(res.status).toBe(422);
    expect(res.body.error.message).toBe('Zone "Deep room" reaches 9.00 m up, but at this plan\'s width (20.00 m) the new image is only 5.00 m high: use an image of the same drawing with the same proportions, or redraw the zone');
    expect((await surveyor.get(`/api/plans/${plan.id}`)).body).toMatchObject({ widthPx: 200, heightPx: 100, metresPerPixel: 0.1 });
  });

  it('a file that is not an image, when it replaces the plan\'s, answers 415 and the plan keeps its image', async () => {
    const plan = (await upload(surveyor, siteId, pngOf(120, 90, 54), { name: 'Keeps its image' })).body as { id: number; imageSha256: string };
    const res = await replace(surveyor, plan.id, Buffer.from('timestamp,probe\n'), 'notes.png');
    expect(res.status).toBe(415);
    expect((await surveyor.get(`/api/plans/${plan.id}`)).body.imageSha256).toBe(plan.imageSha256);
  });

  it('another organisation\'s plan, when its image is replaced, answers 404', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const plan = (await upload(other, otherSiteId, pngOf(120, 90, 55), { name: 'Not yours' })).body as { id: number };
    expect((await replace(surveyor, plan.id, pngOf(120, 90, 56))).status).toBe(404);
  });
});
