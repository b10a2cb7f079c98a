import fs from 'node:fs';
import path from 'node:path';
import { describe, it, expect, beforeAll } from 'vitest';
import Papa from 'papaparse';
import { and, eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { createTestProbes, newDraftSurvey, tableCounts, testWalkCsv, TEST_SERIALS, uploadAndWait, appWithTestProbes } from './support/factories';
import { logImports, surveys } from '@server/db/schema/surveys';
import { boundImportRecord, cutText, IMPORT_RECORD_LIMITS } from '@server/modules/imports/import-record';

let t: TestApp;
let c: TestClient;
beforeAll(async () => {
  ({ t, c } = await appWithTestProbes());
});

const HEADER = 'timestamp,probe,point,gain,counts,x_m,y_m';
let minute = 0;
/** A valid counting row at a fresh time (LX-4102 coefficients: 16,000 counts at gain 2 is about 500 lx). */
function row(o: Partial<Record<'timestamp' | 'probe' | 'point' | 'gain' | 'counts' | 'x_m' | 'y_m', string>> = {}) {
  minute++;
  const ts = o.timestamp ?? new Date(Date.parse('2026-11-01T08:00:00Z') + minute * 60_000).toISOString();
  return [ts, o.probe ?? TEST_SERIALS.tripod, o.point ?? `A${minute}`, o.gain ?? '2', o.counts ?? '16000', o.x_m ?? '1.5', o.y_m ?? '2.5'].join(',');
}
const file = (...lines: string[]) => `${lines.join('\n')}\n`;

/**
 * Uploads a file that must be rejected and checks that the only rows added anywhere are the
 * failed import's record (which carries the errors) and its stored file.
 */
async function expectRejected(content: string, expected: { line: number; column: string; message: RegExp }) {
  const surveyId = await newDraftSurvey(t, c);
  const before = tableCounts(t);
  const { upload, status } = await uploadAndWait(t, c, surveyId, content);
  expect(upload.status).toBe(202);
  expect(status.status).toBe('failed');
  expect(status.readings).toBe(0);
  const hit = status.errors.find((e: { line: number; column: string; message: string }) => e.line === expected.line && e.column === expected.column && expected.message.test(e.message));
  expect(hit, JSON.stringify(status.errors.slice(0, 5))).toBeDefined();
  const after = tableCounts(t);
  expect({ ...after, log_imports: after.log_imports - 1, stored_files: after.stored_files - 1 }).toEqual(before);
  const survey = t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!;
  expect(survey.activeDecodeId).toBeNull();
  const detail = await c.get(`/api/surveys/${surveyId}`);
  expect(detail.body.readingCount).toBe(0);
  return status;
}

describe('log import: accepted files', () => {
  it('decodes the demo walk, when every row is valid, into readings with one over-range point', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { upload, status } = await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-19T09:00:00Z')));
    expect(upload.status).toBe(202);
    expect(status).toMatchObject({ status: 'done', progress: 1, errors: [], warnings: [] });
    expect(status.rowsRead).toBeGreaterThan(status.readings);
    const detail = (await c.get(`/api/surveys/${surveyId}`)).body;
    expect(detail.flagCounts.over_range).toBe(1);
    expect(detail.readingCount).toBe(status.readings);
    const over = (await c.get(`/api/surveys/${surveyId}/readings?flag=over_range`)).body;
    expect(over.total).toBe(1);
    // Over range reports the lux that saturationCounts means at the lowest gain, as a lower bound (DOMAIN.md 2).
    expect(over.items[0]).toMatchObject({ point: 'EC-01', luxBound: 'lower', flag: 'over_range', gainCode: 0, chosenSample: null });
    expect(over.items[0].samples).toBeGreaterThan(1);
  });

  it('answers the readings in the documented shape, when paged, with U as k = 2 times the combined budget', async () => {
    const surveyId = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-18T09:00:00Z'), 2));
    const page = (await c.get(`/api/surveys/${surveyId}/readings?limit=5&offset=2`)).body;
    expect(page.items).toHaveLength(5);
    expect(page.total).toBeGreaterThan(100);
    const r = page.items.find((x: { flag: string }) => x.flag === 'ok');
    expect(Object.keys(r).sort()).toEqual(['azimuthDeg', 'budget', 'chosenSample', 'coefficientSetId', 'flag', 'gainCode', 'id', 'intMs', 'lux', 'luxBound', 'plane', 'planId', 'point', 'probe', 'rawCounts', 'rawSignal', 'role', 'samples', 'tempC', 'timestamp', 'uLux', 'xM', 'yM'].sort());
    expect(r).toMatchObject({ plane: 'horizontal', azimuthDeg: null });
    const uc = Math.sqrt(r.budget.reduce((s: number, p: { uRel: number }) => s + p.uRel ** 2, 0));
    expect(r.uLux).toBeCloseTo(2 * uc * r.lux, 6); // GUM: U = k u_c, k = 2
    const sorted = (await c.get(`/api/surveys/${surveyId}/readings?sort=lux&order=desc&limit=3&flag=ok`)).body.items;
    expect(sorted[0].lux).toBeGreaterThanOrEqual(sorted[1].lux);
    const carPark = (await c.get(`/api/surveys/${surveyId}/readings?point=cp-&limit=1000`)).body;
    expect(carPark.total).toBeGreaterThan(0);
    expect(carPark.items.every((x: { point: string }) => x.point.startsWith('CP-'))).toBe(true);
    const ref = (await c.get(`/api/surveys/${surveyId}/readings?point=ROOF&limit=1`)).body.items[0];
    expect(ref).toMatchObject({ role: 'reference', probe: TEST_SERIALS.reference, gainCode: null, samples: 1 });
  });

  it('decodes a 500 lx sample, when given by hand, to the value of the decoding model', async () => {
    const surveyId = await newDraftSurvey(t, c);
    // LX-4102 gain 2: dark 61, luxPerCount 2/64 * 0.997 (demo-probes.ts); no temperature, t = tRef.
    const { status } = await uploadAndWait(t, c, surveyId, file(HEADER, row({ counts: '16061', point: 'HAND-1' })));
    expect(status.status).toBe('done');
    const r = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items[0];
    expect(r.lux).toBeCloseTo(16000 * (2 / 64) * 0.997, 6);
    expect(r.budget.map((p: { name: string }) => p.name)).toContain('temperature');
  });

  it('reads a time without offset in the site time zone (Europe/London, summer time)', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, file(HEADER, row({ timestamp: '2026-07-01T09:00:00', point: 'TZ-1' })));
    expect(status.status).toBe('done');
    const r = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items[0];
    expect(r.timestamp).toBe('2026-07-01T08:00:00.000Z'); // BST = UTC+1
  });

  it('accepts semicolons with decimal commas, a BOM and CRLF, decoding as the comma file does', async () => {
    const a = await newDraftSurvey(t, c);
    const b = await newDraftSurvey(t, c);
    const comma = 'timestamp,probe,point,gain,counts,x_m,y_m,temp_c\n2026-11-19T07:00:00Z,T-4102,S-1,2,15000,1.25,2.5,24.5\n';
    const semi = '\uFEFFTimestamp;PROBE;Point;Gain;Counts;X_M;Y_M;Temp_C\r\n2026-11-19T07:00:00Z;T-4102;"S-1";2;15000;1,25;2,5;24,5\r\n';
    expect((await uploadAndWait(t, c, a, comma)).status.status).toBe('done');
    const s = await uploadAndWait(t, c, b, semi);
    expect(s.status).toMatchObject({ status: 'done', errors: [] });
    const ra = (await c.get(`/api/surveys/${a}/readings`)).body.items[0];
    const rb = (await c.get(`/api/surveys/${b}/readings`)).body.items[0];
    expect(rb).toMatchObject({ point: 'S-1', xM: 1.25, yM: 2.5 });
    expect(rb.lux).toBe(ra.lux);
  });

  it('keeps an unknown column as a warning, not an error', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, `${HEADER},operator\n${row()},Wren\n`);
    expect(status.status).toBe('done');
    expect(status.warnings).toEqual([expect.objectContaining({ line: 1, column: 'operator' })]);
  });

  it('stores a loop current outside NE 43, when the file is otherwise valid, as a fault reading without a value', async () => {
    const surveyId = await newDraftSurvey(t, c);
    // NE 43: at or below 3.6 mA the transmitter signals a failure (secondary sources, DOMAIN.md 2).
    const csv = file('timestamp,probe,point,ma,role', `2026-11-19T06:00:00Z,${TEST_SERIALS.reference},ROOF,3.2,reference`, `2026-11-19T06:01:00Z,${TEST_SERIALS.reference},ROOF,12,reference`);
    const { status } = await uploadAndWait(t, c, surveyId, csv);
    expect(status.status).toBe('done');
    const items = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items;
    expect(items[0]).toMatchObject({ flag: 'fault', lux: null, uLux: null });
    expect(items[1].flag).toBe('ok');
    expect(items[1].lux).toBeGreaterThan(1);
  });

  it('flags readings of a probe past its due date as calibration lapsed and counts them on the survey', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, file(HEADER, row({ probe: TEST_SERIALS.lapsed }), row({ probe: TEST_SERIALS.lapsed }), row()));
    expect(status.status).toBe('done');
    const detail = (await c.get(`/api/surveys/${surveyId}`)).body;
    expect(detail.calibrationLapsedCount).toBe(2);
    expect(detail.flagCounts.calibration_lapsed).toBe(2);
  });

  it('stores a label starting with = as text and exports it neutralised', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, file(HEADER, row({ point: '=HYPERLINK("http://x.invalid")' }).replace('=HYPERLINK("http://x.invalid")', '"=HYPERLINK(""http://x.invalid"")"')));
    expect(status.status).toBe('done');
    const r = (await c.get(`/api/surveys/${surveyId}/readings`)).body.items[0];
    expect(r.point).toBe('=HYPERLINK("http://x.invalid")');
    const csv = await c.get(`/api/surveys/${surveyId}/readings.csv?unit=fc`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const [head, line] = csv.text.trim().split('\r\n');
    expect(head).toContain('illuminance_fc');
    // OWASP CSV injection: a leading apostrophe makes the cell text.
    expect(line).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);
    const fc = Number(Papa.parse<Record<string, string>>(csv.text, { header: true }).data[0].illuminance_fc);
    expect(fc).toBeCloseTo(r.lux / 10.7639104167, 1); // 1 fc = 1/0.3048^2 lx (exact)
  });
});

