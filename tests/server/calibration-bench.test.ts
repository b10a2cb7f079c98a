import { describe, it, expect, beforeAll } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp, type TestClient } from './helpers';
import { benchRuns } from '@server/db/schema/calibration';
import { storedFiles } from '@server/db/schema/organizations';
import { storedPath } from '@server/lib/file-store';
import { benchCsv, createCountingProbe, manualDraftBody, manualGains, probeIdBySerial, TINY_PDF } from './support/factories';

let t: TestApp;
let cal: TestClient;
beforeAll(async () => {
  t = await createTestApp({ signInLimits: { perAddress: 100_000, perAccount: 100_000 } });
  cal = await t.signIn(DEMO.calibration);
});

const count = (table: typeof benchRuns | typeof storedFiles) => t.db.select({ n: sql<number>`count(*)` }).from(table).get()!.n;
/** Collects a download's body as bytes (supertest would otherwise parse it as text). */
const asBuffer: Parameters<ReturnType<TestClient['get']>['parse']>[0] = (res, cb) => {
  const chunks: Buffer[] = [];
  const stream = res as unknown as NodeJS.ReadableStream;
  stream.on('data', (d: Buffer) => chunks.push(d));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};
const uploadsLeft = () => fs.readdirSync(path.join(t.config.dataDir, 'uploads'));
const upload = (probeId: number, content: string | Buffer, fields: Record<string, string> = {}, filename = 'bench.csv') => {
  const req = cal.post(`/api/probes/${probeId}/bench-runs`).attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), filename);
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req;
};

describe('bench runs: upload and fit', () => {
  it('fits each gain code, when the file is good, recovering the coefficients it was made from and keeping the raw file', async () => {
    const p = await createCountingProbe(cal);
    const truth = manualGains(2.0);
    const csv = benchCsv(truth);
    const res = await upload(p.id, csv, { tRefMs: '100', referenceURel: '0.01', tCalC: '23' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.rowCount).toBe(20);
    expect(res.body.gains.map((g: { code: number }) => g.code)).toEqual([0, 1, 2, 3]);
    for (const g of res.body.gains) {
      const want = truth.find((x) => x.code === g.code)!;
      // The +/-3 count wobble is small against 3,000-48,000 counts: the fit lands within 0.1 % and a few counts.
      expect(Math.abs(g.luxPerCount / want.luxPerCount - 1)).toBeLessThan(1e-3);
      expect(Math.abs(g.darkCounts - want.darkCounts)).toBeLessThan(5);
      expect(g.points).toHaveLength(5);
      expect(g.points[0].fitted + g.points[0].residual).toBeCloseTo(g.points[0].counts, 9);
      expect(g.suggestedURel).toBeGreaterThanOrEqual(0.01);
    }
    expect(res.body.gains[1].ratio).toMatchObject({ neighbourCode: 0, nominal: 8, mismatch: false });
    const sha = crypto.createHash('sha256').update(csv).digest('hex');
    expect(res.body.sha256).toBe(sha);
    expect(fs.readFileSync(storedPath(t.deps, sha), 'utf8')).toBe(csv);
    const file = await cal.get(`/api/bench-runs/${res.body.id}/file`).buffer(true).parse(asBuffer);
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toMatch(/text\/csv/);
    expect((file.body as Buffer).toString('utf8')).toBe(csv);
    const detail = await cal.get(`/api/bench-runs/${res.body.id}`);
    expect(detail.body.rows[0]).toMatchObject({ line: 2, gain: 0, tempC: 23 });
    const audit = await cal.get(`/api/audit?probeId=${p.id}&entityType=bench_run`);
    expect(audit.body.items[0]).toMatchObject({ action: 'uploaded', entityId: res.body.id });
  });

  it('flags a gain ratio, when one code\'s responsivity is 5 % off nominal', async () => {
    const p = await createCountingProbe(cal);
    const gains = manualGains(2.0).map((g) => (g.code === 2 ? { ...g, luxPerCount: g.luxPerCount * 1.05 } : g));
    const res = await upload(p.id, benchCsv(gains));
    expect(res.status).toBe(201);
    const g2 = res.body.gains.find((g: { code: number }) => g.code === 2);
    expect(g2.ratio.mismatch).toBe(true);
    expect(res.body.issues.join(' ')).toMatch(/Gain code 2 vs 1/);
  });

  it('notes missing codes, when the file covers only some gain codes, and refuses a draft from it with 422', async () => {
    const p = await createCountingProbe(cal);
    const res = await upload(p.id, benchCsv(manualGains().filter((g) => g.code < 2)));
    expect(res.status).toBe(201);
    expect(res.body.issues.join(' ')).toMatch(/No bench rows for gain code\(s\) 2, 3/);
    const draft = await cal.post(`/api/probes/${p.id}/coefficient-sets`).send({ source: 'bench_run', benchRunId: res.body.id, effectiveFrom: '2026-11-20T00:00:00Z', dueDate: '2027-11-20T00:00:00Z', certificateNumber: 'B-1' });
    expect(draft.status).toBe(422);
    expect(draft.body.error.message).toMatch(/missing code\(s\) 2, 3/);
  });

  it('drafts a set from the fit, when asked with the bench run id, carrying its coefficients and reference conditions', async () => {
    const p = await createCountingProbe(cal);
    const run = await upload(p.id, benchCsv(manualGains(1.9)), { tRefMs: '100', tCalC: '22', alphaPerK: '-0.0012' });
    const res = await cal.post(`/api/probes/${p.id}/coefficient-sets`).send({ source: 'bench_run', benchRunId: run.body.id, effectiveFrom: '2026-11-20T00:00:00Z', dueDate: '2027-11-20T00:00:00Z', certificateNumber: 'B-2' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ benchRunId: run.body.id, tRefMs: 100, tCalC: 22, alphaPerK: -0.0012, status: 'draft' });
    for (const g of res.body.gains) {
      const fit = run.body.gains.find((f: { code: number }) => f.code === g.code);
      expect(g).toEqual({ code: fit.code, darkCounts: fit.darkCounts, luxPerCount: fit.luxPerCount, uRel: fit.suggestedURel, uDarkCounts: fit.uDarkCounts });
    }
  });

  it('refuses a bench run of another probe, when drafting, with 422', async () => {
    const p = await createCountingProbe(cal);
    const q = await createCountingProbe(cal);
    const run = await upload(p.id, benchCsv(manualGains()));
    const res = await cal.post(`/api/probes/${q.id}/coefficient-sets`).send({ source: 'bench_run', benchRunId: run.body.id, effectiveFrom: '2026-11-20T00:00:00Z', dueDate: '2027-11-20T00:00:00Z', certificateNumber: 'B-3' });
    expect(res.status).toBe(422);
  });

  it('fits the shipped sample bench file, when uploaded for a probe with four gain steps, without errors', async () => {
    const p = await createCountingProbe(cal);
    const csv = fs.readFileSync(path.resolve('public/samples/bench-run-sample.csv'));
    const res = await upload(p.id, csv, {}, 'bench-run-sample.csv');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.gains).toHaveLength(4);
    expect(res.body.gains.every((g: { linearity: number }) => g.linearity < res.body.linearityLimit)).toBe(true);
  });
});

