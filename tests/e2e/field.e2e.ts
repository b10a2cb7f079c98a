import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import type { APIRequestContext, Page } from 'playwright-core';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';
import { DEMO_COUNTING_PROBES } from '@server/db/demo/demo-probes';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

const PHONE = { width: 390, height: 844 };
type FieldStateJson = {
  survey: { id: number; name: string };
  zones: { id: number; planId: number; name: string }[];
  plannedPoints: { id: number; zoneId: number | null; label: string }[];
  probes: { id: number; serial: string; kind: string }[];
  records: { id: number; kind: string; point: string; idempotencyKey: string; recordedAt: string; reading: { lux: number } | null }[];
  photos: { id: number; point: string | null; zoneId: number | null }[];
};

/** The app's API from the signed-in page (same cookies and Origin as the page). */
async function apiJson<T>(request: APIRequestContext, method: 'get' | 'post', url: string, data?: unknown): Promise<T> {
  const res = method === 'get' ? await request.get(url) : await request.post(url, { data: data as object, headers: { Origin: app.baseUrl } });
  if (!res.ok()) throw new Error(`${method.toUpperCase()} ${url}: ${res.status()} ${await res.text()}`);
  return (await res.json()) as T;
}

async function surveyIdByName(page: Page, name: string): Promise<number> {
  const list = await apiJson<{ items: { id: number; name: string }[] }>(page.request, 'get', '/api/surveys?pageSize=100');
  const s = list.items.find((i) => i.name === name);
  if (!s) throw new Error(`No survey "${name}"`);
  return s.id;
}

type PlannedJson = { grids: { zoneId: number }[]; items: { id: number; zoneId: number; label: string; readingCount: number }[] };

/** A draft survey of the library with an EN 12464-1 grid on one of its smaller zones (planned points with labels). */
async function surveyWithPlannedPoints(page: Page, name: string): Promise<{ surveyId: number; zoneId: number; labels: string[] }> {
  const surveyId = await surveyIdByName(page, name);
  const state = await apiJson<FieldStateJson>(page.request, 'get', `/api/surveys/${surveyId}/field`);
  let planned = await apiJson<PlannedJson>(page.request, 'get', `/api/surveys/${surveyId}/planned-points`);
  if (planned.grids.length === 0) {
    for (const planId of new Set(state.zones.map((z) => z.planId))) planned = await apiJson<PlannedJson>(page.request, 'post', `/api/surveys/${surveyId}/planned-points/generate`, { planId });
  }
  const byZone = state.zones.map((z) => ({ zoneId: z.id, labels: planned.items.filter((p) => p.zoneId === z.id).map((p) => p.label) }))
    .filter((z) => z.labels.length >= 4).sort((a, b) => a.labels.length - b.labels.length);
  if (!byZone[0]) throw new Error(`Survey "${name}" has no zone with at least four planned points`);
  return { surveyId, ...byZone[0] };
}