describe('log import: readings on other planes (plane, azimuth_deg)', () => {
  it('four vertical readings at one point within seconds, when imported, stay four readings with their azimuths; wall and ceiling rows keep their plane', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const at = (s: number) => new Date(Date.parse('2026-11-02T08:00:00Z') + s * 1000).toISOString();
    const lines = [0, 90, 180, 270].map((az, i) => `${at(i * 3)},${TEST_SERIALS.tripod},CYL-1,2,16000,1.5,2.5,vertical,${az}`);
    lines.push(`${at(20)},${TEST_SERIALS.tripod},W-1,2,8000,0.1,2.5,wall,90`, `${at(30)},${TEST_SERIALS.tripod},C-1,2,6000,1.5,2.5,CEILING,`, `${at(40)},${TEST_SERIALS.tripod},H-1,2,16000,1.5,2.5,,`);
    const { status } = await uploadAndWait(t, c, surveyId, file('timestamp,probe,point,gain,counts,x_m,y_m,plane,azimuth_deg', ...lines));
    expect(status).toMatchObject({ status: 'done', errors: [], warnings: [] });
    const items = (await c.get(`/api/surveys/${surveyId}/readings?sort=time&limit=100`)).body.items as { point: string; plane: string; azimuthDeg: number | null }[];
    expect(items.map((r) => [r.point, r.plane, r.azimuthDeg])).toEqual([
      ['CYL-1', 'vertical', 0], ['CYL-1', 'vertical', 90], ['CYL-1', 'vertical', 180], ['CYL-1', 'vertical', 270], ['W-1', 'wall', 90], ['C-1', 'ceiling', null], ['H-1', 'horizontal', null],
    ]);
    const csv = (await c.get(`/api/surveys/${surveyId}/readings.csv`)).text.trim().split('\r\n');
    expect(csv[0].endsWith(',plane,azimuth_deg')).toBe(true);
    expect(csv[2].endsWith(',vertical,90')).toBe(true);
  });

  it('rejects a vertical reading without azimuth_deg, an unknown plane and an azimuth on a ceiling, naming line and column', async () => {
    const head = 'timestamp,probe,point,gain,counts,x_m,y_m,plane,azimuth_deg';
    await expectRejected(file(head, `${row()},vertical,`), { line: 2, column: 'azimuth_deg', message: /vertical reading needs azimuth_deg/ });
    await expectRejected(file(head, `${row()},floor,`), { line: 2, column: 'plane', message: /plane must be one of horizontal, vertical, wall, ceiling/ });
    await expectRejected(file(head, `${row()},ceiling,45`), { line: 2, column: 'azimuth_deg', message: /not to a ceiling one/ });
    await expectRejected(file(head, `${row()},vertical,360`), { line: 2, column: 'azimuth_deg', message: /0 up to \(not including\) 360/ });
  });
});

