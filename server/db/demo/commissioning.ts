/**
 * The invented commissioning demo: the Fernmoor Civic Trust's office in Kiln Street, its lighting
 * refitted and measured new, at night, against Em / MF. One grid over the open-plan office and its
 * copy room, wall and ceiling readings, and one cylindrical point (four vertical readings 90° apart),
 * in Luxtrail's log format with the plane and azimuth_deg columns. Invented data throughout.
 */
import type { DemoPlan } from './library-layout';
import { autoRangeBurst, demoLevelAt, gridPoints, localIso, seededRandom, simProbe } from './simulate-log';
import { DEMO_COUNTING_PROBES } from './demo-probes';

const rect = (x0: number, y0: number, x1: number, y1: number): [number, number][] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

export const COMMISSIONING_SITE = { name: 'Fernmoor Trust office, Kiln Street', address: '3 Kiln Street, Fernmoor', timeZone: 'Europe/London' };

export const COMMISSIONING_PLAN: DemoPlan = {
  key: 'kiln-office', name: 'Office floor', widthM: 24, heightM: 14,
  zones: [
    { key: 'open-office', name: 'Open-plan office', kind: 'room', useType: 'office_writing', polygon: rect(0, 0, 16, 12), demoLevelLux: 720, demoFalloff: 0.15 },
    { key: 'desks', name: 'Desk cluster', kind: 'task_area', useType: 'office_writing', polygon: rect(4, 3, 10, 7), demoLevelLux: 760, demoFalloff: 0.05 },
    { key: 'copy', name: 'Copy room', kind: 'room', useType: 'office_filing', polygon: rect(16, 0, 24, 6), demoLevelLux: 430, demoFalloff: 0.15 },
  ],
};

/** The design's maintenance factor by its parts (CIE 97:2005): 0.9 x 1 x 0.93 x 0.95 = 0.79515. */
export const COMMISSIONING_MF_PARTS = { llmf: 0.9, lsf: 1, lmf: 0.93, rsmf: 0.95 };

export const COMMISSIONING_SURVEY = { name: 'Commissioning after the lighting refit', startedOn: '2026-11-26', startIso: '2026-11-26T18:30:00Z', seed: 1126 };

type Row = { timeMs: number; point: string; gain: number; counts: number; x: number; y: number; plane: string; azimuth: number | null };

/** The commissioning walk as log text: header with plane and azimuth_deg, LX-4102 on a tripod. */
export function commissioningLogCsv(): string {
  const rnd = seededRandom(COMMISSIONING_SURVEY.seed);
  const probe = simProbe(DEMO_COUNTING_PROBES[0]);
  const rows: Row[] = [];
  let t = Date.parse(COMMISSIONING_SURVEY.startIso);
  const take = (point: string, x: number, y: number, lux: number, plane = 'horizontal', azimuth: number | null = null) => {
    for (const s of autoRangeBurst(probe, lux, 3, rnd, 100, 21).samples) {
      rows.push({ timeMs: t, point, gain: s.gain, counts: s.counts, x, y, plane, azimuth });
      t += 400;
    }
    t += 8_000;
  };
  const [office, desks, copy] = COMMISSIONING_PLAN.zones;
  const inDesks = (x: number, y: number) => x >= 4 && x <= 10 && y >= 3 && y <= 7;
  // The office on a 14 x 10 grid, finer than the 12 x 9 the grid rule asks for, so that it keeps enough points once the desk cluster takes its own.
  const officeGrid: { x: number; y: number }[] = [];
  for (let j = 0; j < 10; j++) for (let i = 0; i < 14; i++) officeGrid.push({ x: 0.5 + ((j % 2 === 0 ? i : 13 - i) + 0.5) * (15 / 14), y: 0.5 + (j + 0.5) * (11 / 10) });
  officeGrid.forEach((p, n) => take(`OF-${String(n + 1).padStart(3, '0')}`, p.x, p.y, demoLevelAt(inDesks(p.x, p.y) ? desks : office, p.x, p.y) * (0.97 + 0.06 * rnd())));
  // The desk cluster's immediate surrounding: a ring of points 0.25 m outside its edges, inside the 0.5 m band.
  const ring = [...[3.5, 5, 6.5].flatMap((y) => [[3.75, y], [10.25, y]]), ...[5, 7, 9].flatMap((x) => [[x, 2.75], [x, 7.25]])];
  ring.forEach(([x, y], n) => take(`SR-${String(n + 1).padStart(2, '0')}`, x, y, demoLevelAt(office, x, y) * 0.92 * (0.97 + 0.06 * rnd())));
  gridPoints(desks, 0).forEach((p, n) => take(`DK-${String(n + 1).padStart(2, '0')}`, p.x, p.y, demoLevelAt(desks, p.x, p.y) * (0.97 + 0.06 * rnd())));
  gridPoints(copy).forEach((p, n) => take(`CR-${String(n + 1).padStart(2, '0')}`, p.x, p.y, demoLevelAt(copy, p.x, p.y) * (0.97 + 0.06 * rnd())));
  // Walls of the open-plan office at eye height, the sensor facing into the room, and its ceiling.
  [[0.1, 3, 90], [0.1, 9, 90], [15.9, 3, 270], [15.9, 9, 270], [5, 0.1, 0], [11, 11.9, 180]].forEach(([x, y, az], n) => take(`OW-${n + 1}`, x, y, (230 + 40 * rnd()), 'wall', az));
  [[2, 2], [8, 9.5], [13, 4], [13, 10]].forEach(([x, y], n) => take(`OC-${n + 1}`, x, y, 150 + 30 * rnd(), 'ceiling'));
  // One cylindrical point at a seat by the window: four vertical readings 90° apart (Ez is their mean).
  [[0, 300], [90, 250], [180, 200], [270, 245]].forEach(([az, lux]) => take('CYL-01', 13, 9, lux * (0.98 + 0.04 * rnd()), 'vertical', az));
  const time = localIso(COMMISSIONING_SITE.timeZone);
  const lines = ['timestamp,probe,point,gain,counts,x_m,y_m,plan,int_ms,temp_c,plane,azimuth_deg'];
  for (const r of rows) {
    lines.push([time(r.timeMs), probe.serial, r.point, r.gain, r.counts, Math.round(r.x * 100) / 100, Math.round(r.y * 100) / 100, COMMISSIONING_PLAN.name, 100, 21, r.plane === 'horizontal' ? '' : r.plane, r.azimuth ?? ''].join(','));
  }
  return `${lines.join('\n')}\n`;
}
