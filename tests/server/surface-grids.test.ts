import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { createTestApp, DEMO, DEMO_START, type TestApp, type TestClient } from './helpers';
import { insertSite, orgOf, pngOf, createTestProbes, tableCounts, uploadAndWait } from './support/factories';

// Wall and ceiling grids planned on request (EN 12464-1:2021 asks for Em,wall and Em,ceiling; the
// grid on each surface follows the standard's spacing formula, the surface rule is Luxtrail's).

let t: TestApp;
let admin: TestClient;
let siteId: number;
let planId: number;
let officeId: number;
let deskId: number;

const rect = (x: number, y: number, w: number, h: number) => [[x, y], [x + w, y], [x + w, y + h], [x, y + h]];
const iso = (minutes: number) => new Date(DEMO_START + minutes * 60_000).toISOString();
const p = (d: number) => 0.2 * 5 ** Math.log10(d); // EN 12464-1 spacing, computed independently here

type Point = { id: number; label: string; xM: number; yM: number; plane: string; heightM: number | null; azimuthDeg: number | null };

async function newSurvey() {
  const s = await admin.post('/api/surveys').send({ siteId, name: `Surfaces ${Math.random().toString(36).slice(2, 7)}` });
  expect(s.status).toBe(201);
  return s.body.id as number;
}

beforeAll(async () => {
  t = await createTestApp();
  admin = await t.signIn(DEMO.admin);
  const org = orgOf(t, DEMO.admin);
  createTestProbes(t, org);
  siteId = insertSite(t, org, 'Surface grid site');
  const plan = await admin.post(`/api/sites/${siteId}/plans`).attach('file', pngOf(200, 150, 5), { filename: 'p.png', contentType: 'image/png' }).field('name', 'Ground').field('widthM', '20');
  planId = plan.body.id;
  officeId = (await admin.post(`/api/plans/${planId}/zones`).send({ name: 'Office 1', kind: 'room', useType: 'office_writing', polygon: rect(0, 0, 6, 4) })).body.id;
  deskId = (await admin.post(`/api/plans/${planId}/zones`).send({ name: 'Desk', kind: 'task_area', useType: 'office_writing', polygon: rect(1, 1, 2, 1.5) })).body.id;
}, 180_000);