describe('log import: rejected files leave nothing behind', () => {
  it('rejects an empty file', () => expectRejected('', { line: 1, column: '', message: /empty/ }));
  it('rejects a header with no samples', () => expectRejected(`${HEADER}\n`, { line: 2, column: '', message: /no samples/ }));
  it('rejects a missing required column, naming it', () => expectRejected(file('timestamp,probe,gain,counts', '2026-11-19T06:00:00Z,T-4102,2,16000'), { line: 1, column: 'point', message: /no "point" column/ }));
  it('rejects non-numeric counts', () => expectRejected(file(HEADER, row(), row({ counts: 'lots' })), { line: 3, column: 'counts', message: /not a number/ }));
  it('rejects negative counts', () => expectRejected(file(HEADER, row({ counts: '-5' })), { line: 2, column: 'counts', message: /outside 0\.\.65535/ }));
  it('rejects fractional counts', () => expectRejected(file(HEADER, row({ counts: '1200.5' })), { line: 2, column: 'counts', message: /whole number/ }));
  it('rejects counts over full scale', () => expectRejected(file(HEADER, row({ counts: '70000' })), { line: 2, column: 'counts', message: /outside 0\.\.65535/ }));
  it('rejects an unknown gain code', () => expectRejected(file(HEADER, row({ gain: '7' })), { line: 2, column: 'gain', message: /Gain code 7 is not known/ }));
  it('rejects an unknown probe', () => expectRejected(file(HEADER, row(), row({ probe: 'ZZ-999' })), { line: 3, column: 'probe', message: /ZZ-999 is not registered/ }));
  it('rejects a probe with no approved coefficient set', () => expectRejected(file(HEADER, row({ probe: TEST_SERIALS.undecoded })), { line: 2, column: 'timestamp', message: /no approved coefficient set in force/ }));
  it('rejects a sample before the first approved set took effect', () => expectRejected(file(HEADER, row({ timestamp: '2020-01-01T09:00:00Z' })), { line: 2, column: 'timestamp', message: /no approved coefficient set in force at 2020-01-01/ }));
  it('rejects a malformed timestamp', () => expectRejected(file(HEADER, row({ timestamp: '19/11/2026 09:00' })), { line: 2, column: 'timestamp', message: /not an ISO 8601 time/ }));
  it('rejects x_m without y_m', () => expectRejected(file(HEADER, row({ y_m: '' })), { line: 2, column: 'y_m', message: /give both plan coordinates/ }));
  it('rejects a counting row for an analog probe', () => expectRejected(file(HEADER, row({ probe: TEST_SERIALS.reference })), { line: 2, column: 'ma', message: /4-20 mA probe: the row needs a ma value/ }));
  it('rejects an analog row for a counting probe', () => expectRejected(file('timestamp,probe,point,ma', `2026-11-19T06:00:00Z,${TEST_SERIALS.tripod},P,12`), { line: 2, column: 'gain', message: /counting probe: the row needs gain and counts/ }));
  it('rejects a file whose last row is bad, after earlier batches were written', async () => {
    const lines = [HEADER];
    for (let i = 0; i < 20_000; i++) lines.push(row({ timestamp: new Date(Date.parse('2026-11-10T00:00:00Z') + i * 15_000).toISOString(), point: `B${i}` }));
    lines.push(row({ counts: 'x' }));
    await expectRejected(file(...lines), { line: 20_002, column: 'counts', message: /not a number/ });
  });
  it('lists at most 200 errors and says how many more there were', async () => {
    const lines = [HEADER];
    for (let i = 0; i < 250; i++) lines.push(row({ counts: 'bad' }));
    const status = await expectRejected(file(...lines), { line: 2, column: 'counts', message: /not a number/ });
    expect(status.errors, JSON.stringify(status.errors.slice(0, 3))).toHaveLength(201);
    expect(status.errors[200].message).toMatch(/50 more problems/);
  });
});

