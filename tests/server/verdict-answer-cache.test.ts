import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { buildSurvey, insertDecode, insertManualProbe, OFFICE_AND_CORRIDOR, officeAndCorridorReadings, orgOf, pngOf } from './support/factories';
import { readings } from '@server/db/schema/surveys';
import { answerCache } from '@server/modules/compliance/answer-cache';
import { verdictAggregates, verdictAnswerParts } from '@server/db/schema/aggregates';

/**
 * The verdict routes keep their summary per verdict aggregate in the process
 * (server/modules/compliance/answer-cache.ts), and a zone's points and a plan's map readings beside
 * it in the database (answer-parts.ts). Each test reads an answer (so it is kept), changes one
 * input, and checks the next answer shows the change and equals one built with nothing kept.
 */
let t: TestApp;
let surveyor: TestClient;
let manager: TestClient;
let manualProbeId: number;

beforeAll(async () => {
  t = await createTestApp();
  surveyor = await t.signIn(DEMO.surveyor);
  manager = await t.signIn(DEMO.facility_manager);
  manualProbeId = insertManualProbe(t, orgOf(t, DEMO.surveyor), { serial: 'CACHE-HM', meterClass: 'B', uRel: 0.02 });
}, 180_000);

let s: ReturnType<typeof buildSurvey>;
beforeEach(() => {
  s = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Kept answers', status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
});

type ZoneDetail = { zone: { points: number; targetLux: number | null; targetId: number | null }; frozen: boolean; points: { readingId: number; point: string; xM: number; yM: number; inWallBand: boolean }[]; photos: { point: string | null }[]; notes: { note: string }[] };
type MapData = { readings: { id: number; probe: string; zoneId: number | null; xM: number }[] };

const zoneUrl = (zone: 'office' | 'corridor') => `/api/surveys/${s.surveyId}/zones/${s.zoneIds[zone]}/compliance`;
const mapUrl = () => `/api/surveys/${s.surveyId}/map?planId=${s.planId}`;
const verdictsUrl = () => `/api/surveys/${s.surveyId}/compliance`;

/** The answer with what is kept, then the same answer built with nothing kept: they must be equal. */
async function keptAndFresh<T>(url: string, c: TestClient = manager): Promise<T> {
  const kept = await c.get(url);
  expect(kept.status).toBe(200);
  forgetKept();
  const fresh = await c.get(url);
  expect(fresh.body).toEqual(kept.body);
  return kept.body as T;
}

/** Reads every answer once so its parts are kept before an input changes. */
async function warm() {
  for (const url of [verdictsUrl(), zoneUrl('office'), zoneUrl('corridor'), mapUrl()]) expect((await manager.get(url)).status).toBe(200);
  expect(answerCache(t.db).stats().entries).toBeGreaterThanOrEqual(1);
  expect(keptParts()).toEqual(expect.arrayContaining([`zone:${s.zoneIds.office}`, `zone:${s.zoneIds.corridor}`, `map:${s.planId}`]));
}

/** The parts kept beside the survey's aggregates. */
const keptParts = () => t.db.select({ part: verdictAnswerParts.part }).from(verdictAnswerParts).innerJoin(verdictAggregates, eq(verdictAggregates.id, verdictAnswerParts.aggregateId))
  .where(eq(verdictAggregates.surveyId, s.surveyId)).all().map((p) => p.part);

function forgetKept() {
  answerCache(t.db).clear();
  t.db.delete(verdictAnswerParts).run();
}

const officeReading = (point: string) => t.db.select().from(readings).where(eq(readings.point, point)).all().find((r) => r.decodeId === s.decodeId)!;

