import { describe, it, expect, beforeAll } from 'vitest';
import fs from 'node:fs';
import path from 'node:path';
import { createTestApp, DEMO, type TestApp } from './helpers';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

describe('audit trail', () => {
  it('shows calibration staff the coefficients of a seeded approval, before and after', async () => {
    const cal = await t.signIn(DEMO.calibration);
    const res = await cal.get('/api/audit?entityType=coefficient_set');
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    expect(JSON.stringify(res.body.items)).toMatch(/luxPerCount/);
  });

  it('withholds coefficient values from facility managers, who still see that an event happened', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const res = await fm.get('/api/audit?entityType=coefficient_set');
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    const text = JSON.stringify(res.body.items);
    expect(text).not.toMatch(/luxPerCount|darkCounts/);
    expect(res.body.items[0].after.withheld).toMatch(/calibration staff only/);
  });

  it('offers no route that changes or deletes an audit event (append-only through the API)', () => {
    const auditRoutes = t.routes.filter((r) => r.path.startsWith('/audit'));
    expect(auditRoutes.map((r) => r.method)).toEqual(['GET']);
  });
});

describe('temporary uploads', () => {
  it('removes the temporary file when a multipart request is refused by validation', async () => {
    const uploads = path.join(t.config.dataDir, 'uploads');
    const before = fs.existsSync(uploads) ? fs.readdirSync(uploads).length : 0;
    const surveyor = await t.signIn(DEMO.surveyor);
    const sites = await surveyor.get('/api/sites');
    // A plan upload with an invalid width: refused after multer has written the file to disk.
    const res = await surveyor.post(`/api/sites/${sites.body.items[0].id}/plans`)
      .attach('file', Buffer.from('not really an image'), { filename: 'plan.png', contentType: 'image/png' })
      .field('name', 'Broken').field('widthM', '-5');
    expect(res.status).toBeGreaterThanOrEqual(400);
    await new Promise((r) => setTimeout(r, 50));
    const after = fs.existsSync(uploads) ? fs.readdirSync(uploads).length : 0;
    expect(after).toBe(before);
  });
});
