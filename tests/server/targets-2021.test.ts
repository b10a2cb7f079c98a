import { describe, it, expect, beforeEach } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey, gridReadings, OFFICE_AND_CORRIDOR, officeAndCorridorReadings, type FixtureReading } from './support/factories';
import { auditEvents } from '@server/db/schema/organizations';
import { surveys } from '@server/db/schema/surveys';
import { judgeZones, type JudgeReading, type JudgeZone } from '@server/modules/compliance/judge-zones';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

type Zone = { name: string; verdict: string; targetLux: number; limitLux: number; reasons: string[]; checks?: { kind: string; targetLux: number | null; limitLux: number | null; eavg: number | null; verdict: string; reasons: string[]; areaM2?: number; points: number }[]; modelling?: { ratio: number } };

describe('EN 12464-1:2021 target entries', () => {
  it('the shipped office entry, when listed, carries required 500 / modified 1000 lx, U0 0.60, Ra 80, RUGL 19, Ez 150, walls 150, ceiling 100 lx (secondary sources)', async () => {
    const c = await t.signIn(DEMO.facility_manager);
    const items = (await c.get('/api/targets')).body.items as Record<string, unknown>[];
    expect(items.find((e) => e.useType === 'office_writing' && e.shipped)).toMatchObject({
      emLux: 500, emModifiedLux: 1000, u0Min: 0.6, ra: 80, rugl: 19, ezLux: 150, emWallLux: 150, emCeilingLux: 100, surfaceU0Min: 0.1, confidence: 'secondary',
    });
    // Filing and copying: 300 / 500 lx, U0 0.40 (secondary).
    expect(items.find((e) => e.useType === 'office_filing' && e.shipped)).toMatchObject({ emLux: 300, emModifiedLux: 500, u0Min: 0.4, confidence: 'secondary' });
  });

  it('an organisation entry, when created with a modified value below Em, answers 400 naming the field; entries without 2021 fields keep working', async () => {
    const admin = await t.signIn(DEMO.admin);
    const bad = await admin.post('/api/targets').send({ useType: 'client_desk', name: 'Client desks', emValue: 500, emModifiedLux: 300, source: 'Client spec C-7' });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error.details)).toMatch(/emModifiedLux/);
    const ok = await admin.post('/api/targets').send({ useType: 'client_desk', name: 'Client desks', emValue: 500, source: 'Client spec C-7' });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ emLux: 500, emModifiedLux: null, ezLux: null, ra: null });
  });
});

describe('PUT /api/zones/:zoneId/target: the value the design chose and why', () => {
  it('the modified 1000 lx with raising modifiers, when chosen, is what the office is judged against, the verdict says why, and the choice is audited', async () => {
    const { surveyId, zoneIds } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(540) });
    const admin = await t.signIn(DEMO.admin);
    const put = await admin.put(`/api/zones/${zoneIds.office}/target`).send({ targetId: null, chosenEmLux: 1000, contextModifiers: ['critical_work', 'small_low_contrast'], contextNote: 'Fine inspection work' });
    expect(put.status).toBe(200);
    expect(put.body).toMatchObject({ chosenEmLux: 1000, contextModifiers: ['critical_work', 'small_low_contrast'], design: { emLux: 1000, basis: 'modified', steps: 2 } });
    const office = (await admin.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: Zone) => z.name === 'Fixture office');
    // About 540 lx against 1000 lx: falls short, and the reasons say which value and why.
    expect(office).toMatchObject({ targetLux: 1000, requiredLux: 500, modifiedLux: 1000, limitLux: 1000, verdict: 'falls_short' });
    expect(office.reasons.join(' ')).toMatch(/modified value 1000 lx, 2 step\(s\) above the required 500 lx, because: visual work is critical/);
    const audit = t.db.select().from(auditEvents).where(and(eq(auditEvents.entityType, 'zone'), eq(auditEvents.entityId, zoneIds.office))).all();
    expect(audit.at(-1)).toMatchObject({ action: 'target_chosen' });
  });

  it('a value above the modified one, or a raise without a reason, answers 422 naming why and changes nothing', async () => {
    const { zoneIds } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const admin = await t.signIn(DEMO.admin);
    const above = await admin.put(`/api/zones/${zoneIds.office}/target`).send({ targetId: null, chosenEmLux: 1500, contextModifiers: ['critical_work'] });
    expect(above.status).toBe(422);
    expect(above.body.error.message).toMatch(/above the entry's modified value 1000 lx/);
    const bare = await admin.put(`/api/zones/${zoneIds.office}/target`).send({ targetId: null, chosenEmLux: 750 });
    expect(bare.status).toBe(422);
    expect(bare.body.error.message).toMatch(/raising context modifier/);
    const unknown = await admin.put(`/api/zones/${zoneIds.office}/target`).send({ targetId: null, chosenEmLux: 750, contextModifiers: ['full_moon'] });
    expect(unknown.status).toBe(400);
    expect((await admin.get(`/api/zones/${zoneIds.office}/target`)).body).toMatchObject({ chosenEmLux: null, contextModifiers: [], design: { emLux: 500, basis: 'required' } });
  });
});

