import { describe, it, expect, beforeAll } from 'vitest';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { assignSites, unassignSites } from './support/factories';
import { surveys } from '@server/db/schema/surveys';
import { eq } from 'drizzle-orm';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

describe('sites API', () => {
  it('creates a site, when the time zone is an IANA name, and lists it for the organisation', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const created = await c.post('/api/sites').send({ name: 'Harrowgate Depot', address: '3 Kiln Lane', timeZone: 'America/Chicago' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Harrowgate Depot', address: '3 Kiln Lane', timeZone: 'America/Chicago', surveyCount: 0 });
    const list = await c.get('/api/sites');
    expect(list.body.items.map((s: { name: string }) => s.name)).toContain('Harrowgate Depot');
    const one = await c.get(`/api/sites/${created.body.id}`);
    expect(one.body.id).toBe(created.body.id);
  });

  it('a site with two surveys, when listed, counts two (and one without any counts none)', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const counted = (await c.post('/api/sites').send({ name: 'Counted Works', timeZone: 'Europe/London' })).body;
    const empty = (await c.post('/api/sites').send({ name: 'Empty Works', timeZone: 'Europe/London' })).body;
    for (const name of ['Spring walk', 'Autumn walk']) expect((await c.post('/api/surveys').send({ siteId: counted.id, name })).status).toBe(201);
    const items = (await c.get('/api/sites')).body.items as { id: number; surveyCount: number }[];
    expect(items.find((s) => s.id === counted.id)?.surveyCount).toBe(2);
    expect(items.find((s) => s.id === empty.id)?.surveyCount).toBe(0);
    expect((await c.get(`/api/sites/${counted.id}`)).body.surveyCount).toBe(2);
  });

  it('rejects a site, when the time zone is not an IANA name, with a message naming the field', async () => {
    const c = await t.signIn(DEMO.surveyor);
    for (const timeZone of ['Mars/Olympus', 'GMT+1 summer', '']) {
      const res = await c.post('/api/sites').send({ name: 'Bad zone', timeZone });
      expect(res.status, timeZone).toBe(400);
      expect(res.body.error.message).toMatch(/timeZone/);
    }
  });

  it('answers 404, when a site of another organisation is asked for by id', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const own = await other.get('/api/sites');
    expect(own.body.items).toHaveLength(1);
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.get(`/api/sites/${own.body.items[0].id}`);
    expect(res.status).toBe(404);
    const list = await c.get('/api/sites');
    expect(list.body.items.some((s: { id: number }) => s.id === own.body.items[0].id)).toBe(false);
  });

  it('shows a facility manager limited to sites only those sites and their surveys', async () => {
    const admin = await t.signIn(DEMO.admin);
    const extra = await admin.post('/api/sites').send({ name: 'Scoped annexe', timeZone: 'Europe/London' });
    const library = (await admin.get('/api/sites')).body.items.find((s: { name: string }) => s.name === 'Fernmoor Community Library');
    const fmId = (await admin.get('/api/users')).body.items.find((u: { email: string }) => u.email === DEMO.facility_manager).id;
    assignSites(t, fmId, [extra.body.id]);
    try {
      const fm = await t.signIn(DEMO.facility_manager);
      const sites = await fm.get('/api/sites');
      expect(sites.body.items.map((s: { id: number }) => s.id)).toEqual([extra.body.id]);
      expect((await fm.get(`/api/sites/${library.id}`)).status).toBe(404);
      const librarySurvey = (await admin.get('/api/surveys')).body.items.find((s: { siteId: number }) => s.siteId === library.id);
      expect((await fm.get(`/api/surveys/${librarySurvey.id}`)).status).toBe(404);
      expect((await fm.get('/api/surveys')).body.items).toEqual([]);
    } finally {
      unassignSites(t, fmId);
    }
  });
});

describe('surveys API', () => {
  it('creates a draft survey of a site, when the body is valid, with its conditions', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const site = (await c.get('/api/sites')).body.items[0];
    const res = await c.post('/api/surveys').send({ siteId: site.id, name: 'Night check', startedOn: '2026-11-21', conditions: { daylightExcluded: true } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ siteId: site.id, name: 'Night check', status: 'draft', startedOn: '2026-11-21', conditions: { daylightExcluded: true }, readingCount: 0 });
    const detail = await c.get(`/api/surveys/${res.body.id}`);
    expect(detail.body).toMatchObject({ abilities: { edit: true, setInstallation: true, upload: true, submit: true, signOff: false, return: false, redecode: false }, imports: [], decodes: [], calibrationLapsedCount: 0 });
  });

  it('rejects a survey, when its site belongs to another organisation, with 404', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const otherSite = (await other.get('/api/sites')).body.items[0];
    const c = await t.signIn(DEMO.surveyor);
    const res = await c.post('/api/surveys').send({ siteId: otherSite.id, name: 'Trespass' });
    expect(res.status).toBe(404);
  });

  it('answers 404, when another organisation guesses survey ids', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const mine = (await c.get('/api/surveys')).body.items;
    expect(mine.length).toBeGreaterThan(0);
    const other = await t.signIn(DEMO.otherAdmin);
    for (const s of mine) expect((await other.get(`/api/surveys/${s.id}`)).status).toBe(404);
  });

  it('lists the seeded walk-throughs, when the demo is seeded, as submitted and a draft', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const items = (await c.get('/api/surveys')).body.items as { name: string; status: string }[];
    // The compliance seed step signs off the earlier survey.
    expect(['submitted', 'signed_off']).toContain(items.find((s) => s.name === 'Spring walk-through 2026')?.status);
    expect(items.find((s) => s.name === 'Autumn walk-through 2026')?.status).toBe('submitted');
    expect(items.some((s) => s.status === 'draft')).toBe(true);
    const submitted = t.db.select().from(surveys).where(eq(surveys.status, 'submitted')).all();
    expect(submitted.every((s) => s.submittedBy !== null)).toBe(true);
  });

  it('rejects a survey, when the start date is not a date, naming the field', async () => {
    const c = await t.signIn(DEMO.surveyor);
    const site = (await c.get('/api/sites')).body.items[0];
    const res = await c.post('/api/surveys').send({ siteId: site.id, name: 'x', startedOn: '20/11/2026' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/startedOn/);
  });
});
