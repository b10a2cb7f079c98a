import { describe, it, expect, beforeAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { probes } from '@server/db/schema/calibration';
import { surveys } from '@server/db/schema/surveys';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

const probeId = (serial: string) => t.db.select().from(probes).where(eq(probes.serial, serial)).get()!.id;

describe('surveys decoded with a probe (what a re-decode would change)', () => {
  it('lists the demo surveys that used LX-4102, all current right after the seed', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const res = await cal.get(`/api/probes/${probeId('LX-4102')}/surveys`);
    expect(res.status).toBe(200);
    const names = res.body.items.map((s: { name: string }) => s.name);
    expect(names).toContain('Autumn walk-through 2026');
    for (const s of res.body.items) {
      expect(s.readings).toBeGreaterThan(0);
      expect(s.staleReadings).toBe(0);
    }
  });

  it('counts readings as stale once a corrected set is approved, and a re-decode makes them current', async () => {
    const id = probeId('LX-4102');
    const cal = await t.signIn(DEMO.calibration);
    const cal2 = await t.signIn(DEMO.calibration2);
    const sets = (await cal.get(`/api/probes/${id}/coefficient-sets`)).body.items;
    const inForce = sets.find((s: { inForce: boolean }) => s.inForce);
    // A corrected set effective from before the autumn walk (2026-10-14): readings from then on move to it.
    const draft = await cal.post(`/api/probes/${id}/coefficient-sets`).send({
      source: 'manual', effectiveFrom: '2026-10-01T00:00:00Z', dueDate: '2027-10-01T00:00:00Z', tRefMs: inForce.tRefMs, alphaPerK: inForce.alphaPerK, tCalC: inForce.tCalC,
      certificateNumber: 'FCT-CAL-2026-0999', gains: inForce.gains.map((g: { code: number; darkCounts: number; luxPerCount: number; uRel: number }) => ({ code: g.code, darkCounts: g.darkCounts, luxPerCount: g.luxPerCount * 1.02, uRel: g.uRel })),
    });
    expect(draft.status).toBe(201);
    expect((await cal2.post(`/api/coefficient-sets/${draft.body.id}/approve`)).status).toBe(200);

    const after = (await cal.get(`/api/probes/${id}/surveys`)).body.items;
    const autumn = after.find((s: { name: string }) => s.name === 'Autumn walk-through 2026');
    expect(autumn.staleReadings).toBeGreaterThan(0);
    expect(autumn.staleReadings).toBeLessThanOrEqual(autumn.readings);

    const redecode = await cal.post(`/api/surveys/${autumn.surveyId}/redecode`);
    expect(redecode.status).toBe(200);
    const current = (await cal.get(`/api/probes/${id}/surveys`)).body.items.find((s: { name: string }) => s.name === 'Autumn walk-through 2026');
    expect(current.staleReadings).toBe(0);
  });

  it('answers 404 for another organisation\'s probe', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.get(`/api/probes/${probeId('LX-4102')}/surveys`)).status).toBe(404);
  });

  it('marks a signed-off survey as frozen', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const items = (await cal.get(`/api/probes/${probeId('LX-4102')}/surveys`)).body.items;
    const spring = t.db.select().from(surveys).where(eq(surveys.name, 'Spring walk-through 2026')).get()!;
    const row = items.find((s: { surveyId: number }) => s.surveyId === spring.id);
    expect(spring.status).toBe('signed_off'); // the compliance seed step signs the spring survey off
    expect(row.canRedecode).toBe(false);
    expect(items.every((s: { status: string; canRedecode: boolean }) => s.canRedecode === (s.status !== 'signed_off'))).toBe(true);
  });
});

describe('re-decoding a signed-off survey', () => {
  it('refuses with 409 and leaves the active decode as it was', async () => {
    const spring = t.db.select().from(surveys).where(eq(surveys.name, 'Spring walk-through 2026')).get()!;
    const cal = await t.signIn(DEMO.calibration);
    const res = await cal.post(`/api/surveys/${spring.id}/redecode`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/signed off/);
    expect(t.db.select().from(surveys).where(eq(surveys.id, spring.id)).get()!.activeDecodeId).toBe(spring.activeDecodeId);
  });
});
