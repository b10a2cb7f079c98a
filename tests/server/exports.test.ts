import { describe, it, expect, beforeAll } from 'vitest';
import Papa from 'papaparse';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { createTestProbes, newDraftSurvey, testWalkCsv, keptSamples, uploadAndWait, buildSurvey, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';
import { luxToFootcandles } from '@shared/core/units';
import { readingColumns, ZONE_COLUMNS } from '@shared/export-columns';
import type { Reading } from '@shared/schemas/readings';

let t: TestApp;
let c: TestClient;
let surveyId: number;
let api: Reading[];
beforeAll(async () => {
  t = await createTestApp();
  createTestProbes(t);
  c = await t.signIn(DEMO.surveyor);
  surveyId = await newDraftSurvey(t, c);
  // The simulated walk: auto-ranging bursts, an over-range point in sun and a 4-20 mA reference.
  const { status } = await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-19T09:00:00Z'), 3));
  expect(status.status).toBe('done');
  api = (await c.get(`/api/surveys/${surveyId}/readings?limit=5000`)).body.items;
}, 60_000);

type Row = Record<string, string>;
const parse = (text: string) => Papa.parse<Row>(text, { header: true, skipEmptyLines: true });
const num = (cell: string) => (cell === '' ? null : Number(cell));

describe('readings CSV: the API value for value at full precision', () => {
  for (const unit of ['lux', 'fc'] as const) {
    it(`every reading of the survey export in ${unit} equals the API's reading exactly (value, bound, uncertainty, raw evidence)`, async () => {
      const res = await c.get(`/api/surveys/${surveyId}/readings.csv?unit=${unit}`);
      const csv = parse(res.text);
      const u = unit === 'fc' ? 'fc' : 'lx';
      expect(csv.meta.fields).toEqual(readingColumns(u));
      expect(csv.data).toHaveLength(api.length);
      const byId = new Map(api.map((r) => [r.id, r]));
      const convert = (v: number | null) => (v === null ? null : unit === 'fc' ? luxToFootcandles(v) : v);
      for (const row of csv.data) {
        const r = byId.get(Number(row.reading_id))!;
        // Shortest round-trip text: Number() reads back the very same double.
        expect(num(row[`illuminance_${u}`])).toBe(convert(r.lux));
        expect(num(row[`expanded_uncertainty_${u}_k2`])).toBe(convert(r.uLux));
        expect(row.illuminance_bound).toBe(r.lux === null ? '' : r.luxBound);
        expect(row.timestamp_utc).toBe(r.timestamp);
        expect(num(row.gain_code)).toBe(r.gainCode);
        expect(num(row.counts)).toBe(r.rawCounts);
        expect(num(row.int_ms)).toBe(r.intMs);
        expect(num(row.temp_c)).toBe(r.tempC);
        expect(num(row.coefficient_set_id)).toBe(r.coefficientSetId);
        expect(row.flag).toBe(r.flag);
      }
    });
  }

  it('carries the raw evidence: counts for counting probes, the loop current for the 4-20 mA reference, and the coefficient set version', async () => {
    const csv = parse((await c.get(`/api/surveys/${surveyId}/readings.csv`)).text).data;
    const counting = csv.filter((r) => r.counts !== '');
    const analog = csv.filter((r) => r.current_ma !== '');
    expect(counting.length).toBeGreaterThan(100);
    expect(analog.length).toBeGreaterThan(0);
    for (const r of analog) expect(r.counts).toBe('');
    expect(csv.every((r) => r.coefficient_set_version !== '' || r.flag === 'fault')).toBe(true);
    // The counts of a chosen sample are the kept sample's own counts (the log's value).
    const kept = new Set(keptSamples(t, surveyId).map((s) => `${s.timeMs}|${s.counts}`));
    for (const r of counting.filter((x) => x.illuminance_bound === 'exact').slice(0, 50)) {
      expect(kept.has(`${Date.parse(r.timestamp_utc)}|${Number(r.counts)}`)).toBe(true);
    }
  });

  it('states the direction of a bound: an over-range reading is a lower bound in its own column', async () => {
    const csv = parse((await c.get(`/api/surveys/${surveyId}/readings.csv`)).text).data;
    const over = csv.filter((r) => r.flag === 'over_range');
    expect(over.length).toBeGreaterThan(0);
    for (const r of over) expect(r.illuminance_bound).toBe('lower');
  });

  it('the verdicts readings CSV uses the same column names, adding only the zone and the wall-band mark', async () => {
    const fm = await t.signIn(DEMO.admin);
    const res = await fm.get(`/api/surveys/${surveyId}/compliance/readings.csv?unit=lx`);
    expect(res.status).toBe(200);
    const csv = parse(res.text);
    expect(csv.meta.fields).toEqual(readingColumns('lx', true));
    expect(csv.meta.fields!.filter((f) => !readingColumns('lx').includes(f))).toEqual(['zone', 'in_wall_band']);
    const byId = new Map(api.map((r) => [r.id, r]));
    for (const row of csv.data) {
      const r = byId.get(Number(row.reading_id))!;
      expect(num(row.illuminance_lx)).toBe(r.lux);
      expect(num(row.expanded_uncertainty_lx_k2)).toBe(r.uLux);
    }
  });
});

describe('zones CSV: full precision and the direction of every bound', () => {
  it('gives Eavg, Emin, U0 and their uncertainty exactly as the API, each with its bound column', async () => {
    const readings = officeAndCorridorReadings();
    // One over-range point in the office: its Eavg becomes "at least".
    readings[3] = { ...readings[3], lux: 51_607.7, luxBound: 'lower', flag: 'over_range' };
    const { surveyId: sid } = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Zones export', zones: OFFICE_AND_CORRIDOR, readings });
    const fm = await t.signIn(DEMO.facility_manager);
    const compliance = (await fm.get(`/api/surveys/${sid}/compliance`)).body;
    const res = await fm.get(`/api/surveys/${sid}/compliance/zones.csv`);
    const csv = parse(res.text);
    expect(csv.meta.fields).toEqual([...ZONE_COLUMNS]);
    for (const z of compliance.zones) {
      const row = csv.data.find((r) => r.zone === z.name && r.check === 'task_plane')!;
      expect(num(row.eavg_lx)).toBe(z.eavg);
      expect(num(row.u_eavg_lx_k2)).toBe(z.uEavg);
      expect(num(row.emin_lx)).toBe(z.emin);
      expect(num(row.u0)).toBe(z.u0);
      expect(row.eavg_bound).toBe(z.bounds.eavg ?? (z.eavg === null ? '' : 'exact'));
      expect(row.use).not.toMatch(/_/);
    }
    const office = csv.data.find((r) => r.zone === 'Fixture office' && r.check === 'task_plane')!;
    expect(office.eavg_bound).toBe('lower');
    expect(office.u0_bound).not.toBe('exact');
  });
});

describe('export file names tell a provisional record from a signed one', () => {
  it('names a report provisional before sign-off and signed with the day after it', async () => {
    const { surveyId: sid } = buildSurvey(t, { ownerEmail: DEMO.surveyor, surveyName: 'Names', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await t.signIn(DEMO.facility_manager);
    const before = await fm.get(`/api/surveys/${sid}/report.pdf`);
    expect(before.headers['content-disposition']).toMatch(/luxtrail-report-\d+-names-provisional\.pdf/);
    expect((await fm.post(`/api/surveys/${sid}/sign-off`).send({ comment: 'Fine' })).status).toBe(200);
    const day = new Date(t.clock.now()).toISOString().slice(0, 10);
    const after = await fm.get(`/api/surveys/${sid}/report.pdf`);
    expect(after.headers['content-disposition']).toContain(`luxtrail-report-${sid}-names-signed-${day}.pdf`);
    expect((await fm.get(`/api/surveys/${sid}/compliance/zones.csv`)).headers['content-disposition']).toContain(`signed-${day}.csv`);
  });
});