describe('kept verdict answers', () => {
  it('a kept zone detail, sent again, is the same as one built afresh, gzip or not', async () => {
    await warm();
    const kept = await manager.get(zoneUrl('office'));
    expect(kept.headers['content-encoding']).toBe('gzip');
    const plain = await manager.get(zoneUrl('office')).set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body).toEqual(kept.body);
    const body = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    // 49 grid points and one in the wall band (factories: officeAndCorridorReadings).
    expect(body.points).toHaveLength(50);
    expect(body.points.filter((p) => p.inWallBand)).toHaveLength(1);
  });

  it('a zone outline, when changed, moves the points of the zone detail and the map\'s zone marks', async () => {
    await warm();
    const before = (await manager.get(zoneUrl('office'))).body as ZoneDetail;
    const admin = await t.signIn(DEMO.admin);
    expect((await admin.patch(`/api/zones/${s.zoneIds.office}`).send({ polygon: [[0, 0], [2, 0], [2, 4], [0, 4]] })).status).toBe(200);
    const after = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(after.points.length).toBeLessThan(before.points.length);
    expect(after.points.every((p) => p.xM <= 2)).toBe(true);
    const map = await keptAndFresh<MapData>(mapUrl());
    expect(map.readings.filter((r) => r.zoneId === s.zoneIds.office).every((r) => r.xM <= 2)).toBe(true);
    expect(map.readings.some((r) => r.xM > 2 && r.xM < 4 && r.zoneId === null)).toBe(true);
  });

  it('a zone\'s library entry, when changed, changes its verdict and the zone detail', async () => {
    await warm();
    const admin = await t.signIn(DEMO.admin);
    const own = await admin.post('/api/targets').send({ useType: 'cache_office', name: 'Cache office spec', emValue: 300, sourceUnit: 'lx', u0Min: null, source: 'Client spec 1' });
    expect((await admin.put(`/api/zones/${s.zoneIds.office}/target`).send({ targetId: own.body.id })).status).toBe(200);
    const detail = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(detail.zone).toMatchObject({ targetId: own.body.id, targetLux: 300 });
    const verdicts = await keptAndFresh<{ zones: { zoneId: number; targetLux: number }[] }>(verdictsUrl());
    expect(verdicts.zones.find((z) => z.zoneId === s.zoneIds.office)?.targetLux).toBe(300);
  });

  it('a reading placed by hand elsewhere leaves the zone detail; an excluded one leaves the statistics', async () => {
    await warm();
    const moved = officeReading('P1');
    const excluded = officeReading('P2');
    expect((await surveyor.put(`/api/surveys/${s.surveyId}/readings/${moved.id}/placement`).send({ planId: s.planId, xM: 8, yM: 1, reason: 'Logged on the wrong spot' })).status).toBe(200);
    const office = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(office.points.map((p) => p.readingId)).not.toContain(moved.id);
    const corridor = await keptAndFresh<ZoneDetail>(zoneUrl('corridor'));
    expect(corridor.points.find((p) => p.readingId === moved.id)).toMatchObject({ xM: 8, yM: 1 });
    const pointsBefore = office.zone.points;
    expect((await surveyor.put(`/api/surveys/${s.surveyId}/readings/${excluded.id}/exclusion`).send({ excluded: true, reason: 'Door left open' })).status).toBe(200);
    const after = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(after.zone.points).toBe(pointsBefore - 1);
  });

  it('a new decode and an accepted import each show their readings', async () => {
    await warm();
    const row = (point: string, x: number, y: number) => ({
      point, xM: x, yM: y, planId: s.planId, role: 'task' as const, timeMs: t.clock.now() + 1_000_000, probeId: s.probeId, lux: 555, uLux: 20,
      luxBound: 'exact' as const, flag: 'ok' as const, gainCode: 0, sampleCount: 1, coefficientSetId: s.coefficientSetId, budget: [{ name: 'calibration', uRel: 0.02 }],
    });
    insertDecode(t, s.surveyId, [row('ADDED-1', 2, 2)], { addLog: true });
    expect((await keptAndFresh<ZoneDetail>(zoneUrl('office'))).points.map((p) => p.point)).toContain('ADDED-1');
    insertDecode(t, s.surveyId, [row('REDECODED-1', 1.5, 1.5), row('REDECODED-2', 2.5, 2.5)]);
    const office = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(office.points.map((p) => p.point).sort()).toEqual(['REDECODED-1', 'REDECODED-2']);
    expect((await keptAndFresh<MapData>(mapUrl())).readings).toHaveLength(2);
  });

  it('a reading typed in the field view joins its zone', async () => {
    await warm();
    const res = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: `cache-typed-${s.surveyId}`, kind: 'typed', point: 'TYPED-1', planId: s.planId, xM: 2, yM: 2, probeId: manualProbeId, values: [510], unit: 'lx', recordedAt: new Date(t.clock.now()).toISOString(),
    });
    expect(res.status).toBe(201);
    expect((await keptAndFresh<ZoneDetail>(zoneUrl('office'))).points.map((p) => p.point)).toContain('TYPED-1');
  });

  it('photos and notes, which are no input of the verdicts, show at once beside kept points', async () => {
    await warm();
    const note = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: `cache-note-${s.surveyId}`, kind: 'zone_note', zoneId: s.zoneIds.office, note: 'Luminaire 3 flickers', recordedAt: new Date(t.clock.now()).toISOString(),
    });
    expect(note.status).toBe(201);
    // A photo of a point named like one of the office's readings, in another case and with spaces.
    const photo = await surveyor.post(`/api/surveys/${s.surveyId}/field/photos`).attach('file', pngOf(40, 30, 3), { filename: 'p.png', contentType: 'image/png' })
      .field('idempotencyKey', `cache-photo-${s.surveyId}`).field('takenAt', new Date(t.clock.now()).toISOString()).field('point', ' p7 ');
    expect(photo.status).toBe(201);
    const office = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(office.notes.map((n) => n.note)).toEqual(['Luminaire 3 flickers']);
    expect(office.photos.map((p) => p.point)).toEqual([' p7 '.trim()]);
    expect((await keptAndFresh<ZoneDetail>(zoneUrl('corridor'))).photos).toEqual([]);
  });

  it('a probe renamed since the map was kept shows its new serial', async () => {
    const typed = await surveyor.post(`/api/surveys/${s.surveyId}/field/records`).send({
      idempotencyKey: `cache-serial-${s.surveyId}`, kind: 'typed', point: 'TYPED-2', planId: s.planId, xM: 3, yM: 3, probeId: manualProbeId, values: [505], unit: 'lx', recordedAt: new Date(t.clock.now()).toISOString(),
    });
    expect(typed.status).toBe(201);
    await warm();
    // The typed reading is the only one at x = 3 m (the fixture grid's columns are at 0.75 + k x 0.4167 m).
    const serialOf = (map: MapData) => map.readings.find((r) => r.xM === 3)?.probe;
    const before = (await manager.get(mapUrl())).body as MapData;
    const cal = await t.signIn(DEMO.calibration);
    const renamed = await cal.patch(`/api/probes/${manualProbeId}`).send({ serial: 'CACHE-HM-RENAMED' });
    expect(renamed.status).toBe(200);
    const after = await keptAndFresh<MapData>(mapUrl());
    expect(serialOf(before)).toBe('CACHE-HM');
    expect(serialOf(after)).toBe('CACHE-HM-RENAMED');
  });

  it('a sign-off freezes the answer: the zone detail says so and keeps its points', async () => {
    await warm();
    const before = (await manager.get(zoneUrl('office'))).body as ZoneDetail;
    expect((await surveyor.post(`/api/surveys/${s.surveyId}/submit`).send({})).status).toBe(200);
    expect((await manager.post(`/api/surveys/${s.surveyId}/sign-off`).send({ comment: 'kept' })).status).toBe(200);
    const after = await keptAndFresh<ZoneDetail>(zoneUrl('office'));
    expect(after.frozen).toBe(true);
    expect(after.points).toEqual(before.points);
  });
});