describe('PUT /api/surveys/:id/installation: new installations against Em / MF (CIE 97:2005)', () => {
  it('a new installation at MF 0.8, when judged, compares the office with 500 / 0.8 = 625 lx and says so; in service again, with 500 lx', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(600) });
    const c = await t.signIn(DEMO.surveyor);
    const put = await c.put(`/api/surveys/${surveyId}/installation`).send({ state: 'new', maintenanceFactor: 0.8 });
    expect(put.status).toBe(200);
    expect(put.body.installation).toEqual({ state: 'new', maintenanceFactor: 0.8, parts: null });
    const judged = (await c.get(`/api/surveys/${surveyId}/compliance`)).body;
    expect(judged.installationText).toMatch(/New installation, maintenance factor MF 0.8/);
    const office = judged.zones.find((z: Zone) => z.name === 'Fixture office');
    // About 600 lx: meets 500 lx in service, but falls short of 625 lx new.
    expect(office.limitLux).toBeCloseTo(625, 9);
    expect(office).toMatchObject({ targetLux: 500, verdict: 'falls_short' });
    expect(office.reasons.join(' ')).toMatch(/Em \/ MF = 500 lx \/ 0.8 = 625 lx/);
    await c.put(`/api/surveys/${surveyId}/installation`).send({ state: 'in_service' });
    expect((await c.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: Zone) => z.name === 'Fixture office')).toMatchObject({ limitLux: 500, verdict: 'meets' });
  });

  it('MF from its parts, when given, is their product; parts that disagree with a given MF answer 400; a signed-off survey answers 409', async () => {
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const c = await t.signIn(DEMO.surveyor);
    const parts = { llmf: 0.9, lsf: 1, lmf: 0.9, rsmf: 0.95 };
    const put = await c.put(`/api/surveys/${surveyId}/installation`).send({ state: 'new', parts });
    expect(put.body.installation.maintenanceFactor).toBeCloseTo(0.7695, 12);
    const clash = await c.put(`/api/surveys/${surveyId}/installation`).send({ state: 'new', parts, maintenanceFactor: 0.8 });
    expect(clash.status).toBe(400);
    expect(JSON.stringify(clash.body.error.details)).toMatch(/differs from LLMF/);
    t.db.update(surveys).set({ status: 'signed_off' }).where(eq(surveys.id, surveyId)).run();
    expect((await c.put(`/api/surveys/${surveyId}/installation`).send({ state: 'in_service' })).status).toBe(409);
  });
});