describe('wall and ceiling grids', () => {
  it('a 6 m × 4 m office 3 m high: four walls of 14 × 7, 8 × 6, 14 × 7 and 8 × 6 points (next higher integer), labelled by wall, facing into the room', async () => {
    const surveyId = await newSurvey();
    const floor = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId });
    expect(floor.status).toBe(200);
    const res = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'walls', wallHeightM: 3 });
    expect(res.status).toBe(200);
    const walls = res.body.grids.find((g: { surface: string }) => g.surface === 'walls');
    const perWall = (l: number) => Math.ceil(l / p(l / 3 >= 2 ? 3 : Math.max(l, 3))) * Math.ceil(3 / p(l / 3 >= 2 ? 3 : Math.max(l, 3)));
    expect(perWall(6)).toBe(98);
    expect(perWall(4)).toBe(48);
    expect(walls).toMatchObject({ code: 'OF1', wallHeightM: 3, generatedCount: 2 * 98 + 2 * 48, changed: false });
    expect(walls.notes.join(' ')).toMatch(/Wall 1 \(6\.00 m × 3\.00 m, facing 0°\): d 3\.00 m, p 0\.43 m, 14 × 7 points/);
    // The working plane's grid is kept beside it, and both share the zone's code.
    expect(res.body.grids.map((g: { surface: string; code: string }) => `${g.code}:${g.surface}`)).toEqual(['OF1:working_plane', 'OF1:walls']);
    const items = res.body.items as Point[];
    const w2 = items.find((x) => x.label === 'OF1-W2-A1')!;
    // Wall 2 runs up the right-hand side (x = 6): its points stand 0.05 m inside and face 270°.
    expect(w2).toMatchObject({ plane: 'wall', azimuthDeg: 270 });
    expect(w2.xM).toBeCloseTo(6 - 0.05, 12);
    expect(w2.heightM).toBeCloseTo(3 - 3 / 6 / 2, 12);
    expect(items.filter((x) => x.plane === 'horizontal')).toHaveLength(floor.body.items.length);
  });

  it('the ceiling grid repeats the working plane\'s cells with C labels and no height', async () => {
    const surveyId = await newSurvey();
    const floor = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId });
    const ceiling = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'ceiling' });
    expect(ceiling.status).toBe(200);
    const c = (ceiling.body.items as Point[]).filter((x) => x.plane === 'ceiling');
    expect(c.map((x) => [x.xM, x.yM])).toEqual((floor.body.items as Point[]).map((x) => [x.xM, x.yM]));
    expect(c[0]).toMatchObject({ label: 'OF1-C-A1', heightM: null, azimuthDeg: null });
  });

  it('refuses a task area, walls without a room height and a centreline ceiling, naming why, and stores nothing', async () => {
    const surveyId = await newSurvey();
    const before = tableCounts(t);
    const task = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: deskId, surface: 'walls', wallHeightM: 3 });
    expect(task.status).toBe(422);
    expect(task.body.error.message).toMatch(/Zone "Desk" is a task area: walls grids are planned for rooms/);
    const noHeight = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'walls' });
    expect(noHeight.status).toBe(400);
    expect(JSON.stringify(noHeight.body.error)).toMatch(/room height \(wallHeightM/);
    const tooLow = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'walls', wallHeightM: 0.4 });
    expect(tooLow.status).toBe(400);
    const line = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'ceiling', layout: 'centreline' });
    expect(line.status).toBe(400);
    expect(tableCounts(t)).toEqual(before);
  });

  it('a label-only log naming wall and ceiling points lands them as wall and ceiling readings at their points; the wall check lists the planned points still unread', async () => {
    const surveyId = await newSurvey();
    await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'walls', wallHeightM: 3 });
    const gen = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'ceiling' });
    const items = gen.body.items as Point[];
    const log = [
      'timestamp,probe,point,gain,counts,x_m,y_m,plane',
      `${iso(1)},T-4102,OF1-W1-A1,2,6000,,,`,
      `${iso(2)},T-4102,of1-w3-b2,2,6100,,,`,
      `${iso(3)},T-4102,OF1-C-A1,2,3000,,,`,
      // A row that states its own plane keeps it.
      `${iso(4)},T-4102,OF1-C-A2,2,3100,,,horizontal`,
      '',
    ].join('\n');
    const { status } = await uploadAndWait(t, admin, surveyId, log);
    expect(status.status).toBe('done');
    expect(status.placement).toMatchObject({ byLabel: 4, none: 0 });
    const rs = (await admin.get(`/api/surveys/${surveyId}/readings?limit=100&sort=time`)).body.items as { point: string; xM: number; yM: number; plane: string; azimuthDeg: number | null }[];
    const w1 = items.find((x) => x.label === 'OF1-W1-A1')!;
    expect(rs.find((r) => r.point === 'OF1-W1-A1')).toMatchObject({ plane: 'wall', azimuthDeg: 0, xM: w1.xM, yM: w1.yM });
    expect(rs.find((r) => r.point === 'of1-w3-b2')).toMatchObject({ plane: 'wall', azimuthDeg: 180 });
    expect(rs.find((r) => r.point === 'OF1-C-A1')).toMatchObject({ plane: 'ceiling', azimuthDeg: null });
    expect(rs.find((r) => r.point === 'OF1-C-A2')).toMatchObject({ plane: 'horizontal' });

    const detail = (await admin.get(`/api/surveys/${surveyId}/zones/${officeId}/compliance`)).body;
    const wall = detail.zone.checks.find((c: { kind: string }) => c.kind === 'wall');
    expect(wall.points).toBe(2);
    const wallTotal = items.filter((x) => x.plane === 'wall').length;
    expect(wall.reasons.join(' ')).toContain(`${wallTotal - 2} of ${wallTotal} planned wall point(s) have no reading`);
    const ceiling = detail.zone.checks.find((c: { kind: string }) => c.kind === 'ceiling');
    const ceilingTotal = items.filter((x) => x.plane === 'ceiling').length;
    // OF1-C-A2 was read on the horizontal plane by the row's own word, so it still counts as visited.
    expect(ceiling.reasons.join(' ')).toContain(`${ceilingTotal - 2} of ${ceilingTotal} planned ceiling point(s) have no reading`);
  });

  it('the planned-points CSV carries plane, height and facing at full precision', async () => {
    const surveyId = await newSurvey();
    const gen = await admin.post(`/api/surveys/${surveyId}/planned-points/generate`).send({ zoneId: officeId, surface: 'walls', wallHeightM: 2.7 });
    const csv = await admin.get(`/api/surveys/${surveyId}/planned-points.csv`).buffer(true).parse((res, cb) => { let s = ''; res.on('data', (c: Buffer) => { s += c.toString('utf8'); }); res.on('end', () => cb(null, s)); });
    const rows = Papa.parse<Record<string, string>>(csv.body as string, { header: true, skipEmptyLines: true }).data;
    expect(Object.keys(rows[0])).toEqual(['label', 'plan', 'zone', 'x_m', 'y_m', 'plane', 'height_m', 'azimuth_deg']);
    for (const item of gen.body.items as Point[]) {
      const row = rows.find((r) => r.label === item.label)!;
      expect([Number(row.x_m), Number(row.y_m), Number(row.height_m), Number(row.azimuth_deg)]).toEqual([item.xM, item.yM, item.heightM, item.azimuthDeg]);
      expect(row.plane).toBe('wall');
    }
    const sheet = await admin.get(`/api/surveys/${surveyId}/walk-sheet.pdf`);
    expect(sheet.status).toBe(200);
  });
});
