import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { buildSurvey, userId, createCountingProbe, insertManualProbe } from './support/factories';
import { probes } from '@server/db/schema/calibration';
import { logImports, readings, surveys } from '@server/db/schema/surveys';
import { waitForImport } from '@server/modules/imports/imports-service';
import { binary, pdfText } from './pdf-text';
import { fieldRecords } from '@server/db/schema/field';
import { DEMO_COUNTING_PROBES } from '@server/db/demo/demo-probes';

// A 6 m x 4 m office, judged against 500 lx (EN 12464-1, offices, secondary source).
const OFFICE = [{ key: 'office', name: 'Field office', useType: 'office_writing', polygon: [[1, 1], [7, 1], [7, 5], [1, 5]] as [number, number][] }];

let t: TestApp;
let surveyor: TestClient;
let reviewer: TestClient;
let manualProbeId: number;
let certificateProbeId: number;

function manualProbe(t: TestApp, serial: string, meterClass: 'L' | 'A' | 'B' | 'C' | null, uRel: number | null, rangeHighLux: number | null = 50_000) {
  return insertManualProbe(t, userId(t, DEMO.surveyor).organizationId, { serial, meterClass, uRel, rangeHighLux });
}

function draftSurvey(name: string, conditions?: { daylightExcluded: boolean; pairedDaylight?: boolean }) {
  const s = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: name, status: 'draft', zones: OFFICE, readings: [] });
  // buildSurvey leaves an empty decode: a phone-only survey starts with none.
  t.db.update(surveys).set({ activeDecodeId: null, conditions: conditions ?? { daylightExcluded: false } }).where(eq(surveys.id, s.surveyId)).run();
  return s;
}

let keyN = 0;
const key = (p = 'k') => `${p}-${Date.now().toString(36)}-${keyN++}`;
const at = (minutes: number) => new Date(t.clock.now() + minutes * 60_000).toISOString();

beforeAll(async () => {
  t = await createTestApp();
  surveyor = await t.signIn(DEMO.surveyor);
  reviewer = await t.signIn(DEMO.facility_manager);
  manualProbeId = manualProbe(t, 'HM-CLASS-B', 'B', 0.02);
  certificateProbeId = manualProbe(t, 'HM-CERT', null, 0.025);
});

describe('manual meters in the calibration workspace', () => {
  it('registers a hand-held meter with a class; a class outside L/A/B/C is refused', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const ok = await cal.post('/api/probes').send({ serial: 'HM-NEW-1', kind: 'manual', description: 'Pocket meter', meterClass: 'A', rangeLowLux: 0, rangeHighLux: 200000 });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ kind: 'manual', meterClass: 'A', scale: null, gains: null });
    const bad = await cal.post('/api/probes').send({ serial: 'HM-NEW-2', kind: 'manual', meterClass: 'D' });
    expect(bad.status).toBe(400);
    // Like any probe it takes a coefficient set: one row, code 0, its certificate's uncertainty.
    const set = await cal.post(`/api/probes/${ok.body.id}/coefficient-sets`).send({
      source: 'manual', effectiveFrom: '2026-11-01T00:00:00.000Z', dueDate: '2027-11-01T00:00:00.000Z', tRefMs: 100, alphaPerK: 0, tCalC: 23,
      gains: [{ code: 0, darkCounts: 0, luxPerCount: 1, uRel: 0.02 }], certificateNumber: 'HM-CERT-9',
    });
    expect(set.status).toBe(201);
  });
});

