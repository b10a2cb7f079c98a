import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createTestApp, DEMO, DEMO_START, type TestApp, type TestClient } from './helpers';
import { insertSite, orgOf, pngOf, createTestProbes, tableCounts, uploadAndWait } from './support/factories';
import { readings, surveys } from '@server/db/schema/surveys';
import { auditEvents } from '@server/db/schema/organizations';
import { PDFParse } from 'pdf-parse';

let t: TestApp;
let admin: TestClient;
let siteId: number;
let planId: number;
let officeId: number;

const rect = (x: number, y: number, w: number, h: number) => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];
const iso = (minutes: number) => new Date(DEMO_START + minutes * 60_000).toISOString();

/** A label-only log (x_m, y_m empty) except line 4, which carries its own coordinates. Gain 2 at 16,000 counts is about 500 lx with the test probes. */
function labelLog(offsetMin = 0) {
  return [
    'timestamp,probe,point,gain,counts,x_m,y_m',
    `${iso(offsetMin + 1)},T-4102,OF1-A1,2,16000,,`,
    `${iso(offsetMin + 2)},T-4102,  of1-a2 ,2,16100,,`,
    `${iso(offsetMin + 3)},T-4102,OF1-A3,2,15900,5,5`,
    `${iso(offsetMin + 4)},T-4102,XX-9,2,15000,,`,
    `${iso(offsetMin + 5)},T-4102,XX-9,2,15200,,`,
    '',
  ].join('\n');
}

async function plannedSurvey() {
  const s = await admin.post('/api/surveys').send({ siteId, name: `Label walk ${Math.random().toString(36).slice(2, 7)}` });
  const gen = await admin.post(`/api/surveys/${s.body.id}/planned-points/generate`).send({ zoneId: officeId });
  expect(gen.status).toBe(200);
  return { surveyId: s.body.id as number, points: gen.body.items as { id: number; label: string; xM: number; yM: number }[] };
}

async function readingsOf(surveyId: number) {
  const res = await admin.get(`/api/surveys/${surveyId}/readings?limit=100&sort=time`);
  return res.body.items as { id: number; point: string; xM: number | null; yM: number | null; planId: number | null }[];
}

// The demo seed imports two logs: give it time on a busy machine.
beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signIn(DEMO.admin);
  const org = orgOf(t, DEMO.admin);
  createTestProbes(t, org);
  siteId = insertSite(t, org, 'Label walk site');
  const plan = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(200, 150, 5), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Ground').field('widthM', '20');
  planId = plan.body.id;
  officeId = (await admin.post(`/api/plans/${planId}/zones`).send({ name: 'Office 1', kind: 'room', useType: 'office_writing', polygon: rect(0, 0, 11, 11) })).body.id;
}, 180_000);

describe('logs that name planned points', () => {
  it('rows without coordinates take the planned point\'s plan and position (trimmed, any case); a row\'s own coordinates win; unknown labels are a warning listing their lines', async () => {
    const { surveyId, points } = await plannedSurvey();
    const { status } = await uploadAndWait(t, admin, surveyId, labelLog());
    expect(status.status).toBe('done');
    expect(status.placement).toEqual({ byCoordinates: 1, byLabel: 2, none: 2 });
    const warning = status.warnings.find((w: { message: string }) => w.message.includes('XX-9'));
    expect(warning).toMatchObject({ line: 5, column: 'point' });
    expect(warning.message).toMatch(/matches no planned point of this survey \(lines 5, 6\)/);

    const rs = await readingsOf(surveyId);
    const a1 = points.find((p) => p.label === 'OF1-A1')!;
    const a2 = points.find((p) => p.label === 'OF1-A2')!;
    expect(rs.find((r) => r.point === 'OF1-A1')).toMatchObject({ xM: a1.xM, yM: a1.yM, planId });
    expect(rs.find((r) => r.point === 'of1-a2')).toMatchObject({ xM: a2.xM, yM: a2.yM, planId });
    expect(rs.find((r) => r.point === 'OF1-A3')).toMatchObject({ xM: 5, yM: 5, planId });
    expect(rs.filter((r) => r.point === 'XX-9').every((r) => r.xM === null)).toBe(true);
  });

  it('without planned points nothing is joined and no label warning is given', async () => {
    const s = await admin.post('/api/surveys').send({ siteId, name: 'No plan walk' });
    const { status } = await uploadAndWait(t, admin, s.body.id, labelLog(100));
    expect(status.placement).toEqual({ byCoordinates: 1, byLabel: 0, none: 4 });
    expect(status.warnings.some((w: { message: string }) => /planned point/.test(w.message))).toBe(false);
  });
});

