import { describe, it, expect, beforeAll } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { max, mean, min } from 'simple-statistics';
import { PDFParse } from 'pdf-parse';
import { logImports, surveys } from '@server/db/schema/surveys';
import { verdictAggregates } from '@server/db/schema/aggregates';
import { createBatchBuilder } from '@server/modules/imports/batch-format';
import { createBatchWriter } from '@server/modules/imports/batch-writer';
import { keepReadingCount } from '@server/modules/surveys/reading-counts';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey } from './support/factories';
import { loadReportData, type ReportData } from '@server/modules/reports/report-data';
import { renderReportPdf } from '@server/modules/reports/report-pdf';

// One 40 m x 25 m hall judged from 200,000 readings: more than any call stack takes as arguments,
// so a spread or apply over them anywhere on the way (verdicts, sign-off, report) would fail.
// A correctness test; speed is measured by `npm run bench:load`.
const HALL: [number, number][] = [[0, 0], [40, 0], [40, 25], [0, 25]];
const NX = 500;
const NY = 400;
const WALL_BAND_M = 0.5;

let t: TestApp;
let surveyId: number;
let zoneId: number;
/** Expected figures, computed here from the generated points (EN 12464-1: Eavg the mean, U0 = Emin / Eavg, points in the wall band left out). */
let expected: { points: number; wallBand: number; eavg: number; emin: number; emax: number };

beforeAll(async () => {
  t = await createTestApp();
  const built = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Hall, dense walk', zones: [{ key: 'hall', name: 'Assembly hall', useType: 'office_writing', polygon: HALL, wallBandM: WALL_BAND_M }], readings: [] });
  surveyId = built.surveyId;
  zoneId = built.zoneIds.hall;
  const importId = t.db.select().from(logImports).where(eq(logImports.surveyId, surveyId)).get()!.id;
  // Written as an import writes them: the import's batch builder and writer.
  const write = createBatchWriter(t.db.$client, { importId, surveyId, decodeId: built.decodeId });
  const batch = createBatchBuilder();
  const inside: number[] = [];
  let wallBand = 0;
  const start = t.clock.now();
  for (let i = 0; i < NX; i++) for (let j = 0; j < NY; j++) {
    const x = 0.04 + (39.92 * i) / (NX - 1);
    const y = 0.04 + (24.92 * j) / (NY - 1);
    // 600 to 700 lx, a smooth pattern with one dip: well above 500 lx with U0 near 0.9.
    const lux = 650 + 45 * Math.sin(i / 37) * Math.cos(j / 23) + (i === 250 && j === 200 ? -40 : 0);
    const n = i * NY + j;
    batch.addReading({
      point: `H${n}`, xM: x, yM: y, planId: built.planId, role: 'task', timeMs: start + n * 100, probeId: built.probeId, lux, uLux: lux * 0.04, luxBound: 'exact', flag: 'ok',
      gainCode: 0, samples: 1, chosenSample: null, coefficientSetId: built.coefficientSetId, note: null, rawCounts: null, rawSignal: null, intMs: null, tempC: null, budget: [{ name: 'calibration', uRel: 0.02 }],
    });
    if (Math.min(x, 40 - x, y, 25 - y) < WALL_BAND_M) wallBand++;
    else inside.push(lux);
    if (batch.readingRows >= 4096) write(batch.take());
  }
  write(batch.take());
  keepReadingCount(t.db, built.decodeId, importId, NX * NY);
  expected = { points: inside.length, wallBand, eavg: mean(inside), emin: min(inside), emax: max(inside) };
}, 600_000);

