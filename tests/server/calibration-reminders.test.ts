import { describe, it, expect, beforeEach } from 'vitest';
import { createTestApp, DEMO, DEMO_START, type TestApp } from './helpers';
import { outboxMessages } from '@server/db/schema/organizations';
import { coefficientSets } from '@server/db/schema/calibration';
import { serverJobs } from '@server/jobs';
import { loadDecodingCalibration } from '@server/modules/probes/probe-calibration';
import { createCoefficientSelector, isCalibrationLapsed } from '@shared/core/coefficient-sets';
import { createCountingProbe, manualDraftBody, probeIdBySerial } from './support/factories';

const DAY = 86_400_000;
let t: TestApp;
beforeEach(async () => { t = await createTestApp({ signInLimits: { perAddress: 100_000, perAccount: 100_000 } }); });

/** Signs in afresh each time: the movable clock outruns a session's 8 hours. */
const runAsAdmin = async () => (await t.signIn(DEMO.admin)).post('/api/calibration/reminders/run');
const mails = () => t.db.select().from(outboxMessages).all().filter((m) => m.subject.startsWith('Calibration reminder'));

describe('calibration dashboard', () => {
  it('shows the seeded states, when a calibration user opens it: 12 days to LX-4107, 21 days overdue LX-3990', async () => {
    const c = await t.signIn(DEMO.calibration);
    await createCountingProbe(c, { serial: 'NEW-0001' });
    const res = await c.get('/api/calibration/dashboard');
    expect(res.status).toBe(200);
    expect(res.body.dueSoonDays).toBe(30);
    const row = (s: string) => res.body.items.find((r: { serial: string }) => r.serial === s);
    expect(row('LX-4107')).toMatchObject({ calibrationState: 'due_soon', daysUntilDue: 12, certificateNumber: 'FCT-CAL-2026-0188' });
    expect(row('LX-3990')).toMatchObject({ calibrationState: 'overdue', daysUntilDue: -21 });
    expect(row('LX-4102')).toMatchObject({ calibrationState: 'ok', daysUntilDue: 160, currentVersion: 2 });
    expect(row('NEW-0001')).toMatchObject({ calibrationState: 'no_approved_set', dueDate: null, daysUntilDue: null });
    expect(row('QW-0012')).toBeUndefined();
  });

  it('moves to the new due date, when a new set is approved with effect from now', async () => {
    const c = await t.signIn(DEMO.calibration);
    const id = probeIdBySerial(t, 'LX-3990');
    const d = await c.post(`/api/probes/${id}/coefficient-sets`).send(manualDraftBody({ effectiveFrom: new Date(DEMO_START).toISOString(), dueDate: '2027-11-20T09:00:00.000Z' }));
    await (await t.signIn(DEMO.calibration2)).post(`/api/coefficient-sets/${d.body.id}/approve`);
    const res = await c.get('/api/calibration/dashboard');
    const row = res.body.items.find((r: { serial: string }) => r.serial === 'LX-3990');
    expect(row).toMatchObject({ calibrationState: 'ok', dueDate: '2027-11-20T09:00:00.000Z', daysUntilDue: 365, currentVersion: 2 });
  });
});

describe('effective-from selection at its boundary', () => {
  it('uses the new set, when a sample is exactly at effectiveFrom, and the old one a millisecond before', async () => {
    const c = await t.signIn(DEMO.calibration);
    const c2 = await t.signIn(DEMO.calibration2);
    const p = await createCountingProbe(c);
    const t0 = '2026-01-01T00:00:00.000Z';
    const t1 = '2026-11-10T12:00:00.000Z';
    const v1 = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ effectiveFrom: t0, dueDate: '2026-12-31T00:00:00.000Z', certificateNumber: 'V1' }));
    const v2 = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ effectiveFrom: t1, dueDate: '2027-11-10T00:00:00.000Z', certificateNumber: 'V2' }));
    await c2.post(`/api/coefficient-sets/${v1.body.id}/approve`);
    await c2.post(`/api/coefficient-sets/${v2.body.id}/approve`);

    const { sets } = loadDecodingCalibration(t.db, 1).get(p.serial)!;
    const selector = createCoefficientSelector(sets);
    expect(selector.select(Date.parse(t1))?.id).toBe(String(v2.body.id));
    expect(selector.select(Date.parse(t1) - 1)?.id).toBe(String(v1.body.id));
    expect(selector.select(Date.parse(t0) - 1)).toBeNull();

    // The API marks the set in force the same way, at the clock's time.
    t.clock.set(Date.parse(t1));
    let list = await c.get(`/api/probes/${p.id}/coefficient-sets`);
    expect(list.body.items.find((s: { inForce: boolean }) => s.inForce).id).toBe(v2.body.id);
    t.clock.set(Date.parse(t1) - 1);
    list = await c.get(`/api/probes/${p.id}/coefficient-sets`);
    expect(list.body.items.find((s: { inForce: boolean }) => s.inForce).id).toBe(v1.body.id);
  });

  it('marks a reading time after the due date as lapsed, when the set in force has passed its due date', () => {
    const { sets } = loadDecodingCalibration(t.db, 1).get('LX-3990')!;
    const due = DEMO_START - 21 * DAY;
    const set = createCoefficientSelector(sets).select(due + 1)!;
    expect(set.dueDate).toBe(due);
    expect(isCalibrationLapsed(set, due + 1)).toBe(true);
    expect(isCalibrationLapsed(set, due)).toBe(false);
  });

  it('never selects a draft, when a newer draft is effective earlier', async () => {
    const c = await t.signIn(DEMO.calibration);
    const id = probeIdBySerial(t, 'LX-4107');
    await c.post(`/api/probes/${id}/coefficient-sets`).send(manualDraftBody({ effectiveFrom: '2026-11-01T00:00:00.000Z' }));
    const { sets } = loadDecodingCalibration(t.db, 1).get('LX-4107')!;
    expect(sets.every((s) => s.approved)).toBe(true);
    expect(createCoefficientSelector(sets).select(DEMO_START)?.id).toBe(String(t.db.select().from(coefficientSets).all().find((s) => s.probeId === id && s.status === 'approved')!.id));
  });
});

