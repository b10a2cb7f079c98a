import { describe, it, expect, beforeAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { auditEvents } from '@server/db/schema/organizations';
import { coefficientSets } from '@server/db/schema/calibration';
import { loadDecodingCalibration } from '@server/modules/probes/probe-calibration';
import { countingProbeBody, createCountingProbe, manualDraftBody, probeIdBySerial, uniqueSerial, FOUR_GAINS } from './support/factories';

let t: TestApp;
beforeAll(async () => { t = await createTestApp({ signInLimits: { perAddress: 100_000, perAccount: 100_000 } }); });

describe('probes API', () => {
  it('lists probes, when a calibration user asks, with only the own organisation\'s seeded probes and their state', async () => {
    const c = await t.signIn(DEMO.calibration);
    const res = await c.get('/api/probes');
    expect(res.status).toBe(200);
    const serials = res.body.items.map((p: { serial: string }) => p.serial);
    expect(serials).toEqual(expect.arrayContaining(['LX-3990', 'LX-4102', 'LX-4107', 'RF-20-07']));
    expect(serials).not.toContain('QW-0012');
    const byS = Object.fromEntries(res.body.items.map((p: { serial: string }) => [p.serial, p]));
    expect(byS['LX-4107'].calibrationState).toBe('due_soon');
    expect(byS['LX-3990'].calibrationState).toBe('overdue');
    expect(byS['LX-4102'].currentSet.version).toBe(2);
    expect(byS['RF-20-07'].kind).toBe('current_4_20');
  });

  it('creates a counting probe, when the body is complete, with its gains and an audit event', async () => {
    const c = await t.signIn(DEMO.calibration);
    const body = countingProbeBody();
    const res = await c.post('/api/probes').send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ serial: body.serial, kind: 'counts', status: 'in_service', gains: FOUR_GAINS, calibrationState: 'no_approved_set', rangeLowLux: null });
    const ev = t.db.select().from(auditEvents).where(eq(auditEvents.probeId, res.body.id)).all();
    expect(ev.map((e) => e.action)).toEqual(['created']);
    expect((ev[0].after as { serial: string }).serial).toBe(body.serial);
  });

  it('creates an analog probe, when kind is 4-20 mA, keeping only the analog fields', async () => {
    const c = await t.signIn(DEMO.admin);
    const res = await c.post('/api/probes').send({ serial: uniqueSerial('AN'), kind: 'current_4_20', rangeLowLux: 0, rangeHighLux: 2000, scale: 'linear', accuracyPercent: 0.25, gains: FOUR_GAINS });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'current_4_20', rangeHighLux: 2000, gains: null, fullScaleCounts: null });
  });

  it.each([
    ['one gain step', { gains: [{ code: 0, nominalGain: 1 }] }, 'gains'],
    ['17 gain steps', { gains: Array.from({ length: 17 }, (_, i) => ({ code: i, nominalGain: 2 ** i })) }, 'gains'],
    ['a repeated gain code', { gains: [{ code: 1, nominalGain: 1 }, { code: 1, nominalGain: 8 }] }, 'gains.1.code'],
    ['saturation above full scale', { saturationCounts: 70000 }, 'saturationCounts'],
    ['floor at saturation', { floorCounts: 65000 }, 'floorCounts'],
    ['no floor', { floorCounts: undefined }, 'floorCounts'],
  ])('rejects a counting probe, when it has %s, with 400 naming the field', async (_what, overrides, path) => {
    const c = await t.signIn(DEMO.calibration);
    const res = await c.post('/api/probes').send(countingProbeBody(overrides));
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  it('rejects an analog probe, when its range is missing or log10 starts at 0 lx, with 400', async () => {
    const c = await t.signIn(DEMO.calibration);
    const missing = await c.post('/api/probes').send({ serial: uniqueSerial(), kind: 'voltage_0_10', scale: 'linear', accuracyPercent: 1 });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['rangeLowLux', 'rangeHighLux']));
    const log0 = await c.post('/api/probes').send({ serial: uniqueSerial(), kind: 'current_4_20', rangeLowLux: 0, rangeHighLux: 1e5, scale: 'log10', accuracyPercent: 1 });
    expect(log0.status).toBe(400);
    expect(log0.body.error.message).toMatch(/log10/);
  });

  it('refuses a second probe with the same serial, when in the same organisation, with 409', async () => {
    const c = await t.signIn(DEMO.calibration);
    const res = await c.post('/api/probes').send(countingProbeBody({ serial: 'LX-4102' }));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('LX-4102');
  });

  it('accepts a serial another organisation uses, when creating, because serials are unique per organisation', async () => {
    const c = await t.signIn(DEMO.calibration);
    const res = await c.post('/api/probes').send(countingProbeBody({ serial: 'QW-0012' }));
    expect(res.status).toBe(201);
  });

  it('records before and after, when a probe is changed, and calls a retirement "retired"', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const upd = await c.patch(`/api/probes/${p.id}`).send({ description: 'Moved to the outdoor kit', status: 'out_of_service' });
    expect(upd.status).toBe(200);
    expect(upd.body).toMatchObject({ description: 'Moved to the outdoor kit', status: 'out_of_service' });
    const ret = await c.patch(`/api/probes/${p.id}`).send({ status: 'retired' });
    expect(ret.status).toBe(200);
    const audit = await c.get(`/api/audit?probeId=${p.id}`);
    const actions = audit.body.items.map((e: { action: string }) => e.action);
    expect(actions).toEqual(['retired', 'status_changed', 'created']);
    const changed = audit.body.items[1];
    expect(changed.before).toMatchObject({ description: 'Test probe', status: 'in_service' });
    expect(changed.after).toMatchObject({ description: 'Moved to the outdoor kit', status: 'out_of_service' });
    expect(changed.actorEmail).toBe(DEMO.calibration);
  });

  it('refuses any change, when the probe is retired, with 409', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    await c.patch(`/api/probes/${p.id}`).send({ status: 'retired' });
    const res = await c.patch(`/api/probes/${p.id}`).send({ status: 'in_service' });
    expect(res.status).toBe(409);
    const draft = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    expect(draft.status).toBe(409);
  });

  it('checks the merged probe, when a PATCH would break a rule, with 400', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const res = await c.patch(`/api/probes/${p.id}`).send({ saturationCounts: 100 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/floor/);
  });

  it('freezes gain codes and kind, when sets exist, but lets nominal gains change', async () => {
    const c = await t.signIn(DEMO.calibration);
    const id = probeIdBySerial(t, 'LX-4102');
    const codes = await c.patch(`/api/probes/${id}`).send({ gains: [{ code: 0, nominalGain: 1 }, { code: 1, nominalGain: 8 }] });
    expect(codes.status).toBe(409);
    const kind = await c.patch(`/api/probes/${id}`).send({ kind: 'current_4_20', rangeLowLux: 1, rangeHighLux: 10, scale: 'linear', accuracyPercent: 1 });
    expect(kind.status).toBe(409);
    const nominal = await c.patch(`/api/probes/${id}`).send({ gains: FOUR_GAINS.map((g) => ({ ...g, nominalGain: g.nominalGain * 1.001 })) });
    expect(nominal.status).toBe(200);
  });

  it('shows a surveyor only in-service probes, when another is out of service, and 404 for that one', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(cal, { status: 'out_of_service' });
    const s = await t.signIn(DEMO.surveyor);
    const list = await s.get('/api/probes');
    expect(list.status).toBe(200);
    expect(list.body.items.every((x: { status: string }) => x.status === 'in_service')).toBe(true);
    expect((await s.get(`/api/probes/${p.id}`)).status).toBe(404);
    expect((await cal.get(`/api/probes/${p.id}`)).status).toBe(200);
  });

  it('denies facility managers probes and coefficients, when they ask, with 403', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const id = probeIdBySerial(t, 'LX-4102');
    expect((await fm.get('/api/probes')).status).toBe(403);
    expect((await fm.get(`/api/probes/${id}/coefficient-sets`)).status).toBe(403);
    expect((await fm.get('/api/calibration/dashboard')).status).toBe(403);
  });
});

