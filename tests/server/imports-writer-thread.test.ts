import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, it, expect, beforeAll, afterAll, vi } from 'vitest';
import { IMPORT_THREADS_IDLE_MS, importThreadsAlive } from '../../server/modules/imports/import-runner';
import { closeComputePools, computeQueue } from '../../server/compute/compute-pool';
import { type TestApp, type TestClient } from './helpers';
import { keptSamples, newDraftSurvey, tableCounts, testWalkCsv, TEST_SERIALS, uploadAndWait, appWithTestProbes } from './support/factories';

// A database file (not :memory:) sends the import's writes through the writer thread and its own connection.
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-writer-'));
let t: TestApp;
let c: TestClient;
beforeAll(async () => {
  ({ t, c } = await appWithTestProbes({ databaseUrl: path.join(dir, 'writer.db'), dataDir: path.join(dir, 'data') }));
}, 60_000);
afterAll(async () => {
  await closeComputePools();
  t.db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('log import with a database file (writer thread)', () => {
  it('import, of the demo walk, writes every sample and reading through the writer thread and keeps progress current', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const { status } = await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-21T09:00:00Z'), 5));
    expect(status).toMatchObject({ status: 'done', progress: 1, errors: [] });
    // Every row is kept, in file order, for a re-decode.
    const kept = keptSamples(t, surveyId);
    expect(kept).toHaveLength(status.rowsRead);
    expect(kept.map((s) => s.line)).toEqual(kept.map((_, i) => i + 2));
    const detail = (await c.get(`/api/surveys/${surveyId}`)).body;
    expect(detail.readingCount).toBe(status.readings);
    expect(detail.flagCounts.over_range).toBe(1);
  });

  it('import, of a file whose last row is bad after several written batches, leaves no sample or reading behind', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const lines = ['timestamp,probe,point,gain,counts,x_m,y_m'];
    for (let i = 0; i < 5000; i++) lines.push(`${new Date(Date.parse('2026-11-12T00:00:00Z') + i * 15_000).toISOString()},${TEST_SERIALS.tripod},W${i},2,16000,1.5,2.5`);
    lines.push(`2026-11-13T00:00:00Z,${TEST_SERIALS.tripod},LAST,2,x,1.5,2.5`);
    const before = tableCounts(t);
    const { status } = await uploadAndWait(t, c, surveyId, `${lines.join('\n')}\n`);
    expect(status.status).toBe('failed');
    expect(status.errors[0]).toMatchObject({ line: 5002, column: 'counts', value: 'x' });
    const after = tableCounts(t);
    expect({ ...after, log_imports: after.log_imports - 1, stored_files: after.stored_files - 1 }).toEqual(before);
  });

  it('import threads, once no import has run for a while, end (giving back their memory), and the next import starts them again', async () => {
    const surveyId = await newDraftSurvey(t, c);
    const first = await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-22T09:00:00Z'), 2));
    expect(first.status.status).toBe('done');
    // The parse worker and this database's writer.
    expect(importThreadsAlive()).toBe(2);
    await vi.waitFor(() => expect(importThreadsAlive()).toBe(0), { timeout: IMPORT_THREADS_IDLE_MS + 5_000, interval: 100 });
    const second = await uploadAndWait(t, c, await newDraftSurvey(t, c), testWalkCsv(Date.parse('2026-11-23T09:00:00Z'), 2));
    expect(second.status).toMatchObject({ status: 'done', errors: [] });
    expect(second.status.readings).toBe(first.status.readings);
  }, IMPORT_THREADS_IDLE_MS + 30_000);

  it('verdicts, of a survey in a database file, are judged on a compute pool thread (as the server runs them, not inline) and answer its judged zones', async () => {
    const surveyId = await newDraftSurvey(t, c);
    expect((await uploadAndWait(t, c, surveyId, testWalkCsv(Date.parse('2026-11-24T09:00:00Z'), 4))).status.status).toBe('done');
    const res = await c.get(`/api/surveys/${surveyId}/compliance`);
    expect(res.status).toBe(200);
    expect(computeQueue().threads).toBeGreaterThan(0);
    expect(res.body.zones.length).toBeGreaterThan(0);
    expect(res.body.zones.reduce((n: number, z: { points: number }) => n + z.points, 0)).toBeGreaterThan(0);
  }, 60_000);
});