describe('typed readings', () => {
  it('one value from a class B meter: U = 2 x 0.10/sqrt(3) x E (DIN 5032-7 limits, secondary source; GUM 4.3.7)', async () => {
    const s = draftSurvey('Typed class B');
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'A1', planId: s.planId, xM: 2, yM: 2, probeId: manualProbeId, values: [520], unit: 'lx', recordedAt: at(0),
    });
    expect(res.status).toBe(201);
    expect(res.body.record.reading.lux).toBe(520);
    expect(res.body.record.reading.uLux).toBeCloseTo(2 * (0.1 / Math.sqrt(3)) * 520, 6);
  });

  it('several values: their mean, with the spread s/sqrt(n) in the budget (GUM 4.2.3), certificate uRel 2.5 %', async () => {
    const s = draftSurvey('Typed repeats');
    const values = [500, 510, 530];
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'A1', planId: s.planId, xM: 2, yM: 2, probeId: certificateProbeId, values, unit: 'lx', recordedAt: at(0),
    });
    expect(res.status).toBe(201);
    const mean = 1540 / 3;
    const sd = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / 2);
    const uRel = Math.hypot(0.025, sd / Math.sqrt(3) / mean);
    expect(res.body.record.reading.lux).toBeCloseTo(mean, 9);
    expect(res.body.record.reading.uLux).toBeCloseTo(2 * uRel * mean, 6);
    expect(res.body.record.reading.n).toBe(3);
  });

  it('values typed in foot-candles are stored in lux (1 fc = 10.7639104167 lx)', async () => {
    const s = draftSurvey('Typed fc');
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'A1', probeId: manualProbeId, values: [50], unit: 'fc', recordedAt: at(0),
    });
    expect(res.body.record.reading.lux).toBeCloseTo(538.19552, 4);
    expect(res.body.record.values).toEqual([50]);
  });

  it('refuses a negative value, not a number and a value beyond the meter range, naming it; nothing is stored', async () => {
    const s = draftSurvey('Typed bad');
    const send = (values: unknown[]) => surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'typed', point: 'A1', probeId: manualProbeId, values, unit: 'lx', recordedAt: at(0) });
    const neg = await send([300, -5]);
    expect(neg.status).toBe(422);
    expect(neg.body.error.message).toMatch(/Value 2 \(-5\) is negative/);
    expect((await send(['12a'])).status).toBe(400);
    const big = await send([60_000]);
    expect(big.status).toBe(422);
    expect(big.body.error.message).toMatch(/beyond the meter's range \(up to 50000 lx\)/);
    expect(t.db.select().from(fieldRecords).where(eq(fieldRecords.surveyId, s.surveyId)).all()).toEqual([]);
    expect(t.db.select().from(readings).where(eq(readings.surveyId, s.surveyId)).all()).toEqual([]);
  });

  it('a logging probe cannot take typed values; a hand-held meter cannot take a mark', async () => {
    const s = draftSurvey('Wrong meter');
    const lx = (await surveyor.get('/api/probes?kind=counts')).body.items[0];
    const typed = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'typed', point: 'A1', probeId: lx.id, values: [300], unit: 'lx', recordedAt: at(0) });
    expect(typed.status).toBe(422);
    const mark = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'mark', point: 'A1', probeId: manualProbeId, recordedAt: at(0) });
    expect(mark.status).toBe(422);
  });
});

describe('idempotent sync', () => {
  it('the same key sent twice stores one record and one reading; the second answer is 200 alreadyStored', async () => {
    const s = draftSurvey('Idempotent');
    const body = { idempotencyKey: key('dup'), kind: 'typed', point: 'A1', planId: s.planId, xM: 3, yM: 3, probeId: manualProbeId, values: [480], unit: 'lx', recordedAt: at(0) };
    const first = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(body);
    const again = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(body);
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(again.body.alreadyStored).toBe(true);
    expect(again.body.record.id).toBe(first.body.record.id);
    expect(t.db.select().from(fieldRecords).where(eq(fieldRecords.surveyId, s.surveyId)).all()).toHaveLength(1);
    expect(t.db.select().from(readings).where(eq(readings.surveyId, s.surveyId)).all()).toHaveLength(1);
  });

  it('typed readings are judged in their zone like logged ones (a phone-only survey reaches a verdict)', async () => {
    const s = draftSurvey('Phone only');
    // A 3 x 2 grid in the 6 x 4 m office at 520-560 lx: EN 12464-1 asks ceil(d/p) points per side.
    let i = 0;
    for (const x of [2, 4, 6]) for (const y of [2, 4]) {
      const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
        idempotencyKey: key(), kind: 'typed', point: `O${++i}`, planId: s.planId, xM: x, yM: y, probeId: manualProbeId, values: [520 + 8 * i], unit: 'lx', recordedAt: at(i),
      });
      expect(res.status).toBe(201);
    }
    const c = await surveyor.get(`/api/surveys/${s.surveyId}/compliance`);
    expect(c.status).toBe(200);
    const zone = c.body.zones.find((z: { name: string }) => z.name === 'Field office');
    expect(zone.points).toBe(6);
    expect(zone.eavg).toBeCloseTo((528 + 536 + 544 + 552 + 560 + 568) / 6, 6);
  });
});