describe('log import: files in other encodings than UTF-8', () => {
  // A spreadsheet on Western European Windows saves "CSV" as Windows-1252 ("ANSI") with
  // semicolons and decimal commas, and "Unicode text" as UTF-16 little-endian with a mark and
  // tabs (common practice, from memory). Bytes here from the Unicode Consortium's cp1252.txt: ü 0xFC, € 0x80.
  const rows = (sep: string, decimal: string) => [
    ['timestamp', 'probe', 'point', 'gain', 'counts', 'x_m', 'y_m', 'note'],
    ['2026-11-01T08:00:00Z', TEST_SERIALS.tripod, 'Büro 1', '2', '16000', `1${decimal}5`, `2${decimal}5`, 'Lüfter laut'],
    ['2026-11-01T08:01:00Z', TEST_SERIALS.tripod, 'Büro 2', '2', '15000', `3${decimal}5`, `2${decimal}5`, 'Lampe 5 € ersetzt'],
  ].map((r) => r.join(sep)).join('\r\n') + '\r\n';
  const cp1252 = (text: string) => Buffer.from([...text].map((ch) => ({ 'ü': 0xfc, '€': 0x80 } as Record<string, number>)[ch] ?? ch.charCodeAt(0)));
  const readingsOf = async (surveyId: number) => ((await c.get(`/api/surveys/${surveyId}/readings?sort=time&limit=10`)).body.items as { point: string; xM: number; lux: number }[]);

  it('a Windows-1252 file with semicolons, when uploaded, is read with its letters intact and a warning saying how it was read', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { upload, status } = await uploadAndWait(t, c, surveyId, cp1252(rows(';', ',')));
    expect(upload.status).toBe(202);
    expect(status).toMatchObject({ status: 'done', readings: 2, errors: [] });
    expect(status.warnings).toEqual([expect.objectContaining({ line: null, message: expect.stringMatching(/not UTF-8: it was read as Windows-1252 .*save the log as "CSV UTF-8"/) })]);
    const items = await readingsOf(surveyId);
    expect(items.map((r) => [r.point, r.xM])).toEqual([['Büro 1', 1.5], ['Büro 2', 3.5]]);
    const utf8 = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, utf8, rows(';', ','));
    expect((await readingsOf(utf8)).map((r) => r.lux)).toEqual(items.map((r) => r.lux));
  });

  it('a UTF-16 tab-separated file with a byte-order mark, when uploaded, gives the same readings as its UTF-8 twin and no warning', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { upload, status } = await uploadAndWait(t, c, surveyId, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(rows('\t', '.'), 'utf16le')]), 'walk.txt');
    expect(upload.status, JSON.stringify(upload.body)).toBe(202);
    expect(status).toMatchObject({ status: 'done', readings: 2, errors: [], warnings: [] });
    const utf8 = await newDraftSurvey(t, c);
    await uploadAndWait(t, c, utf8, rows('\t', '.'));
    expect(await readingsOf(surveyId)).toEqual((await readingsOf(utf8)).map((r) => expect.objectContaining({ point: r.point, xM: r.xM, lux: r.lux })));
  });
});