describe('organisation isolation', () => {
  it('answers 404, when a user guesses another organisation\'s probe or set id, on every calibration route', async () => {
    const otherProbe = probeIdBySerial(t, 'QW-0012', 2);
    const otherSet = t.db.select().from(coefficientSets).where(eq(coefficientSets.probeId, otherProbe)).get()!.id;
    const admin = await t.signIn(DEMO.admin);
    const checks = [
      await admin.get(`/api/probes/${otherProbe}`),
      await admin.patch(`/api/probes/${otherProbe}`).send({ description: 'mine now' }),
      await admin.get(`/api/probes/${otherProbe}/coefficient-sets`),
      await admin.post(`/api/probes/${otherProbe}/coefficient-sets`).send(manualDraftBody()),
      await admin.get(`/api/probes/${otherProbe}/bench-runs`),
      await admin.post(`/api/probes/${otherProbe}/bench-runs`).attach('file', Buffer.from('gain,reference_lux,counts,int_ms\n'), 'b.csv'),
      await admin.post(`/api/coefficient-sets/${otherSet}/approve`),
      await admin.delete(`/api/coefficient-sets/${otherSet}`),
      await admin.get(`/api/coefficient-sets/${otherSet}/certificate`),
    ];
    expect(checks.map((r) => r.status)).toEqual(checks.map(() => 404));
    const other = await t.signIn(DEMO.otherAdmin);
    const list = await other.get('/api/probes');
    expect(list.body.items.map((p: { serial: string }) => p.serial)).toEqual(['QW-0012']);
  });

  it('keeps loadDecodingCalibration to one organisation, when called, keyed by serial', () => {
    const demo = loadDecodingCalibration(t.db, 1);
    const other = loadDecodingCalibration(t.db, 2);
    expect(demo.has('LX-4102')).toBe(true);
    expect(demo.get('QW-0012')?.probeId).not.toBe(probeIdBySerial(t, 'QW-0012', 2));
    expect([...other.keys()]).toEqual(['QW-0012']);
  });
});