describe('paired lights-on / lights-off readings (ASR A3.4 section 7.3)', () => {
  it('1235 lx on and 355 lx off give 880 lx of electric light (worked example in meter documentation, secondary)', async () => {
    const s = draftSurvey('Paired', { daylightExcluded: false, pairedDaylight: true });
    const base = { kind: 'typed', point: 'W1', planId: s.planId, xM: 2, yM: 2, probeId: manualProbeId, unit: 'lx' };
    expect((await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...base, idempotencyKey: key(), values: [1235], lights: 'on', recordedAt: at(0) })).status).toBe(201);
    const off = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...base, idempotencyKey: key(), values: [355], lights: 'off', recordedAt: at(1) });
    expect(off.status).toBe(201);
    expect(off.body.record.reading).toBeNull();
    const state = (await surveyor.get(`/api/surveys/${s.surveyId}/field`)).body;
    const on = state.records.find((r: { lights: string }) => r.lights === 'on');
    expect(on.reading.lux).toBe(880);
    expect(on.reading.paired).toBe(true);
    const u = (lux: number) => 0.1 / Math.sqrt(3) * lux;
    expect(on.reading.uLux).toBeCloseTo(2 * Math.hypot(u(1235), u(355)), 6);
  });

  it('refuses a pair further apart than 300 s, and a lights-off half with no lights-on reading', async () => {
    const s = draftSurvey('Paired late', { daylightExcluded: false, pairedDaylight: true });
    const base = { kind: 'typed', point: 'W2', probeId: manualProbeId, unit: 'lx' };
    await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...base, idempotencyKey: key(), values: [900], lights: 'on', recordedAt: at(0) });
    const late = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...base, idempotencyKey: key(), values: [300], lights: 'off', recordedAt: at(6) });
    expect(late.status).toBe(422);
    expect(late.body.error.message).toMatch(/360 s apart; a pair may be at most 300 s apart/);
    const lonely = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...base, point: 'W9', idempotencyKey: key(), values: [300], lights: 'off', recordedAt: at(7) });
    expect(lonely.status).toBe(422);
    expect(t.db.select().from(fieldRecords).where(and(eq(fieldRecords.surveyId, s.surveyId), eq(fieldRecords.lights, 'off'))).all()).toEqual([]);
  });
});

