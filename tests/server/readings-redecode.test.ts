import { describe, it, expect, beforeAll } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { DEMO, type TestApp, type TestClient } from './helpers';
import { newDraftSurvey, TEST_SERIALS, testWalkCsv, uploadAndWait, appWithTestProbes, insertCoefficientSet } from './support/factories';
import { probes } from '@server/db/schema/calibration';
import { decodes, readings, surveys } from '@server/db/schema/surveys';
import { auditEvents } from '@server/db/schema/organizations';
import { DEMO_COUNTING_PROBES } from '@server/db/demo/demo-probes';
import { readingColumns } from '@shared/export-columns';

let t: TestApp;
let c: TestClient;
beforeAll(async () => {
  ({ t, c } = await appWithTestProbes());
});

const CSV = 'timestamp,probe,point,gain,counts\n2026-11-19T07:00:00Z,T-4102,R-1,2,16061\n2026-11-19T07:00:30Z,T-4102,R-2,2,8061\n';
const HANDHELD_CSV = 'timestamp,probe,point,gain,counts\n2026-11-19T07:00:00Z,T-4107,R-1,2,16057\n2026-11-19T07:00:30Z,T-4107,R-2,2,8057\n';

describe('re-decoding a survey', () => {
  it('decodes the kept samples with a corrected approved set into a new active decode, keeping the old one and auditing who did it', async () => {
    const surveyId = await newDraftSurvey(t, c);
    expect((await uploadAndWait(t, c, surveyId, CSV)).status.status).toBe('done');
    const before = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items;
    const firstDecode = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.activeDecodeId!;

    // Calibration staff approve a corrected set: responsivity 10 % higher at every gain.
    const probe = t.db.select().from(probes).where(eq(probes.serial, TEST_SERIALS.tripod)).get()!;
    const p = DEMO_COUNTING_PROBES[0];
    const corrected = insertCoefficientSet(t, probe.id, {
      version: 2, effectiveFrom: t.clock.now() - 30 * 86_400_000, dueDate: t.clock.now() + 300 * 86_400_000,
      tRefMs: p.tRefMs, alphaPerK: p.alphaPerK, tCalC: p.tCalC, gains: p.coefficients.map((g) => ({ ...g, luxPerCount: g.luxPerCount * 1.1 })),
      certificateNumber: 'CORR-1', approvedAt: t.clock.now(),
    });

    const surveyor = await c.post(`/api/surveys/${surveyId}/redecode`);
    expect(surveyor.status).toBe(403);
    const cal = await t.signIn(DEMO.calibration);
    const res = await cal.post(`/api/surveys/${surveyId}/redecode`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ previousDecodeId: firstDecode, readings: 2, calibrationLapsed: 0 });

    const after = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items;
    expect(after.map((r: { point: string }) => r.point)).toEqual(before.map((r: { point: string }) => r.point));
    after.forEach((r: { lux: number }, i: number) => expect(r.lux).toBeCloseTo(before[i].lux * 1.1, 6));
    expect(t.db.select().from(readings).where(and(eq(readings.decodeId, firstDecode), eq(readings.surveyId, surveyId))).all()).toHaveLength(2);
    expect(t.db.select().from(readings).where(eq(readings.decodeId, res.body.decodeId)).all().every((r) => r.coefficientSetId === corrected.id)).toBe(true);
    const detail = (await c.get(`/api/surveys/${surveyId}`)).body;
    expect(detail.decodes.map((d: { id: number; active: boolean }) => [d.id, d.active])).toEqual([[res.body.decodeId, true], [firstDecode, false]]);
    const audit = t.db.select().from(auditEvents).where(and(eq(auditEvents.surveyId, surveyId), eq(auditEvents.action, 'redecoded'))).get()!;
    const calId = (await cal.get('/api/auth/me')).body.user.id;
    expect(audit.actorId).toBe(calId);
    expect(audit.before).toEqual({ decodeId: firstDecode });
  });

  it('shows calibration staff what their re-decode changed, reading by reading, and says when a survey is already current', async () => {
    const surveyId = await newDraftSurvey(t, c);
    expect((await uploadAndWait(t, c, surveyId, HANDHELD_CSV)).status.status).toBe('done');
    const cal = await t.signIn(DEMO.calibration);
    const fresh = (await cal.get(`/api/surveys/${surveyId}/decode-changes`)).body;
    expect(fresh).toMatchObject({ decodedWithCurrentSets: true, before: null, changedTotal: 0 });

    const probe = t.db.select().from(probes).where(eq(probes.serial, TEST_SERIALS.handheld)).get()!;
    const p = DEMO_COUNTING_PROBES[1];
    insertCoefficientSet(t, probe.id, {
      version: 2, effectiveFrom: Date.parse('2026-11-01T00:00:00Z'), dueDate: t.clock.now() + 300 * 86_400_000,
      tRefMs: p.tRefMs, alphaPerK: p.alphaPerK, tCalC: p.tCalC, gains: p.coefficients.map((g) => ({ ...g, luxPerCount: g.luxPerCount * 0.9 })),
      certificateNumber: 'CORR-2', approvedAt: t.clock.now(),
    });
    expect((await cal.get(`/api/surveys/${surveyId}/decode-changes`)).body.decodedWithCurrentSets).toBe(false);
    const before = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items;
    expect((await cal.post(`/api/surveys/${surveyId}/redecode`)).status).toBe(200);

    const d = (await cal.get(`/api/surveys/${surveyId}/decode-changes`)).body;
    expect(d).toMatchObject({ decodedWithCurrentSets: true, compared: 2, changedTotal: 2, siteTimeZone: 'Europe/London' });
    expect(d.changes.map((x: { point: string }) => x.point)).toEqual(['R-1', 'R-2']);
    d.changes.forEach((x: { before: { lux: number; coefficientSetVersion: number }; after: { lux: number; coefficientSetVersion: number } }, i: number) => {
      expect(x.before.lux).toBe(before[i].lux);
      expect(x.after.lux).toBeCloseTo(before[i].lux * 0.9, 9);
      expect([x.before.coefficientSetVersion, x.after.coefficientSetVersion]).toEqual([1, 2]);
    });
  });

  it('opens the re-decode view to the roles that may re-decode, and to no one else', async () => {
    const surveyId = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, surveyId, CSV);
    for (const [email, status] of [[DEMO.calibration, 200], [DEMO.admin, 200], [DEMO.surveyor, 403], [DEMO.facility_manager, 403], [DEMO.otherAdmin, 404]] as const) {
      expect((await (await t.signIn(email)).get(`/api/surveys/${surveyId}/decode-changes`)).status, email).toBe(status);
    }
  });

  it('refuses to re-decode a survey with no accepted log (409) and another organisation\'s survey (404)', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const admin = await t.signIn(DEMO.admin);
    expect((await admin.post(`/api/surveys/${surveyId}/redecode`)).status).toBe(409);
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.post(`/api/surveys/${surveyId}/redecode`)).status).toBe(404);
    expect(t.db.select().from(decodes).where(eq(decodes.surveyId, surveyId)).all()).toEqual([]);
  });
});

describe('readings series and export', () => {
  it('gives the chart every reading in time order with its gain code, when the walk is short', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-17T09:00:00Z'), 3));
    const series = (await c.get(`/api/surveys/${surveyId}/readings/series`)).body;
    expect(series.total).toBe(status.readings);
    expect(series.items).toHaveLength(status.readings);
    const times = series.items.map((p: { t: number }) => p.t);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    const gains = new Set(series.items.filter((p: { role: string }) => p.role === 'task').map((p: { gainCode: number }) => p.gainCode));
    expect(gains.size).toBeGreaterThan(1); // auto-ranging: more than one gain in use
  });

  it('exports in lux with the shared header and one line per reading, at full precision', async () => {
    const surveyId = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, surveyId, HANDHELD_CSV);
    const res = await c.get(`/api/surveys/${surveyId}/readings.csv`);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0].split(',')).toEqual(readingColumns('lx'));
    expect(lines).toHaveLength(3);
    const api = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items;
    // 16000 net counts * 2.05/64 * 1.003 lx is about 514 lx (demo-probes.ts); the CSV has every digit the API has.
    expect(lines[1]).toContain(`,R-1,,,,task,T-4107,${api[0].lux},exact,${api[0].uLux},ok,2,16057,,,`);
  });
});