describe('coefficient sets: drafts, four-eyes approval, immutability', () => {
  it('drafts a set, when typed in, as the next version that does not decode', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const res = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ version: 1, status: 'draft', draftedBy: { email: DEMO.calibration }, approvedBy: null, inForce: false });
    const second = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ certificateNumber: 'TEST-CERT-2' }));
    expect(second.body.version).toBe(2);
    expect(loadDecodingCalibration(t.db, 1).get(p.serial)!.sets).toEqual([]);
  });

  it('refuses approval by the drafter, when the four-eyes rule applies, with 403 four_eyes', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const d = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    const res = await c.post(`/api/coefficient-sets/${d.body.id}/approve`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('four_eyes');
    expect(res.body.error.message).toMatch(/other than the person who drafted/);
    expect(t.db.select().from(coefficientSets).where(eq(coefficientSets.id, d.body.id)).get()!.status).toBe('draft');
  });

  it('refuses an administrator\'s approval of their own draft, when the admin drafted it', async () => {
    const admin = await t.signIn(DEMO.admin);
    const p = await createCountingProbe(admin);
    const d = await admin.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    expect((await admin.post(`/api/coefficient-sets/${d.body.id}/approve`)).status).toBe(403);
    const cal = await t.signIn(DEMO.calibration);
    expect((await cal.post(`/api/coefficient-sets/${d.body.id}/approve`)).status).toBe(200);
  });

  it('approves, when a second calibration user approves, making the set decode and auditing before/after', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const d = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    const c2 = await t.signIn(DEMO.calibration2);
    const res = await c2.post(`/api/coefficient-sets/${d.body.id}/approve`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'approved', approvedBy: { email: DEMO.calibration2 }, draftedBy: { email: DEMO.calibration }, inForce: true });
    const cal = loadDecodingCalibration(t.db, 1).get(p.serial)!;
    expect(cal.sets.map((s) => s.id)).toEqual([String(d.body.id)]);
    expect(cal.sets[0]).toMatchObject({ effectiveFrom: Date.parse('2026-11-01T00:00:00.000Z'), dueDate: Date.parse('2027-11-01T00:00:00.000Z'), approved: true, tRefMs: 100 });
    expect(cal.probe).toMatchObject({ kind: 'counts', saturationCounts: 65000, gains: FOUR_GAINS });
    const audit = await c.get(`/api/audit?probeId=${p.id}`);
    const approved = audit.body.items.find((e: { action: string }) => e.action === 'approved');
    expect(approved.before.status).toBe('draft');
    expect(approved.after.status).toBe('approved');
    expect(approved.actorEmail).toBe(DEMO.calibration2);
  });

  it('keeps an approved set unchanged, when anyone tries to approve, discard, re-certify or patch it', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const d = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    const c2 = await t.signIn(DEMO.calibration2);
    await c2.post(`/api/coefficient-sets/${d.body.id}/approve`);
    const before = t.db.select().from(coefficientSets).where(eq(coefficientSets.id, d.body.id)).get();
    expect((await c2.post(`/api/coefficient-sets/${d.body.id}/approve`)).status).toBe(409);
    expect((await c.delete(`/api/coefficient-sets/${d.body.id}`)).status).toBe(409);
    expect((await c.post(`/api/coefficient-sets/${d.body.id}/certificate`).attach('file', Buffer.from('%PDF-1.4\n%%EOF\n'), 'c.pdf')).status).toBe(409);
    expect((await c.patch(`/api/coefficient-sets/${d.body.id}`).send({ certificateNumber: 'X' })).status).toBe(404);
    expect(t.db.select().from(coefficientSets).where(eq(coefficientSets.id, d.body.id)).get()).toEqual(before);
  });

  it('refuses a direct UPDATE or DELETE of an approved set, when attempted below the API, by a database trigger', () => {
    const approved = t.db.select().from(coefficientSets).where(eq(coefficientSets.status, 'approved')).get()!;
    expect(() => t.db.update(coefficientSets).set({ dueDate: approved.dueDate + 1 }).where(eq(coefficientSets.id, approved.id)).run()).toThrow(/immutable/);
    expect(() => t.db.delete(coefficientSets).where(eq(coefficientSets.id, approved.id)).run()).toThrow(/immutable/);
  });

  it('discards a draft, when asked, and records it', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const d = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody());
    expect((await c.delete(`/api/coefficient-sets/${d.body.id}`)).status).toBe(204);
    expect((await c.get(`/api/probes/${p.id}/coefficient-sets`)).body.items).toEqual([]);
    const audit = await c.get(`/api/audit?probeId=${p.id}`);
    expect(audit.body.items[0]).toMatchObject({ action: 'discarded', entityType: 'coefficient_set' });
  });

  it('shows a surveyor only approved sets, when a draft exists', async () => {
    const c = await t.signIn(DEMO.calibration);
    const id = probeIdBySerial(t, 'LX-4107');
    const d = await c.post(`/api/probes/${id}/coefficient-sets`).send(manualDraftBody());
    const s = await t.signIn(DEMO.surveyor);
    const res = await s.get(`/api/probes/${id}/coefficient-sets`);
    expect(res.status).toBe(200);
    expect(res.body.items.every((x: { status: string }) => x.status === 'approved')).toBe(true);
    expect((await c.get(`/api/probes/${id}/coefficient-sets`)).body.items.map((x: { id: number }) => x.id)).toContain(d.body.id);
    await c.delete(`/api/coefficient-sets/${d.body.id}`);
  });

  it('rejects a draft, when its gain codes do not match the probe, with 422 naming the codes', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const res = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ gains: [{ code: 0, darkCounts: 50, luxPerCount: 2, uRel: 0.01 }, { code: 9, darkCounts: 50, luxPerCount: 2, uRel: 0.01 }] }));
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/missing code\(s\) 1, 2, 3; unknown code\(s\) 9/);
  });

  it('rejects a draft, when the due date is not after effective-from or uRel is a percentage, with 400', async () => {
    const c = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(c);
    const due = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ dueDate: '2026-10-01T00:00:00.000Z' }));
    expect(due.status).toBe(400);
    expect(due.body.error.message).toMatch(/dueDate/);
    const pct = await c.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody({ gains: manualDraftBody().gains.map((g) => ({ ...g, uRel: 1.2 })) }));
    expect(pct.status).toBe(400);
    expect(pct.body.error.message).toMatch(/fraction/);
  });

  it('takes one row with code 0, when drafting for an analog probe', async () => {
    const c = await t.signIn(DEMO.calibration);
    const id = probeIdBySerial(t, 'RF-20-07');
    const bad = await c.post(`/api/probes/${id}/coefficient-sets`).send(manualDraftBody());
    expect(bad.status).toBe(422);
    const ok = await c.post(`/api/probes/${id}/coefficient-sets`).send(manualDraftBody({ gains: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: 0.02 }] }));
    expect(ok.status).toBe(201);
    await c.delete(`/api/coefficient-sets/${ok.body.id}`);
  });
});
