import { describe, it, expect, beforeEach } from 'vitest';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { LUX_PER_FOOTCANDLE } from '@shared/core/units';
import { auditEvents } from '@server/db/schema/organizations';
import { eq } from 'drizzle-orm';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

const body = { useType: 'client_office', name: 'Client office spec', emValue: 600, sourceUnit: 'lx', u0Min: 0.7, source: 'Client specification FC-07, clause 4.2', confidence: 'published' };

describe('GET /api/targets', () => {
  it('shipped library, when listed, holds every use type of the demo zones with its marks', async () => {
    const c = await t.signIn(DEMO.facility_manager);
    const res = await c.get('/api/targets');
    expect(res.status).toBe(200);
    const byUse = new Map(res.body.items.map((i: { useType: string }) => [i.useType, i]));
    for (const useType of ['library_reading', 'office_writing', 'conference', 'corridor', 'toilets', 'stairs', 'storage', 'car_park', 'walkway']) {
      expect(byUse.has(useType), useType).toBe(true);
    }
    // DOMAIN.md section 5 (secondary source): offices 500 lx, U0 0.60; corridors 100 lx, U0 0.40; conference rooms marked memory.
    expect(byUse.get('office_writing')).toMatchObject({ emLux: 500, u0Min: 0.6, confidence: 'secondary', shipped: true });
    expect(byUse.get('corridor')).toMatchObject({ emLux: 100, u0Min: 0.4, confidence: 'secondary' });
    expect(byUse.get('conference')).toMatchObject({ confidence: 'memory' });
  });

  it('OSHA entries, when listed, keep foot-candles as the source unit and store lux', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.get('/api/targets');
    // OSHA 29 CFR 1926.56 Table D-3 (osha.gov e-CFR text): 30 fc for offices and first-aid stations, 10 fc shops.
    const offices = res.body.items.find((i: { useType: string }) => i.useType === 'osha_offices');
    expect(offices).toMatchObject({ sourceUnit: 'fc', emSourceValue: 30, confidence: 'published' });
    // 1 fc = 1 / 0.3048^2 lx (exact by definition of the foot).
    expect(offices.emLux).toBeCloseTo(30 * 10.7639104167, 6);
    const shops = res.body.items.find((i: { useType: string }) => i.useType === 'osha_shops');
    expect(shops.emLux).toBeCloseTo(10 * LUX_PER_FOOTCANDLE, 9);
  });
});

describe('POST /api/targets and PATCH /api/targets/:id', () => {
  it('an admin entry, when created in fc, is stored in lux, audited and listed for the organisation only', async () => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/targets').send({ ...body, emValue: 50, sourceUnit: 'fc' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ useType: 'client_office', sourceUnit: 'fc', emSourceValue: 50, shipped: false });
    expect(res.body.emLux).toBeCloseTo(50 * LUX_PER_FOOTCANDLE, 9);
    const audit = t.db.select().from(auditEvents).where(eq(auditEvents.entityType, 'target')).all();
    expect(audit.map((a) => a.action)).toEqual(['created']);

    const other = await t.signIn(DEMO.otherAdmin);
    const list = await other.get('/api/targets');
    expect(list.body.items.some((i: { id: number }) => i.id === res.body.id)).toBe(false);
    const patch = await other.patch(`/api/targets/${res.body.id}`).send({ name: 'taken over' });
    expect(patch.status).toBe(404);
  });

  it('a shipped entry, when patched, is refused with a message naming the way out', async () => {
    const admin = await t.signIn(DEMO.admin);
    const shipped = (await admin.get('/api/targets')).body.items.find((i: { useType: string }) => i.useType === 'corridor');
    const res = await admin.patch(`/api/targets/${shipped.id}`).send({ emValue: 50 });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/read-only.*own entry/);
  });

  it('an entry, when edited, changes only the given fields', async () => {
    const admin = await t.signIn(DEMO.admin);
    const created = (await admin.post('/api/targets').send(body)).body;
    const res = await admin.patch(`/api/targets/${created.id}`).send({ emValue: 750 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ emLux: 750, u0Min: 0.7, name: 'Client office spec', source: body.source });
  });

  it('bad input, when posted, answers 400 naming the field', async () => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/targets').send({ ...body, useType: 'Client Office', u0Min: 1.4 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/useType|u0Min/);
    const fields = res.body.error.details.map((d: { path: string }) => d.path);
    expect(fields).toEqual(expect.arrayContaining(['useType', 'u0Min']));
  });

  it('a second own entry for the same use type, when posted, answers 409', async () => {
    const admin = await t.signIn(DEMO.admin);
    await admin.post('/api/targets').send(body);
    const res = await admin.post('/api/targets').send({ ...body, name: 'again' });
    expect(res.status).toBe(409);
  });
});
