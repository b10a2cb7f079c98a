import { describe, it, expect, beforeAll } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { buildSurvey, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';

let t: TestApp;
let surveyId: number;
beforeAll(async () => {
  t = await createTestApp();
  surveyId = buildSurvey(t, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() }).surveyId;
});

const binary = (res: unknown, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('report jobs', () => {
  it('a report job, when started, runs, ends done at progress 1, and serves the same report as the direct download', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const started = await fm.post(`/api/surveys/${surveyId}/report-jobs`).send({ unit: 'fc' });
    expect(started.status).toBe(202);
    expect(started.body).toMatchObject({ surveyId, status: 'running', size: null, error: null });
    let state = started.body as { status: string; progress: number; size: number | null; filename: string };
    while (state.status === 'running') {
      expect(state.progress).toBeGreaterThanOrEqual(0);
      expect(state.progress).toBeLessThan(1);
      await new Promise((r) => setTimeout(r, 50));
      state = (await fm.get(`/api/report-jobs/${started.body.id}`)).body;
    }
    expect(state).toMatchObject({ status: 'done', progress: 1 });
    const file = await fm.get(`/api/report-jobs/${started.body.id}/file`).buffer(true).parse(binary);
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(file.headers['content-disposition']).toContain(state.filename);
    expect((file.body as Buffer).length).toBe(state.size);
    const parser = new PDFParse({ data: new Uint8Array(file.body as Buffer) });
    const text = (await parser.getText()).text.replace(/\s+/g, ' ');
    await parser.destroy();
    expect(text).toContain('Values in foot-candles');
  });

  it('a report job id, when asked for by another organisation, answers 404; an unknown or malformed one 404 or 400', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const job = (await fm.post(`/api/surveys/${surveyId}/report-jobs`).send({})).body as { id: string };
    const other = await t.signIn(DEMO.otherAdmin);
    expect((await other.get(`/api/report-jobs/${job.id}`)).status).toBe(404);
    expect((await other.get(`/api/report-jobs/${job.id}/file`)).status).toBe(404);
    expect((await other.post(`/api/surveys/${surveyId}/report-jobs`).send({})).status).toBe(404);
    expect((await fm.get('/api/report-jobs/00000000-0000-4000-8000-000000000000')).status).toBe(404);
    const bad = await fm.get('/api/report-jobs/not-a-job');
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/jobId/);
  });
});