describe('measurement conditions', () => {
  it('readings before the 30 min warm-up (common practice) and in daylight where excluded are warned about in the verdicts', async () => {
    const s = draftSurvey('Conditions', { daylightExcluded: true });
    const sessionKey = key('session');
    const session = await surveyor.post(`/api/surveys/${s.surveyId}/field/sessions`).send({
      idempotencyKey: sessionKey, measuredBy: 'Demo surveyor', startedAt: at(0), lightsOnAt: at(-10), supplyVoltageV: 231, ambientTempC: 19, sky: 'overcast', blinds: 'open', lampBurnInHours: 4000, daylightExcluded: false,
    });
    expect(session.status).toBe(201);
    const r = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'C1', planId: s.planId, xM: 2, yM: 2, probeId: manualProbeId, values: [400], unit: 'lx', recordedAt: at(5), sessionKey,
    });
    expect(r.body.record.warnings.map((w: { code: string }) => w.code)).toEqual(['before_warm_up', 'daylight_not_excluded']);
    expect(r.body.record.warnings[0].message).toMatch(/15 min after the lights went on.*30 min.*common practice/);
    const c = await surveyor.get(`/api/surveys/${s.surveyId}/compliance`);
    expect(c.body.warnings.join('\n')).toMatch(/1 reading\(s\) taken less than 30 min after the lights went on \(warm-up time, common practice\): C1/);
    expect(c.body.warnings.join('\n')).toMatch(/daylight although the survey says daylight was excluded: C1/);
    const repeat = await surveyor.post(`/api/surveys/${s.surveyId}/field/sessions`).send({ idempotencyKey: sessionKey, measuredBy: 'Demo surveyor', startedAt: at(0), daylightExcluded: false });
    expect(repeat.status).toBe(200);
    expect(repeat.body.alreadyStored).toBe(true);
  });

  it('the report\'s method section prints each visit\'s conditions, the warm-up time used and the readings taken too early', async () => {
    const s = draftSurvey('Conditions report', { daylightExcluded: true });
    const sessionKey = key('session');
    await surveyor.post(`/api/surveys/${s.surveyId}/field/sessions`).send({
      idempotencyKey: sessionKey, measuredBy: 'Visiting surveyor', startedAt: at(0), lightsOnAt: at(-10), supplyVoltageV: 229, ambientTempC: 18, sky: 'night', blinds: 'closed', lampBurnInHours: 5000, daylightExcluded: true,
    });
    await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'M1', planId: s.planId, xM: 3, yM: 3, probeId: manualProbeId, values: [450], unit: 'lx', recordedAt: at(5), sessionKey,
    });
    const pdf = await surveyor.get(`/api/surveys/${s.surveyId}/report.pdf`).buffer(true).parse(binary);
    const text = await pdfText(pdf.body as Buffer);
    const method = text.slice(text.indexOf('Method'), text.indexOf('Summary'));
    expect(method).toContain('Measurement conditions');
    expect(method).toMatch(/measured by Visiting surveyor; lights on at .*; supply 229 V; ambient 18 °C; night; blinds closed; lamps burnt in 5000 h; daylight excluded\./);
    expect(method).toContain('at least 30 min after the lights are switched on (warm-up time, common practice');
    expect(method).toMatch(/1 reading\(s\) taken less than 30 min after the lights went on \(warm-up time, common practice\): M1/);
  });

  it('a record naming a session that was never synced is refused, naming the session', async () => {
    const s = draftSurvey('Unknown session');
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'skip', point: 'X1', reason: 'blocked', recordedAt: at(0), sessionKey: 'never-synced-1' });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/never-synced-1/);
  });
});

describe('refusal after sign-off', () => {
  it('a new record for a signed-off survey is refused with the reason; a record stored before answers alreadyStored', async () => {
    const s = draftSurvey('Signed meanwhile');
    const early = { idempotencyKey: key(), kind: 'typed', point: 'S1', planId: s.planId, xM: 2, yM: 2, probeId: manualProbeId, values: [500], unit: 'lx', recordedAt: at(0) };
    expect((await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(early)).status).toBe(201);
    t.db.update(surveys).set({ status: 'signed_off', signedOffAt: t.clock.now(), signedOffBy: userId(t, DEMO.facility_manager).id }).where(eq(surveys.id, s.surveyId)).run();
    const late = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ ...early, idempotencyKey: key(), point: 'S2' });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/was signed off on .* read-only and takes no more field records/);
    expect(late.body.error.details).toEqual({ reason: 'signed_off' });
    expect((await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(early)).status).toBe(200);
    const state = await reviewer.get(`/api/surveys/${s.surveyId}/field`);
    expect(state.body.survey.acceptsRecords).toBe(false);
  });

  it('a mark naming a plan of another site answers 422; another organisation\'s survey answers 404', async () => {
    const s = draftSurvey('Marks');
    const other = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Other site', siteName: 'Other site', status: 'draft', zones: OFFICE, readings: [] });
    const wrongPlan = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'mark', point: 'M1', planId: other.planId, xM: 1, yM: 1, recordedAt: at(0) });
    expect(wrongPlan.status).toBe(422);
    const stranger = await t.signIn(DEMO.otherAdmin);
    expect((await stranger.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'mark', point: 'M1', recordedAt: at(0) })).status).toBe(404);
  });
});