describe('bench runs: bad files store nothing', () => {
  it('answers 422 with every bad row, when rows have bad values, and stores nothing', async () => {
    const p = await createCountingProbe(cal);
    const runsBefore = count(benchRuns);
    const filesBefore = count(storedFiles);
    const csv = [
      'gain,reference_lux,counts,int_ms,temp_c',
      '0,1000,550,100,23',
      '7,1000,550,100,23',
      '1,abc,550,100,23',
      '1,0,550,100,23',
      '2,100,65200,100,23',
      '2,100,3300,0,23',
      '3,10,3000,100,120',
      '3,10,,100,23',
      '1,1,2.5e3,100,23',
    ].join('\n');
    const res = await upload(p.id, csv);
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/nothing was stored/);
    expect(res.body.error.details.errorCount).toBe(7);
    expect(res.body.error.details.errors).toEqual([
      { line: 3, column: 'gain', value: '7', message: expect.stringMatching(/not one of this probe's codes \(0, 1, 2, 3\)/) },
      { line: 4, column: 'reference_lux', value: 'abc', message: expect.stringMatching(/Not a number/) },
      { line: 5, column: 'reference_lux', value: '0', message: expect.stringMatching(/above 0 lx/) },
      { line: 6, column: 'counts', value: '65200', message: expect.stringMatching(/saturation \(65000\)/) },
      { line: 7, column: 'int_ms', value: '0', message: expect.stringMatching(/above 0 ms/) },
      { line: 8, column: 'temp_c', value: '120', message: expect.stringMatching(/temperature/) },
      { line: 9, column: 'counts', value: '', message: 'Missing value' },
    ]);
    expect(count(benchRuns)).toBe(runsBefore);
    expect(count(storedFiles)).toBe(filesBefore);
    expect(uploadsLeft()).toEqual([]);
  });

  it('answers 422 naming the missing columns, when the header lacks one', async () => {
    const p = await createCountingProbe(cal);
    const res = await upload(p.id, 'gain,lux,counts,int_ms\n0,100,60,100\n');
    expect(res.status).toBe(422);
    expect(res.body.error.details.errors[0]).toMatchObject({ line: 1, column: 'reference_lux' });
  });

  it('answers 422, when a gain code has too few rows for a line fit', async () => {
    const p = await createCountingProbe(cal);
    const res = await upload(p.id, 'gain,reference_lux,counts,int_ms,temp_c\n0,100,100,100,\n0,200,150,100,\n');
    expect(res.status).toBe(422);
    expect(res.body.error.details.errors[0]).toMatchObject({ line: 2, column: 'gain', value: '0' });
    expect(res.body.error.details.errors[0].message).toMatch(/at least 3 rows/);
  });

  it('answers 415, when the file is binary, and stores nothing', async () => {
    const p = await createCountingProbe(cal);
    const before = count(storedFiles);
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f5d8f50000000049454e44ae426082', 'hex');
    const res = await upload(p.id, png, {}, 'bench.csv');
    expect(res.status).toBe(415);
    expect(count(storedFiles)).toBe(before);
    expect(uploadsLeft()).toEqual([]);
  });

  it('answers 409, when the probe is analog, because bench fits are for counting probes', async () => {
    const res = await upload(probeIdBySerial(t, 'RF-20-07'), benchCsv(manualGains()));
    expect(res.status).toBe(409);
    expect(uploadsLeft()).toEqual([]);
  });

  it('answers 400, when fit options are not numbers, and leaves no temporary file', async () => {
    const p = await createCountingProbe(cal);
    const res = await upload(p.id, benchCsv(manualGains()), { tRefMs: 'fast' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/tRefMs/);
    expect(uploadsLeft()).toEqual([]);
  });
});

describe('certificates', () => {
  async function draft() {
    const p = await createCountingProbe(cal);
    return { ...(await cal.post(`/api/probes/${p.id}/coefficient-sets`).send(manualDraftBody())).body as { id: number }, probeId: p.id };
  }

  it('attaches a PDF to a draft, when the content is a PDF, and serves it back unchanged', async () => {
    const d = await draft();
    const res = await cal.post(`/api/coefficient-sets/${d.id}/certificate`).attach('file', TINY_PDF, 'cert 2026.pdf');
    expect(res.status).toBe(200);
    expect(res.body.certificate).toMatchObject({ filename: 'cert 2026.pdf', size: TINY_PDF.length });
    const s = await t.signIn(DEMO.surveyor);
    const dl = await cal.get(`/api/coefficient-sets/${d.id}/certificate`).buffer(true).parse(asBuffer);
    expect(dl.status).toBe(200);
    expect(dl.headers['content-type']).toBe('application/pdf');
    expect(dl.headers['content-disposition']).toContain('cert_2026.pdf');
    expect((dl.body as Buffer).equals(TINY_PDF)).toBe(true);
    // A surveyor never sees drafts, nor their certificates.
    expect((await s.get(`/api/coefficient-sets/${d.id}/certificate`)).status).toBe(404);
  });

  it('refuses a text file named .pdf, when sniffed, with 415 and keeps the draft without certificate', async () => {
    const d = await draft();
    const res = await cal.post(`/api/coefficient-sets/${d.id}/certificate`).attach('file', Buffer.from('not a pdf at all'), 'cert.pdf');
    expect(res.status).toBe(415);
    const list = await cal.get(`/api/probes/${d.probeId}/coefficient-sets`);
    expect(list.body.items[0]).toMatchObject({ id: d.id, certificate: null });
    expect(uploadsLeft()).toEqual([]);
  });

  it('refuses a certificate over 10 MB, when uploaded, with 413', async () => {
    const d = await draft();
    const big = Buffer.concat([TINY_PDF, Buffer.alloc(10 * 1024 * 1024 + 1, 0x20)]);
    const res = await cal.post(`/api/coefficient-sets/${d.id}/certificate`).attach('file', big, 'big.pdf');
    expect(res.status).toBe(413);
  });

  it('answers 404, when a set has no certificate and one is asked for', async () => {
    const d = await draft();
    expect((await cal.get(`/api/coefficient-sets/${d.id}/certificate`)).status).toBe(404);
  });
});

describe('bench run storage', () => {
  it('ties each stored run to its raw file, when listed', async () => {
    const p = await createCountingProbe(cal);
    await upload(p.id, benchCsv(manualGains()));
    const list = await cal.get(`/api/probes/${p.id}/bench-runs`);
    expect(list.status).toBe(200);
    expect(list.body.items).toHaveLength(1);
    const row = t.db.select().from(benchRuns).where(eq(benchRuns.id, list.body.items[0].id)).get()!;
    const file = t.db.select().from(storedFiles).where(eq(storedFiles.id, row.fileId)).get()!;
    expect(file.sha256).toBe(list.body.items[0].sha256);
    expect(file.contentType).toBe('text/csv');
  });
});