describe('log upload: refused before import', () => {
  const expectNothingAdded = async (send: () => Promise<{ status: number; body: { error: { message: string; details?: unknown } } }>, statusCode: number) => {
    const before = tableCounts(t);
    const res = await send();
    expect(res.status).toBe(statusCode);
    expect(tableCounts(t)).toEqual(before);
    return res;
  };

  it('answers 415 to a binary file', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a3e0c1a40000000049454e44ae426082', 'hex');
    const res = await expectNothingAdded(() => c.post(`/api/surveys/${surveyId}/logs`).attach('file', png, { filename: 'walk.csv', contentType: 'text/csv' }), 415);
    expect(res.body.error.message).toMatch(/not a text CSV/);
  });

  it('answers 415 to a spreadsheet workbook (Office Open XML or the older compound file), saying to save the sheet as CSV', async () => {
    // The parts of an .xlsx that identify it (ECMA-376 Part 2, Open Packaging Conventions): a
    // [Content_Types].xml naming the workbook part's type, in a zip with stored entries (PKWARE APPNOTE 4.3.7).
    const storedZip = (entries: [string, string][]) => Buffer.concat(entries.flatMap(([name, text]) => {
      const data = Buffer.from(text);
      const header = Buffer.alloc(30);
      header.writeUInt32LE(0x04034b50, 0);
      header.writeUInt16LE(20, 4);
      header.writeUInt32LE(data.length, 18);
      header.writeUInt32LE(data.length, 22);
      header.writeUInt16LE(Buffer.byteLength(name), 26);
      return [header, Buffer.from(name), data];
    }));
    const xlsx = storedZip([
      ['[Content_Types].xml', '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/></Types>'],
      ['xl/workbook.xml', '<workbook/>'],
    ]);
    // A compound file (the .xls container) starts D0 CF 11 E0 A1 B1 1A E1.
    const xls = Buffer.concat([Buffer.from('d0cf11e0a1b11ae1', 'hex'), Buffer.alloc(1016)]);
    for (const [content, filename] of [[xlsx, 'walk.xlsx'], [xls, 'walk.xls']] as const) {
      const surveyId = await newDraftSurvey(t, c);
      const res = await expectNothingAdded(() => c.post(`/api/surveys/${surveyId}/logs`).attach('file', content, { filename, contentType: 'text/csv' }), 415);
      expect(res.body.error.message).toMatch(/spreadsheet workbook, not a CSV file: save the sheet as "CSV UTF-8"/);
    }
  });

  it('answers 413 to a file over the upload limit', { timeout: 30_000 }, async () => {
    const small = await createTestApp({ uploadLimitBytes: 1024 });
    createTestProbes(small);
    const sc = await small.signIn(DEMO.surveyor);
    const surveyId = await newDraftSurvey(small, sc);
    const before = tableCounts(small);
    const res = await sc.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.from(file(HEADER, ...Array.from({ length: 100 }, () => row()))), { filename: 'big.csv', contentType: 'text/csv' });
    expect(res.status).toBe(413);
    expect(tableCounts(small)).toEqual(before);
  });

  it('answers 409 to the same bytes uploaded to the same survey again, naming the earlier import', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const csv = file(HEADER, row());
    const first = await uploadAndWait(t, c, surveyId, csv);
    expect(first.status.status, JSON.stringify(first.status.errors)).toBe('done');
    const res = await expectNothingAdded(() => c.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.from(csv), { filename: 'again.csv', contentType: 'text/csv' }), 409);
    expect(res.body.error.message).toContain(`import ${first.upload.body.importId}`);
    expect(res.body.error.details).toEqual({ importId: first.upload.body.importId });
  });

  it('answers 409 to an upload to a signed-off survey', async () => {
    const surveyId = await newDraftSurvey(t, c);
    t.db.update(surveys).set({ status: 'signed_off' }).where(eq(surveys.id, surveyId)).run();
    const res = await expectNothingAdded(() => c.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.from(file(HEADER, row())), { filename: 'late.csv', contentType: 'text/csv' }), 409);
    expect(res.body.error.message).toMatch(/signed off/);
  });

  it('answers 404 to another organisation uploading to, or reading, this organisation\'s survey', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { upload } = await uploadAndWait(t, c, surveyId, file(HEADER, row()));
    const other = await t.signIn(DEMO.otherAdmin);
    await expectNothingAdded(() => other.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.from(file(HEADER, row())), { filename: 'x.csv', contentType: 'text/csv' }), 404);
    expect((await other.get(`/api/surveys/${surveyId}/readings`)).status).toBe(404);
    expect((await other.get(`/api/surveys/${surveyId}/readings.csv`)).status).toBe(404);
    expect((await other.get(`/api/imports/${upload.body.importId}`)).status).toBe(404);
  });

  it('keeps the failed import visible with its errors, and accepts the same bytes again after the cause is fixed', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const csv = file(HEADER, row({ probe: 'NEW-PROBE' }));
    const first = await uploadAndWait(t, c, surveyId, csv);
    expect(first.status.status).toBe('failed');
    const again = await c.post(`/api/surveys/${surveyId}/logs`).attach('file', Buffer.from(csv), { filename: 'x.csv', contentType: 'text/csv' });
    expect(again.status).toBe(202);
    const imp = t.db.select().from(logImports).where(and(eq(logImports.surveyId, surveyId), eq(logImports.status, 'failed'))).all();
    expect(imp.length).toBeGreaterThanOrEqual(1);
  });
});