describe('photos', () => {
  async function jpegWithGps() {
    return sharp({ create: { width: 3000, height: 1500, channels: 3, background: '#808080' } })
      .withExif({ IFD0: { Make: 'TestCam' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1' } })
      .jpeg().toBuffer();
  }

  it('shrinks to 2048 px, strips the location unless kept, stores by content hash, and is idempotent', async () => {
    const s = draftSurvey('Photos');
    const img = await jpegWithGps();
    expect((await sharp(img).metadata()).exif).toBeDefined();
    const k = key('photo');
    const send = (kk: string, keep: boolean) => surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', img, { filename: 'p.jpg', contentType: 'image/jpeg' })
      .field('idempotencyKey', kk).field('takenAt', at(0)).field('point', 'A1').field('keepLocation', String(keep));
    const res = await send(k, false);
    expect(res.status).toBe(201);
    expect([res.body.photo.widthPx, res.body.photo.heightPx]).toEqual([2048, 1024]);
    const file = await surveyor.get(res.body.photo.url).buffer(true).parse((r, cb) => { const chunks: Buffer[] = []; r.on('data', (c: Buffer) => chunks.push(c)); r.on('end', () => cb(null, Buffer.concat(chunks))); });
    expect(file.status).toBe(200);
    expect((await sharp(file.body as Buffer).metadata()).exif).toBeUndefined();
    expect((await send(k, false)).status).toBe(200);
    const kept = await send(key('photo'), true);
    const keptFile = await surveyor.get(kept.body.photo.url).buffer(true).parse((r, cb) => { const chunks: Buffer[] = []; r.on('data', (c: Buffer) => chunks.push(c)); r.on('end', () => cb(null, Buffer.concat(chunks))); });
    expect((await sharp(keptFile.body as Buffer).metadata()).exif).toBeDefined();
  });

  it('refuses a file that is not an image (415) and one over 20 MB (413)', async () => {
    const s = draftSurvey('Photos bad');
    const text = await surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', Buffer.from('not an image at all'), { filename: 'x.jpg', contentType: 'image/jpeg' })
      .field('idempotencyKey', key()).field('takenAt', at(0));
    expect(text.status).toBe(415);
    expect(text.body.error.message).toMatch(/A photo must be a PNG, JPEG or WebP image/);
    const huge = await surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', Buffer.alloc(21 * 1024 * 1024, 1), { filename: 'big.jpg', contentType: 'image/jpeg' })
      .field('idempotencyKey', key()).field('takenAt', at(0));
    expect(huge.status).toBe(413);
  });
});

describe('counting probes still decode', () => {
  it('a counting probe registered after the change keeps its fields', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const p = await createCountingProbe(cal);
    expect(p.id).toBeGreaterThan(0);
  });
});

describe('planned points in the field', () => {
  it('a record on a planned point takes its label, plan and position; a planned point of another survey is refused (422)', async () => {
    const s = draftSurvey('Planned field');
    const other = draftSurvey('Planned elsewhere');
    const gen = await surveyor.post(`/api/surveys/${s.surveyId}/planned-points/generate`).send({ zoneId: s.zoneIds.office });
    const gen2 = await surveyor.post(`/api/surveys/${other.surveyId}/planned-points/generate`).send({ zoneId: other.zoneIds.office });
    expect([gen.status, gen2.status]).toEqual([200, 200]);
    const p = gen.body.items[0];
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'typed', point: 'typed on the phone', plannedPointId: p.id, probeId: manualProbeId, values: [505], unit: 'lx', recordedAt: at(0),
    });
    expect(res.status).toBe(201);
    expect(res.body.record).toMatchObject({ point: p.label, plannedPointId: p.id, planId: p.planId, xM: p.xM, yM: p.yM });
    const state = (await surveyor.get(`/api/surveys/${s.surveyId}/field`)).body;
    expect(state.plannedPoints.map((x: { id: number }) => x.id)).toEqual(gen.body.items.map((x: { id: number }) => x.id));
    const planned = (await surveyor.get(`/api/surveys/${s.surveyId}/planned-points`)).body.items;
    expect(planned.find((x: { id: number }) => x.id === p.id).readingCount).toBe(1);

    const foreign = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: key(), kind: 'mark', point: 'X', plannedPointId: gen2.body.items[0].id, recordedAt: at(1),
    });
    expect(foreign.status).toBe(422);
    expect(foreign.body.error.message).toMatch(/belongs to another survey than "Planned field"/);
    const unknown = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'mark', point: 'X', plannedPointId: 999_999, recordedAt: at(1) });
    expect(unknown.status).toBe(404);
  });

  it('a photo of a planned point belongs to its zone: shown on the zone detail and in the report appendix', async () => {
    const s = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Photo zone', status: 'draft', zones: OFFICE, readings: [{ x: 4, y: 3, lux: 520, point: 'R1' }] });
    const gen = await surveyor.post(`/api/surveys/${s.surveyId}/planned-points/generate`).send({ zoneId: s.zoneIds.office });
    const p = gen.body.items[0];
    const img = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#c0a040' } }).jpeg().toBuffer();
    const up = await surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', img, { filename: 'luminaire.jpg', contentType: 'image/jpeg' })
      .field('idempotencyKey', key('photo')).field('takenAt', at(0)).field('plannedPointId', String(p.id)).field('note', 'Luminaire L3 with a dead tube');
    expect(up.status).toBe(201);
    expect(up.body.photo).toMatchObject({ zoneId: s.zoneIds.office, point: p.label });
    const zone = await surveyor.get(`/api/surveys/${s.surveyId}/zones/${s.zoneIds.office}/compliance`);
    expect(zone.status).toBe(200);
    expect(zone.body.photos.map((x: { id: number }) => x.id)).toEqual([up.body.photo.id]);
    const pdf = await surveyor.get(`/api/surveys/${s.surveyId}/report.pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Appendix: photos and notes from the field');
    expect(text).toContain(`Field office · point ${p.label}`);
    expect(text).toContain('Luminaire L3 with a dead tube');
  });
});

describe('notes and photos on a whole zone', () => {
  it('a zone note and a zone photo sync once each (idempotency keys) and show on the zone detail and in the report appendix beside the point photos', async () => {
    const s = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Zone notes', status: 'draft', zones: OFFICE, readings: [{ x: 4, y: 3, lux: 520, point: 'R1' }] });
    const note = { idempotencyKey: key('znote'), kind: 'zone_note', zoneId: s.zoneIds.office, note: 'Two luminaires over the window row are out', recordedAt: at(1) };
    const first = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(note);
    const again = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send(note);
    expect([first.status, again.status]).toEqual([201, 200]);
    expect(again.body).toMatchObject({ alreadyStored: true, record: { id: first.body.record.id, kind: 'zone_note', zoneId: s.zoneIds.office, point: 'Field office', reading: null } });
    expect(t.db.select().from(fieldRecords).where(eq(fieldRecords.surveyId, s.surveyId)).all()).toHaveLength(1);
    // A zone note makes no reading: the zone is still judged on its one logged point.
    expect(t.db.select().from(readings).where(eq(readings.surveyId, s.surveyId)).all()).toHaveLength(1);

    const img = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#5080a0' } }).jpeg().toBuffer();
    const photoKey = key('zphoto');
    const sendPhoto = () => surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', img, { filename: 'window-row.jpg', contentType: 'image/jpeg' })
      .field('idempotencyKey', photoKey).field('takenAt', at(2)).field('zoneId', String(s.zoneIds.office)).field('note', 'Window row from the door');
    const p1 = await sendPhoto();
    const p2 = await sendPhoto();
    expect([p1.status, p2.status]).toEqual([201, 200]);
    expect(p2.body.photo).toMatchObject({ id: p1.body.photo.id, zoneId: s.zoneIds.office, point: null, plannedPointId: null });

    const zone = await surveyor.get(`/api/surveys/${s.surveyId}/zones/${s.zoneIds.office}/compliance`);
    expect(zone.status).toBe(200);
    expect(zone.body.notes).toEqual([{ id: first.body.record.id, note: 'Two luminaires over the window row are out', recordedAt: at(1) }]);
    expect(zone.body.photos.map((x: { id: number }) => x.id)).toEqual([p1.body.photo.id]);
    // The field view's state carries the note for the phone; the point list ignores it (no point named "Field office").
    const state = await surveyor.get(`/api/surveys/${s.surveyId}/field`);
    expect(state.body.records.filter((r: { kind: string }) => r.kind === 'zone_note')).toHaveLength(1);

    const pdf = await surveyor.get(`/api/surveys/${s.surveyId}/report.pdf`).buffer(true).parse(binary);
    expect(pdf.status).toBe(200);
    const text = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Appendix: photos and notes from the field');
    expect(text).toContain('Window row from the door');
    expect(text).toContain('Notes on zones');
    expect(text).toContain('Two luminaires over the window row are out');
  });

  it('refuses a zone of another site (422 naming zoneId), an empty note (400) and a note after sign-off (409); nothing is stored', async () => {
    const s = draftSurvey('Zone note refusals');
    const other = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Elsewhere', siteName: 'Elsewhere', status: 'draft', zones: OFFICE, readings: [] });
    const wrong = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'zone_note', zoneId: other.zoneIds.office, note: 'x', recordedAt: at(0) });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.message).toMatch(new RegExp(`Zone ${other.zoneIds.office} is not a zone of this survey's site`));
    const empty = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'zone_note', zoneId: s.zoneIds.office, note: '   ', recordedAt: at(0) });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/note/);
    t.db.update(surveys).set({ status: 'signed_off', signedOffAt: t.clock.now(), signedOffBy: userId(t, DEMO.facility_manager).id }).where(eq(surveys.id, s.surveyId)).run();
    const late = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({ idempotencyKey: key(), kind: 'zone_note', zoneId: s.zoneIds.office, note: 'Too late', recordedAt: at(0) });
    expect(late.status).toBe(409);
    expect(t.db.select().from(fieldRecords).where(eq(fieldRecords.surveyId, s.surveyId)).all()).toHaveLength(0);
  });
});