describe('walls, ceilings and cylindrical illuminance', () => {
  it('an office with wall, ceiling and four vertical readings at one point, when judged, gets each check with its own verdict and the modelling ratio', async () => {
    const walls: FixtureReading[] = [[0.1, 1], [0.1, 3], [3.9, 1], [3.9, 3]].map(([x, y], i) => ({ x, y, lux: 180 + i * 5, plane: 'wall', azimuthDeg: x < 1 ? 90 : 270, point: `W${i}` }));
    const ceiling: FixtureReading[] = [[1, 1], [3, 1], [2, 3]].map(([x, y], i) => ({ x, y, lux: 60 + i, plane: 'ceiling', point: `C${i}` }));
    // Ez = (200 + 150 + 100 + 150) / 4 = 150 lx, the mean of four vertical readings 90° apart.
    const cyl: FixtureReading[] = [[0, 200], [90, 150], [180, 100], [270, 150]].map(([az, lux]) => ({ x: 2, y: 2, lux, plane: 'vertical', azimuthDeg: az, point: 'CYL-1' }));
    const { surveyId, zoneIds } = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: [...officeAndCorridorReadings(540), ...walls, ...ceiling, ...cyl] });
    const c = await t.signIn(DEMO.facility_manager);
    const office = (await c.get(`/api/surveys/${surveyId}/compliance`)).body.zones.find((z: Zone) => z.name === 'Fixture office') as Zone;
    const check = (kind: string) => office.checks!.find((k) => k.kind === kind)!;
    expect(check('wall')).toMatchObject({ targetLux: 150, points: 4, verdict: 'meets' });
    // Ceiling about 61 lx against 100 lx: falls short.
    expect(check('ceiling')).toMatchObject({ targetLux: 100, points: 3, verdict: 'falls_short' });
    expect(check('cylindrical').eavg).toBeCloseTo(150, 9);
    expect(check('cylindrical').points).toBe(1);
    expect(office.modelling!.ratio).toBeCloseTo(150 / 540, 2);
    // The horizontal statistics are untouched by the other planes.
    expect(office).toMatchObject({ verdict: 'meets' });
    const detail = (await c.get(`/api/surveys/${surveyId}/zones/${zoneIds.office}/compliance`)).body;
    expect(detail.points.filter((p: { plane: string }) => p.plane === 'vertical')).toHaveLength(4);
  });
});

describe('areas around a task (bands by planar offsetting, clipped to the room)', () => {
  const room: JudgeZone = { id: 1, name: 'Open office', kind: 'room', useType: 'office_writing', planId: 1, planName: 'F', planeHeightM: 0.75, wallBandM: 0.5, polygon: [[0, 0], [20, 0], [20, 12], [0, 12]], target: { id: 1, name: 'Office', emLux: 500, u0Min: 0.6, dfTargetPercent: null, source: 'x', confidence: 'secondary' } };
  const desk: JudgeZone = { ...room, id: 2, name: 'Desks', kind: 'task_area', polygon: [[4, 3], [12, 3], [12, 8], [4, 8]] };
  let id = 0;
  const r = (x: number, y: number, lux: number): JudgeReading => ({ id: ++id, point: `P${id}`, xM: x, yM: y, planId: 1, role: 'task', timeMs: id * 1000, probeId: 1, lux, uLux: lux * 0.04, luxBound: 'exact', flag: 'ok', budget: [{ name: 'calibration', uRel: 0.02 }], coefficientSetId: 1 });

  it('a 8 m x 5 m task area in a 20 m x 12 m room, when judged, gets a 14 m² surrounding against 300 lx and a 118.5 m² background against 100 lx', () => {
    const readings = [
      ...gridReadings(4, 3, 12, 8, 4, 3, () => 560, 0.5).map((p) => r(p.x as number, p.y as number, p.lux as number)),
      // Surrounding band (0.5 m): 3.75 and 12.25 m across, 2.75 and 8.25 m up.
      r(3.75, 5, 340), r(12.25, 5, 330), r(8, 2.75, 320), r(8, 8.25, 335),
      // Background (3 m beyond, within the room and outside its wall band).
      r(1.5, 5, 150), r(14, 5, 140), r(8, 1, 130), r(8, 10.5, 145), r(14, 10.5, 120),
    ];
    const res = judgeZones({ zones: [room, desk], readings, rule: 'simple', daylightExcluded: true });
    const task = res.zones.find((z) => z.zoneId === 2)!;
    const surrounding = task.checks!.find((k) => k.kind === 'surrounding')!;
    const background = task.checks!.find((k) => k.kind === 'background')!;
    // Surrounding area = 9 x 6 - 8 x 5 = 14 m²; background = (15 x 11.5, clipped at the room's lower edge) - 54 = 118.5 m² (hand-computed).
    expect(surrounding.areaM2).toBeCloseTo(14, 9);
    expect(background.areaM2).toBeCloseTo(118.5, 9);
    // Task 500 lx -> surrounding 300 lx (EN 12464-1:2011 Table 1, secondary) -> background 100 lx (a third, 2021, secondary).
    expect(surrounding).toMatchObject({ targetLux: 300, points: 4, verdict: 'meets' });
    expect(background.targetLux).toBeCloseTo(100, 9);
    expect(background).toMatchObject({ points: 5, verdict: 'meets' });
    expect(surrounding.reasons.join(' ')).toMatch(/clipped to Open office/);
  });

  it('a new installation at MF 0.8, when judged, compares the bands with 300 / 0.8 = 375 lx and 125 lx', () => {
    const readings = [r(3.75, 5, 340), r(12.25, 5, 330), r(8, 2.75, 320), r(8, 8.25, 335), ...gridReadings(4, 3, 12, 8, 3, 3, () => 700, 0.5).map((p) => r(p.x as number, p.y as number, 700))];
    const res = judgeZones({ zones: [room, desk], readings, rule: 'simple', daylightExcluded: true, installation: { state: 'new', maintenanceFactor: 0.8 } });
    const surrounding = res.zones.find((z) => z.zoneId === 2)!.checks!.find((k) => k.kind === 'surrounding')!;
    expect(surrounding.limitLux).toBeCloseTo(375, 9);
    expect(surrounding.verdict).toBe('falls_short');
  });
});