describe('sample logs in public/samples', () => {
  const read = (name: string) => fs.readFileSync(path.resolve(__dirname, '../../public/samples', name));
  it('imports the sample walk and its semicolon twin with the demo probes, and rejects the broken one line by line', async () => {
    const walk = await uploadAndWait(t, c, await newDraftSurvey(t, c), read('library-walk.csv'));
    expect(walk.status).toMatchObject({ status: 'done', errors: [] });
    const semi = await uploadAndWait(t, c, await newDraftSurvey(t, c), read('library-walk-semicolon.csv'));
    expect(semi.status).toMatchObject({ status: 'done', errors: [] });
    const broken = await uploadAndWait(t, c, await newDraftSurvey(t, c), read('broken-log.csv'));
    expect(broken.status.status).toBe('failed');
    expect(broken.status.errors.map((e: { line: number; column: string }) => [e.line, e.column])).toEqual([[3, 'counts'], [4, 'timestamp'], [5, 'probe'], [6, 'gain'], [7, 'y_m'], [8, 'plan']]);
  });
});

const storedBytes = (importId: number) => {
  const row = t.db.select().from(logImports).where(eq(logImports.id, importId)).get()!;
  return Buffer.byteLength(JSON.stringify({ errors: row.errors, warnings: row.warnings }), 'utf8');
};