describe('a label-free log placed by time on "measured here now" marks', () => {
  const csv = (serial: string, bursts: { at: number; label: string }[]) =>
    `timestamp,probe,point,gain,counts\n${bursts.map((b) => `${new Date(b.at).toISOString()},${serial},${b.label},2,16000`).join('\n')}\n`;

  async function upload(surveyId: number, content: string, fields: Record<string, string> = {}) {
    const req = surveyor.post(`/api/surveys/${surveyId}/logs`);
    for (const [k, v] of Object.entries(fields)) void req.field(k, v);
    const res = await req.attach('file', Buffer.from(content), { filename: 'meter-dump.csv', contentType: 'text/csv' });
    expect(res.status).toBe(202);
    await waitForImport(t.deps, res.body.importId);
    return (await surveyor.get(`/api/imports/${res.body.importId}`)).body;
  }

  async function surveyWithMarks(name: string, offsetsS: number[], probeNamed: boolean) {
    const s = draftSurvey(name);
    // A logging meter of the demo (counting probe, gain 2 known to its approved set).
    const serial = DEMO_COUNTING_PROBES[0].serial;
    const probeId = t.db.select({ id: probes.id }).from(probes).where(eq(probes.serial, serial)).get()!.id;
    const points = (await surveyor.post(`/api/surveys/${s.surveyId}/planned-points/generate`).send({ zoneId: s.zoneIds.office })).body.items as { id: number; label: string; xM: number; yM: number }[];
    const t0 = t.clock.now() - 3_600_000;
    const marks = [];
    for (const [i, off] of offsetsS.entries()) {
      const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
        idempotencyKey: key('mark'), kind: 'mark', point: points[i].label, plannedPointId: points[i].id, probeId: probeNamed ? probeId : null, recordedAt: new Date(t0 + off * 1000).toISOString(),
      });
      expect(res.status).toBe(201);
      marks.push({ ...points[i], at: t0 + off * 1000 });
    }
    return { s, serial, marks, t0 };
  }

  it('with the meter 90 s slow and a clock offset of +90 s: two bursts placed on their marks, one burst and one mark listed unmatched', async () => {
    const { s, serial, marks, t0 } = await surveyWithMarks('Label-free offset', [0, 60, 120], true);
    const slow = 90_000;
    const content = csv(serial, [
      { at: t0 + 3_000 - slow, label: '1' },
      { at: t0 + 60_000 + 5_000 - slow, label: '2' },
      { at: t0 + 30_000 - slow, label: '3' }, // 30 s from the first two marks: outside the default ±20 s
    ]);
    const status = await upload(s.surveyId, content, { clockOffsetS: '90' });
    expect(status.errors).toEqual([]);
    expect(status.status).toBe('done');
    const m = status.markMatching;
    expect([m.windowS, m.clockOffsetS]).toEqual([20, 90]);
    expect(m.matched.map((x: { point: string; deltaS: number }) => [x.point, x.deltaS])).toEqual([[marks[0].label, 3], [marks[1].label, 5]]);
    expect(m.unplaced).toHaveLength(1);
    expect(m.unplaced[0]).toMatchObject({ reason: 'no_mark', message: 'No mark within ±20.0 s of this burst' });
    expect(m.marksWithoutBurst.map((x: { point: string }) => x.point)).toEqual([marks[2].label]);
    // The placed readings sit on their planned points (counted there), the third has no place.
    const planned = (await surveyor.get(`/api/surveys/${s.surveyId}/planned-points`)).body.items as { id: number; readingCount: number }[];
    expect(planned.find((p) => p.id === marks[0].id)?.readingCount).toBe(1);
    expect(planned.find((p) => p.id === marks[1].id)?.readingCount).toBe(1);
    const unplaced = (await surveyor.get(`/api/surveys/${s.surveyId}/unplaced`)).body;
    expect(unplaced.total).toBe(1);
    const onFirst = t.db.select().from(readings).where(and(eq(readings.surveyId, s.surveyId), eq(readings.point, '1'))).get()!;
    expect([onFirst.planId, onFirst.xM, onFirst.yM]).toEqual([s.planId, marks[0].xM, marks[0].yM]);
    // Kept across a re-decode: the placement is stored by label, probe and time.
    const cal = await t.signIn(DEMO.calibration);
    expect((await cal.post(`/api/surveys/${s.surveyId}/redecode`)).status).toBe(200);
    const again = (await surveyor.get(`/api/surveys/${s.surveyId}/planned-points`)).body.items as { id: number; readingCount: number }[];
    expect(again.find((p) => p.id === marks[0].id)?.readingCount).toBe(1);
  });

  it('without the offset the same slow meter places nothing (every burst is 85-90 s from its mark)', async () => {
    const { s, serial, t0 } = await surveyWithMarks('Label-free no offset', [0, 60], true);
    const status = await upload(s.surveyId, csv(serial, [{ at: t0 + 3_000 - 90_000, label: '1' }, { at: t0 + 65_000 - 90_000, label: '2' }]));
    expect(status.markMatching.matched).toEqual([]);
    expect(status.markMatching.unplaced.map((u: { reason: string }) => u.reason)).toEqual(['no_mark', 'no_mark']);
    expect(status.markMatching.marksWithoutBurst).toHaveLength(2);
  });

  it('a burst two marks could claim is never guessed: it goes to the unplaced list naming both; a wider window per upload is honoured', async () => {
    const { s, serial, marks, t0 } = await surveyWithMarks('Label-free ambiguous', [0, 30], false);
    const status = await upload(s.surveyId, csv(serial, [{ at: t0 + 15_000, label: 'a' }, { at: t0 - 2_000, label: 'b' }]), { matchWindowS: '25' });
    const m = status.markMatching;
    expect(m.windowS).toBe(25);
    expect(m.matched.map((x: { point: string; deltaS: number }) => [x.point, x.deltaS])).toEqual([[marks[0].label, -2]]);
    expect(m.unplaced).toHaveLength(1);
    expect(m.unplaced[0].reason).toBe('ambiguous');
    expect(m.unplaced[0].markPoints).toEqual([marks[0].label, marks[1].label]);
    expect(m.marksWithoutBurst.map((x: { point: string }) => x.point)).toEqual([marks[1].label]);
  });

  it('refuses a window or an offset that is not a number of seconds in range (400, naming the field); nothing is stored', async () => {
    const s = draftSurvey('Label-free bad');
    const before = t.db.select().from(logImports).where(eq(logImports.surveyId, s.surveyId)).all().length;
    const send = (fields: Record<string, string>) => {
      const req = surveyor.post(`/api/surveys/${s.surveyId}/logs`);
      for (const [k, v] of Object.entries(fields)) void req.field(k, v);
      return req.attach('file', Buffer.from('timestamp,probe,point\n'), { filename: 'x.csv', contentType: 'text/csv' });
    };
    const neg = await send({ matchWindowS: '-1' });
    expect(neg.status).toBe(400);
    expect(neg.body.error.message).toMatch(/^matchWindowS: /);
    const text = await send({ clockOffsetS: 'soon' });
    expect(text.status).toBe(400);
    expect(text.body.error.message).toMatch(/^clockOffsetS: /);
    expect(t.db.select().from(logImports).where(eq(logImports.surveyId, s.surveyId)).all()).toHaveLength(before);
  });
});