describe('a zone of 200,000 readings', () => {
  it('has its verdict from every point outside the wall band, and the survey list counts them all', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.get(`/api/surveys/${surveyId}/compliance`);
    expect(res.status).toBe(200);
    const zone = res.body.zones.find((z: { zoneId: number }) => z.zoneId === zoneId);
    expect(expected.points + expected.wallBand).toBe(NX * NY);
    expect(zone).toMatchObject({ points: expected.points, wallBandPoints: expected.wallBand, verdict: 'meets' });
    expect(zone.eavg).toBeCloseTo(expected.eavg, 6);
    expect(zone.emin).toBeCloseTo(expected.emin, 9);
    expect(zone.emax).toBeCloseTo(expected.emax, 9);
    expect(zone.u0).toBeCloseTo(expected.emin / expected.eavg, 9);
    const list = await fm.get('/api/surveys');
    expect(list.body.items.find((s: { id: number }) => s.id === surveyId).readingCount).toBe(NX * NY);
  }, 600_000);

  it('signs off, keeping the judged readings in the frozen aggregate, and its exports use them', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const signed = await fm.post(`/api/surveys/${surveyId}/sign-off`).send({ comment: 'Dense walk accepted' });
    expect(signed.status).toBe(200);
    const row = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
    const frozen = row.frozen as { version: number; aggregateId: number; zones: { zoneId: number; points: number; readingIds?: number[] }[] };
    expect(frozen.version).toBe(2);
    expect(frozen.zones[0].readingIds).toBeUndefined();
    expect(t.db.select().from(verdictAggregates).where(and(eq(verdictAggregates.id, frozen.aggregateId), eq(verdictAggregates.frozen, true))).get()).toBeDefined();
    const after = await fm.get(`/api/surveys/${surveyId}/compliance`);
    expect(after.body).toMatchObject({ frozen: true });
    expect(after.body.zones[0]).toMatchObject({ zoneId, points: expected.points, verdict: 'meets' });

    const csv = await fm.get(`/api/surveys/${surveyId}/compliance/readings.csv`).buffer(true).parse((r, cb) => { let s = ''; r.setEncoding('utf8'); r.on('data', (c: string) => { s += c; }); r.on('end', () => cb(null, s)); });
    const lines = (csv.body as string).trim().split('\r\n');
    expect(lines).toHaveLength(NX * NY + 1);
    const inHall = lines.filter((l) => l.includes(',Assembly hall,no,')).length;
    const inBand = lines.filter((l) => l.includes(',Assembly hall,yes,')).length;
    expect([inHall, inBand]).toEqual([expected.points, expected.wallBand]);
  }, 600_000);

  it('has a report whose zone page gives the point counts and draws the points merged into dots', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.get(`/api/surveys/${surveyId}/report.pdf`).buffer(true).parse((r, cb) => { const chunks: Buffer[] = []; r.on('data', (c: Buffer) => chunks.push(c)); r.on('end', () => cb(null, Buffer.concat(chunks))); });
    expect(res.status).toBe(200);
    const parser = new PDFParse({ data: new Uint8Array(res.body as Buffer) });
    const text = (await parser.getText()).text.replace(/\s+/g, ' ');
    await parser.destroy();
    expect(text).toContain('Assembly hall');
    expect(text).toContain(`${expected.points} used, `);
    expect(text).toContain(`${expected.wallBand} in the wall band`);
    expect(text).toMatch(/200,000 points drawn as [\d,]+ dots/);
    // The probe table counts every reading of its coefficient set.
    expect(text).toMatch(/200000/);
  }, 600_000);

  it('draws the same report from columns as from whole readings (a zone merged into dots keeps only columns)', async () => {
    const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
    const now = Date.parse('2026-11-20T12:00:00Z');
    const fromColumns = await loadReportData(t.db, survey, now);
    const fromReadings = await loadReportData(t.db, survey, now, { allPoints: true });
    expect(fromColumns.zones[0].columns?.used.count).toBe(expected.points);
    expect(fromColumns.zones[0].readings).toEqual([]);
    expect(fromReadings.zones[0].columns).toBeUndefined();
    expect(fromReadings.zones[0].readings).toHaveLength(expected.points);
    // pdfkit dates each file when it is made (and its file ID from that): the rest must be byte for byte the same.
    const undated = async (data: ReportData) => (await renderReportPdf(data, 'lx')).toString('latin1').replace(/\(D:\d{14}Z\)/g, '').replace(/\/ID \[<[0-9a-f]+> <[0-9a-f]+>\]/, '');
    const [a, b] = [await undated(fromColumns), await undated(fromReadings)];
    expect(a.length).toBeGreaterThan(10_000);
    expect(a).toBe(b);
  }, 600_000);
});