describe('an import\'s record stays bounded', () => {
  it('a 5 MB file of one line, when imported, is refused with a record under 256 KB whose values and messages are cut', async () => {
    const surveyId = await newDraftSurvey(t, c);
    // One header line of 5 MB: a made-up column name of 5 million characters and no samples.
    const content = `timestamp,probe,point,${'x'.repeat(5 * 1024 * 1024)}\n`;
    const { status, upload } = await uploadAndWait(t, c, surveyId, content);
    expect(upload.status).toBe(202);
    expect(status.status).toBe('failed');
    expect(storedBytes(upload.body.importId)).toBeLessThan(IMPORT_RECORD_LIMITS.recordBytes);
    for (const w of status.warnings) {
      expect(w.message.length).toBeLessThanOrEqual(IMPORT_RECORD_LIMITS.messageChars);
      expect((w.column ?? '').length).toBeLessThanOrEqual(IMPORT_RECORD_LIMITS.columnChars);
    }
    expect(status.warnings[0].message).toMatch(/^Unknown column "xxx.*…$/);
    const answer = await c.get(`/api/imports/${upload.body.importId}`);
    expect(Buffer.byteLength(answer.text)).toBeLessThan(IMPORT_RECORD_LIMITS.recordBytes + 1024);
  });

  it('a file with 300 unknown columns, when imported, keeps 200 warnings and says 100 more were found', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const extra = Array.from({ length: 300 }, (_, i) => `extra_${i}`);
    const content = `timestamp,probe,point,gain,counts,${extra.join(',')}\n2026-11-01T08:00:00Z,${TEST_SERIALS.tripod},A1,2,16000,${extra.map(() => '').join(',')}\n`;
    const { status } = await uploadAndWait(t, c, surveyId, content);
    expect(status.status).toBe('done');
    expect(status.warnings).toHaveLength(IMPORT_RECORD_LIMITS.warnings + 1);
    expect(status.warnings.at(-1).message).toBe('100 more warnings were found and not listed');
  });

  it('errors whose text JSON escapes to six bytes a character, when stored, are dropped from the end until the record fits, and counted', () => {
    const nasty = '\u0001'.repeat(1000);
    const errors = Array.from({ length: 200 }, (_, i) => ({ line: i + 2, column: nasty, value: nasty, message: nasty }));
    const warnings = Array.from({ length: 200 }, (_, i) => ({ line: i + 2, column: nasty, message: nasty }));
    const record = boundImportRecord({ errors, errorCount: 5000, warnings });
    expect(Buffer.byteLength(JSON.stringify(record))).toBeLessThanOrEqual(IMPORT_RECORD_LIMITS.recordBytes);
    const listedErrors = record.errors.length - 1;
    expect(listedErrors).toBeGreaterThan(0);
    expect(record.errors.at(-1)!.message).toBe(`${5000 - listedErrors} more problems were found and not listed`);
    expect(record.errors[0].value.length).toBe(IMPORT_RECORD_LIMITS.valueChars);
  });

  it('cutText never splits a character made of two UTF-16 units', () => {
    expect(cutText('ab💡cd', 4)).toBe('ab…');
    expect(cutText('abc', 3)).toBe('abc');
    expect(cutText('abcdef', 4)).toBe('abc…');
  });
});
