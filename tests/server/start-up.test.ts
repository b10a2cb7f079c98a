import { describe, it, expect } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO } from './helpers';
import { buildSurvey, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';
import { decodes, logImports, readings, surveys } from '@server/db/schema/surveys';
import { prepareStart } from '@server/start-up';
import { UPLOADS_DIR } from '@server/http/upload';

describe('start-up settles what the previous process left', () => {
  it('an import left running, before the server listens, is failed with its readings removed and answers failed', async () => {
    const t = await createTestApp();
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const imp = t.db.select().from(logImports).where(eq(logImports.surveyId, surveyId)).get()!;
    // As a killed process leaves it: the import running, its readings written but not yet accepted.
    t.db.update(logImports).set({ status: 'running', progress: 0.4 }).where(eq(logImports.id, imp.id)).run();
    expect(t.db.select().from(readings).where(eq(readings.importId, imp.id)).all().length).toBeGreaterThan(0);

    const settled = await prepareStart(t.deps);
    expect(settled.importsFailed).toBe(1);
    expect(t.db.select().from(readings).where(eq(readings.importId, imp.id)).all()).toEqual([]);
    expect(t.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.activeDecodeId).toBeNull();
    expect(t.db.select().from(decodes).where(eq(decodes.surveyId, surveyId)).all()).toEqual([]);
    const status = await (await t.signIn(DEMO.surveyor)).get(`/api/imports/${imp.id}`);
    expect(status.body).toMatchObject({ status: 'failed', readings: 0 });
    expect(status.body.errors[0].message).toMatch(/server restarted during this import/);
  });

  it('temporary uploads of requests that never finished are removed; kept files are not', async () => {
    const t = await createTestApp({}, { seed: false });
    const uploads = path.join(t.config.dataDir, UPLOADS_DIR);
    fs.mkdirSync(uploads, { recursive: true });
    fs.writeFileSync(path.join(uploads, '3f1c9a0b7e'), 'half an upload');
    fs.writeFileSync(path.join(uploads, 'a77d02c4e1'), 'another');
    const kept = path.join(t.config.dataDir, 'files', 'ab', 'ab'.padEnd(64, '0'));
    fs.mkdirSync(path.dirname(kept), { recursive: true });
    fs.writeFileSync(kept, 'a kept file');
    const settled = await prepareStart(t.deps);
    expect(settled.uploadsRemoved).toBe(2);
    expect(fs.readdirSync(uploads)).toEqual([]);
    expect(fs.readFileSync(kept, 'utf8')).toBe('a kept file');
  });

  it('the server waits for this before it listens', () => {
    // server/index.ts: prepareStart is awaited before app.listen.
    const index = fs.readFileSync('server/index.ts', 'utf8');
    expect(index.indexOf('await prepareStart(deps)')).toBeGreaterThan(-1);
    expect(index.indexOf('await prepareStart(deps)')).toBeLessThan(index.indexOf('app.listen('));
  });
});