describe('field view at phone size', () => {
  it('records typed readings and a photo with the network off; back online they sync exactly once and are judged in their zone', async () => {
    // Calibration staff register a hand-held meter of DIN 5032-7 class B (no log, values typed).
    const cal = await app.newPage(PHONE);
    await signInAs(cal, 'calibration@luxtrail.test');
    await apiJson(cal.request, 'post', '/api/probes', { serial: 'HM-E2E-B', kind: 'manual', description: 'Pocket meter, class B', meterClass: 'B', rangeLowLux: 0, rangeHighLux: 100_000 });

    const page = await app.newPage({ ...PHONE, serviceWorkers: 'allow' });
    await signInAs(page, 'surveyor@luxtrail.test');
    const { surveyId, zoneId, labels } = await surveyWithPlannedPoints(page, 'Winter evening check 2026');
    expect(labels.length).toBeGreaterThan(1);

    await page.goto(`/field/surveys/${surveyId}`);
    await page.getByRole('heading', { name: 'Winter evening check 2026' }).waitFor({ timeout: 60_000 });
    const progress = page.getByTestId(`progress-${zoneId}`);
    await expect.poll(() => progress.innerText(), { timeout: 30_000 }).toBe(`0 of ${labels.length}`);
    // The conditions of this visit: lights on an hour ago (past the warm-up time), night, daylight excluded.
    await page.getByLabel('Lights switched on at').fill(new Date(Date.now() - 3_600_000).toISOString().slice(0, 16));
    await page.getByRole('button', { name: 'Start the visit with these conditions' }).click();

    // Take it offline: survey, plan images and planned points go to the phone; the service worker holds the app.
    await page.getByRole('button', { name: 'Take offline' }).click();
    await page.getByTestId('offline-copy').waitFor({ timeout: 60_000 });
    await page.waitForFunction(() => navigator.serviceWorker?.controller !== null || navigator.serviceWorker?.ready.then(() => true), null, { timeout: 60_000 });
    await page.evaluate(async () => { await navigator.serviceWorker.ready; });
    await expect.poll(() => page.getByTestId('waiting-count').innerText(), { timeout: 60_000 }).toBe('Nothing waiting to sync');

    await page.context().setOffline(true);
    // A reload with the network off: the app comes from the service worker, the survey from IndexedDB.
    await page.reload();
    await page.getByRole('heading', { name: 'Winter evening check 2026' }).waitFor({ timeout: 60_000 });
    await page.getByText('Showing the copy on this phone').waitFor();

    const typed: { label: string; lux: number }[] = [{ label: labels[0], lux: 212 }, { label: labels[1], lux: 198 }];
    for (const t of typed) {
      await page.getByTestId(`point-state-${t.label}`).click();
      await page.getByRole('heading', { name: `Point ${t.label}` }).waitFor();
      await page.getByLabel('Meter').selectOption({ label: 'HM-E2E-B · class B' });
      await page.getByLabel(/^Value/).fill(String(t.lux));
      await page.getByRole('button', { name: 'Save reading' }).click();
      // Answered at once from the phone's outbox, with the network off.
      await page.getByRole('status').filter({ hasText: `Saved 1 value at ${t.label}` }).waitFor({ timeout: 10_000 });
    }
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 200, g: 180, b: 40 } } }).png().toBuffer();
    await page.locator('input[type=file][accept="image/*"]').setInputFiles({ name: 'luminaire.png', mimeType: 'image/png', buffer: png });
    await page.getByRole('status').filter({ hasText: `Photo kept for ${typed[1].label}` }).waitFor();
    await expect.poll(() => page.getByTestId('waiting-count').innerText()).toMatch(/^[34] waiting to sync$/);
    await expect.poll(() => progress.innerText()).toBe(`2 of ${labels.length}`);
    await page.screenshot({ path: path.join(screenshotDir(), 'field-offline-390.png'), fullPage: true });

    await page.context().setOffline(false);
    await expect.poll(() => page.getByTestId('waiting-count').innerText(), { timeout: 60_000 }).toBe('Nothing waiting to sync');

    // Exactly once: one record per typed point and one photo, whatever the phone resent.
    const state = await apiJson<FieldStateJson>(page.request, 'get', `/api/surveys/${surveyId}/field`);
    const typedRecords = state.records.filter((r) => r.kind === 'typed');
    expect(typedRecords.map((r) => r.point).sort()).toEqual(typed.map((t) => t.label).sort());
    expect(new Set(typedRecords.map((r) => r.idempotencyKey)).size).toBe(typedRecords.length);
    expect(typedRecords.map((r) => r.reading?.lux).sort()).toEqual(typed.map((t) => t.lux).sort());
    expect(state.photos).toHaveLength(1);
    expect(state.photos[0]).toMatchObject({ point: typed[1].label, zoneId });

    // Judged in their zone: the zone's verdict page lists both points with their values, and the photo.
    await page.goto(`/compliance/surveys/${surveyId}/zones/${zoneId}`);
    for (const t of typed) await page.getByRole('rowheader', { name: t.label, exact: true }).first().waitFor({ timeout: 60_000 });
    await page.getByRole('img', { name: new RegExp(`Photo at ${typed[1].label}`) }).waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'field-zone-photos-390.png'), fullPage: true });
  });

  it('places the bursts of a label-free log by time on the marks taken with the phone', async () => {
    const page = await app.newPage(PHONE);
    await signInAs(page, 'surveyor@luxtrail.test');
    const { surveyId, labels } = await surveyWithPlannedPoints(page, 'Winter evening check 2026');
    const probe = DEMO_COUNTING_PROBES[0];

    await page.goto(`/field/surveys/${surveyId}`);
    await page.getByRole('heading', { level: 1 }).waitFor({ timeout: 60_000 });
    const marked = labels.slice(-2);
    for (const label of marked) {
      await page.getByTestId(`point-state-${label}`).click();
      await page.getByRole('heading', { name: `Point ${label}` }).waitFor();
      await page.getByRole('tab', { name: 'Here now' }).click();
      await page.getByLabel('Logging meter (optional)').selectOption({ label: probe.serial });
      await page.getByRole('button', { name: 'Measured here now' }).click();
      await page.getByRole('status').filter({ hasText: `Marked ${label}` }).waitFor();
    }
    await expect.poll(() => page.getByTestId('waiting-count').innerText(), { timeout: 60_000 }).toBe('Nothing waiting to sync');
    const state = await apiJson<FieldStateJson>(page.request, 'get', `/api/surveys/${surveyId}/field`);
    const marks = state.records.filter((r) => r.kind === 'mark' && marked.includes(r.point));
    expect(marks).toHaveLength(2);

    // The meter's log: no labels a planned point knows, no positions; its clock runs 90 s slow.
    // The marks were taken seconds apart, so the window is set for this upload to half their gap:
    // each burst then has exactly one mark within reach (a wider window would leave both unplaced).
    const slowMs = 90_000;
    const [m0, m1] = marks.map((m) => Date.parse(m.recordedAt)).sort((a, b) => a - b);
    const windowS = Math.floor((m1 - m0) / 2 / 100) / 10;
    expect(windowS).toBeGreaterThanOrEqual(0.3);
    const bursts = [m0 + 200, m1 + 200, m0 - 15 * 60_000]; // the last: a burst no mark explains
    const csv = `timestamp,probe,point,gain,counts\n${bursts.map((t, i) => `${new Date(t - slowMs).toISOString()},${probe.serial},#${i + 1},2,16000`).join('\n')}\n`;
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'field-')), 'meter-dump.csv');
    fs.writeFileSync(file, csv);

    await page.goto(`/surveys/${surveyId}`);
    await page.getByLabel('Meter log (CSV)').setInputFiles(file);
    await page.getByLabel('Clock offset (s)').fill(String(slowMs / 1000));
    await page.getByLabel('Window (± s)').fill(String(windowS));
    await page.getByRole('button', { name: 'Upload log' }).click();
    const placed = page.getByTestId('placed-by-time');
    await placed.waitFor({ timeout: 90_000 });
    await expect.poll(() => placed.innerText()).toMatch(/2 bursts placed by time/);
    for (const label of marked) await placed.getByRole('cell', { name: label, exact: true }).waitFor();
    await placed.getByText(`No mark within ±${windowS.toFixed(1)} s of this burst`).waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'field-placed-by-time-390.png'), fullPage: true });

    // The field view now shows the two marked points measured by the log's readings.
    const after = await apiJson<PlannedJson>(page.request, 'get', `/api/surveys/${surveyId}/planned-points`);
    for (const label of marked) expect(after.items.find((p) => p.label === label)?.readingCount).toBe(1);
  });
});