describe('calibration reminders', () => {
  it('mails the calibration users once, when probes are due within 14 days or overdue, listing just those', async () => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/calibration/reminders/run');
    expect(res.status).toBe(200);
    expect(res.body.messagesSent).toBe(1);
    expect(res.body.reminded.map((r: { serial: string; kind: string }) => `${r.serial}:${r.kind}`).sort()).toEqual(['LX-3990:overdue', 'LX-4107:due_soon']);
    const [m] = mails();
    expect(m.to).toBe(`${DEMO.calibration}, ${DEMO.calibration2}`);
    expect(m.organizationId).toBe(1);
    expect(m.text).toContain('LX-3990');
    expect(m.text).toMatch(/OVERDUE since \d{4}-\d\d-\d\d \(21 days\)/);
    expect(m.text).toMatch(/LX-4107 .*due \d{4}-\d\d-\d\d \(in 12 days\)/);
    expect(m.text).not.toContain('LX-4102');
    expect(m.text).not.toContain('RF-20-07');
  });

  it('sends at most one reminder per probe per week, when run again as the movable clock advances', async () => {
    await runAsAdmin();
    const again = await runAsAdmin();
    expect(again.body).toMatchObject({ messagesSent: 0, reminded: [] });
    expect(again.body.skippedRecentlyReminded.sort()).toEqual(['LX-3990', 'LX-4107']);
    t.clock.advance(7 * DAY - 1);
    expect((await runAsAdmin()).body.messagesSent).toBe(0);
    expect(mails()).toHaveLength(1);
    t.clock.advance(1);
    const week = await runAsAdmin();
    expect(week.body.messagesSent).toBe(1);
    // A week on, LX-4107 (due in 12 days) is 5 days from due; both again.
    expect(week.body.reminded.map((r: { serial: string }) => r.serial).sort()).toEqual(['LX-3990', 'LX-4107']);
    expect(mails()).toHaveLength(2);
  });

  it('reminds a probe entering the 14-day window, when its due date comes close, even though others were just reminded', async () => {
    await runAsAdmin();
    // LX-4102 is due in 160 days: 146 days on it is 14 days from due.
    t.clock.advance(146 * DAY);
    const res = await runAsAdmin();
    expect(res.body.reminded.map((r: { serial: string }) => r.serial)).toContain('LX-4102');
  });

  it('runs the daily job across every organisation, when the server schedules it', async () => {
    const job = serverJobs().find((j) => j.name === 'calibration-reminders');
    expect(job?.everyMs).toBe(24 * 3600_000);
    t.clock.advance(280 * DAY); // Quillbank's QW-0012 (due 275 days after the seed) is now overdue too.
    await job!.run(t.deps);
    const orgs = mails().map((m) => m.organizationId).sort();
    expect(orgs).toEqual([1]);
    // Quillbank Works has no calibration user: nothing is sent there, and nothing recorded, so it is not silenced.
    expect(mails().some((m) => m.subject.includes('Quillbank'))).toBe(false);
  });

  it('keeps one organisation\'s run to itself, when an admin of the other organisation runs it', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const res = await other.post('/api/calibration/reminders/run');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ messagesSent: 0, reminded: [] });
    expect(mails()).toHaveLength(0);
  });

  it('refuses calibration users, when they try to run reminders on demand, with 403', async () => {
    const c = await t.signIn(DEMO.calibration);
    expect((await c.post('/api/calibration/reminders/run')).status).toBe(403);
  });
});