describe('GET /api/compliance/maintenance', () => {
  it('a corridor signed off twice and falling, when listed, is maintenance due with the trend of its signed-off values', async () => {
    const first = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Year one', startedOn: '2025-10-01', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(640, 130) });
    const second = buildSurvey(t, { ownerEmail: DEMO.surveyor, siteId: first.siteId, reuse: first, surveyName: 'Year two', startedOn: '2026-10-01', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings(560, 95) });
    const fm = await t.signIn(DEMO.facility_manager);
    for (const s of [first, second]) expect((await fm.post(`/api/surveys/${s.surveyId}/sign-off`).send({ comment: 'ok' })).status).toBe(200);
    const items = (await fm.get('/api/compliance/maintenance')).body.items as { zoneName: string; state: string; trend: { eavg: number }[]; slopeLuxPerYear: number }[];
    const corridor = items.find((i) => i.zoneName === 'Fixture corridor')!;
    expect(corridor.state).toBe('due');
    expect(corridor.trend.map((p) => Math.round(p.eavg))).toEqual([130, 95]);
    // Office: 640 -> 560 lx in a year (least squares through two points: -80 lx a year), reaching 500 lx within the year: due soon.
    const office = items.find((i) => i.zoneName === 'Fixture office')!;
    expect(office.state).toBe('due_soon');
    expect(office.slopeLuxPerYear).toBeCloseTo(-80 * 365.25 / 365, 0);
    expect(items[0].state).toBe('due');
  });
});

describe('demo: a newly commissioned office', () => {
  it('the seeded commissioning survey, when judged, compares with Em / MF (MF 0.9 x 1 x 0.93 x 0.95) and has a cylindrical point and the desk cluster\'s bands', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const list = (await fm.get('/api/surveys')).body.items as { id: number; name: string; installation: { state: string; maintenanceFactor: number } }[];
    const survey = list.find((s) => s.name === 'Commissioning after the lighting refit')!;
    expect(survey.installation.state).toBe('new');
    expect(survey.installation.maintenanceFactor).toBeCloseTo(0.9 * 1 * 0.93 * 0.95, 12);
    const c = (await fm.get(`/api/surveys/${survey.id}/compliance`)).body;
    const office = c.zones.find((z: Zone) => z.name === 'Open-plan office') as Zone;
    expect(office.limitLux).toBeCloseTo(500 / 0.79515, 9);
    const cyl = office.checks!.find((k) => k.kind === 'cylindrical')!;
    expect(cyl.points).toBe(1);
    expect(cyl.limitLux).toBeCloseTo(150 / 0.79515, 9);
    const desk = c.zones.find((z: Zone) => z.name === 'Desk cluster') as Zone;
    expect(desk.checks!.map((k) => k.kind)).toEqual(['surrounding', 'background']);
    expect(c.installationText).toMatch(/New installation/);
  });
});