describe('placing readings by hand', () => {
  it('lists the unplaced readings by label, places one on the plan and one on a planned point, and refuses a move without a reason', async () => {
    const { surveyId, points } = await plannedSurvey();
    await uploadAndWait(t, admin, surveyId, labelLog(200));
    const unplaced = await admin.get(`/api/surveys/${surveyId}/unplaced`);
    expect(unplaced.body.total).toBe(2);
    expect(unplaced.body.groups).toHaveLength(1);
    const [first, second] = unplaced.body.groups[0].readings;
    expect(unplaced.body.groups[0].point).toBe('XX-9');

    const placed = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 3, yM: 3 });
    expect(placed.status).toBe(200);
    expect(placed.body).toMatchObject({ planId, xM: 3, yM: 3 });
    const b1 = points.find((p) => p.label === 'OF1-B1')!;
    const onPoint = await admin.put(`/api/surveys/${surveyId}/readings/${second.id}/placement`).send({ plannedPointId: b1.id });
    expect(onPoint.body).toMatchObject({ planId, xM: b1.xM, yM: b1.yM, plannedPointId: b1.id });
    expect((await admin.get(`/api/surveys/${surveyId}/unplaced`)).body.total).toBe(0);
    // The planned point now counts a reading.
    const list = await admin.get(`/api/surveys/${surveyId}/planned-points`);
    expect(list.body.items.find((p: { id: number }) => p.id === b1.id).readingCount).toBe(1);

    const before = tableCounts(t);
    const noReason = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 4, yM: 4 });
    expect(noReason.status).toBe(422);
    expect(noReason.body.error.message).toMatch(/XX-9 already has a place.*reason/);
    expect(tableCounts(t)).toEqual(before);
    const outside = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 25, yM: 4, reason: 'x' .repeat(5) });
    expect(outside.status).toBe(422);
    expect(outside.body.error.message).toMatch(/\(25, 4\) m lies outside plan "Ground"/);
    const moved = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 4, yM: 4, reason: 'Wrote down the wrong desk' });
    expect(moved.status).toBe(200);
    const actions = t.db.select().from(auditEvents).where(and(eq(auditEvents.surveyId, surveyId), eq(auditEvents.entityType, 'reading'))).all().map((a) => a.action);
    expect(actions).toEqual(['reading_placed', 'reading_placed', 'reading_moved']);
    const unplace = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ unplace: true });
    expect(unplace.status).toBe(400);
  });

  it('placements and exclusions survive a re-decode (kept by label, probe and time), and the verdict gives the exclusion and the unvisited points', async () => {
    const { surveyId } = await plannedSurvey();
    await uploadAndWait(t, admin, surveyId, labelLog(300));
    const [first] = (await admin.get(`/api/surveys/${surveyId}/unplaced`)).body.groups[0].readings;
    await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 6, yM: 6 }).expect(200);
    const a1 = (await readingsOf(surveyId)).find((r) => r.point === 'OF1-A1')!;
    expect((await admin.put(`/api/surveys/${surveyId}/readings/${a1.id}/exclusion`).send({ excluded: true })).status).toBe(400);
    await admin.put(`/api/surveys/${surveyId}/readings/${a1.id}/exclusion`).send({ excluded: true, reason: 'A person shadowed the probe' }).expect(200);

    const calibration = await t.signIn(DEMO.calibration);
    const re = await calibration.post(`/api/surveys/${surveyId}/redecode`).send({});
    expect(re.status).toBe(200);
    const decodeId = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.activeDecodeId!;
    const now = t.db.select().from(readings).where(and(eq(readings.surveyId, surveyId), eq(readings.decodeId, decodeId))).all();
    expect(now.find((r) => r.point === 'XX-9' && r.timeMs === Date.parse(iso(304)))).toMatchObject({ xM: 6, yM: 6, planId });
    expect(now.find((r) => r.point === 'OF1-A1')!.excludedReason).toBe('A person shadowed the probe');
    expect(now.find((r) => r.point === 'OF1-A1')!.id).not.toBe(a1.id);

    const compliance = await admin.get(`/api/surveys/${surveyId}/compliance`);
    const office = compliance.body.zones.find((z: { name: string }) => z.name === 'Office 1');
    const reasons = office.reasons.join(' ');
    expect(office.excludedPoints).toBe(1);
    expect(reasons).toMatch(/Reading OF1-A1 at .* excluded from the statistics: A person shadowed the probe/);
    // 100 planned; OF1-A1 (excluded, still visited), of1-a2 and OF1-A3 (by label) have readings.
    expect(reasons).toMatch(/97 of 100 planned point\(s\) have no reading: OF1-A4, OF1-A5/);
  });

  it('a changed grid\'s written reason is in the zone\'s verdict reasons and in the report, with the count it is judged against', async () => {
    const { surveyId, points } = await plannedSurvey();
    const reason = 'Bookcase along the east wall; its column cannot be reached';
    const last = points.find((p) => p.label === 'OF1-J10')!;
    await admin.delete(`/api/surveys/${surveyId}/planned-points/${last.id}?reason=${encodeURIComponent(reason)}`).expect(204);
    await uploadAndWait(t, admin, surveyId, labelLog(500));

    const office = (await admin.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: { name: string }) => z.name === 'Office 1');
    const reasons = office.reasons.join(' ');
    expect(reasons).toContain(`Changed grid: 99 planned point(s) instead of the 100 the rule gives. Reason: ${reason}`);
    expect(reasons).toMatch(/96 of 99 planned point\(s\) have no reading/);

    const pdf = await admin.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    const parser = new PDFParse({ data: new Uint8Array(pdf.body as Buffer) });
    const text = (await parser.getText()).text.replace(/\s+/g, ' ');
    await parser.destroy();
    expect(text).toContain(reason);
  });

  it('an exclusion, a placement and their undoing, without a re-decode, each change the kept verdicts at once (they join the aggregate\'s inputs)', async () => {
    const { surveyId } = await plannedSurvey();
    await uploadAndWait(t, admin, surveyId, labelLog(600));
    const office = async () => (await admin.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: { name: string }) => z.name === 'Office 1') as { points: number; excludedPoints?: number };
    const before = await office();
    expect(before.excludedPoints).toBeUndefined();
    const a1 = (await readingsOf(surveyId)).find((r) => r.point === 'OF1-A1')!;
    await admin.put(`/api/surveys/${surveyId}/readings/${a1.id}/exclusion`).send({ excluded: true, reason: 'A person shadowed the probe' }).expect(200);
    const excluded = await office();
    expect(excluded.excludedPoints).toBe(1);
    expect(excluded.points).toBe(before.points - 1);
    await admin.put(`/api/surveys/${surveyId}/readings/${a1.id}/exclusion`).send({ excluded: false, reason: 'The shadow was elsewhere' }).expect(200);
    expect(await office()).toMatchObject({ points: before.points });
    // A reading without a place, placed by hand inside the office, joins its points.
    const [unplaced] = (await admin.get(`/api/surveys/${surveyId}/unplaced`)).body.groups[0].readings;
    await admin.put(`/api/surveys/${surveyId}/readings/${unplaced.id}/placement`).send({ planId, xM: 6, yM: 6 }).expect(200);
    expect((await office()).points).toBe(before.points + 1);
  });

  it('a signed-off survey refuses placements and exclusions; another organisation gets 404', async () => {
    const { surveyId } = await plannedSurvey();
    await uploadAndWait(t, admin, surveyId, labelLog(400));
    const [first] = (await admin.get(`/api/surveys/${surveyId}/unplaced`)).body.groups[0].readings;
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 1, yM: 1 })).status).toBe(404);
    t.db.update(surveys).set({ status: 'signed_off' }).where(eq(surveys.id, surveyId)).run();
    const before = tableCounts(t);
    const placed = await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/placement`).send({ planId, xM: 1, yM: 1 });
    expect(placed.status).toBe(409);
    expect(placed.body.error.message).toMatch(/signed off/);
    expect((await admin.put(`/api/surveys/${surveyId}/readings/${first.id}/exclusion`).send({ excluded: true, reason: 'Door left open' })).status).toBe(409);
    expect(tableCounts(t)).toEqual(before);
  });
});
