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
  records: { id: number; kind: string; point: string; zoneId: number | null; note: string | null; idempotencyKey: string; recordedAt: string; reading: { lux: number } | null }[];
  photos: { id: number; point: string | null; zoneId: number | null; note: string | null }[];
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
    const zoneName = (await apiJson<FieldStateJson>(page.request, 'get', `/api/surveys/${surveyId}/field`)).zones.find((z) => z.id === zoneId)!.name;

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
    await page.getByLabel('Photo', { exact: true }).setInputFiles({ name: 'luminaire.png', mimeType: 'image/png', buffer: png });
    await page.getByRole('status').filter({ hasText: `Photo kept for ${typed[1].label}` }).waitFor();
    // A note and a photo on the whole zone (the selected point's zone is the current one), also offline.
    await expect.poll(() => page.getByLabel('Zone', { exact: true }).locator('option:checked').innerText()).toBe(zoneName);
    await page.getByLabel(/^Note on the zone/).fill('Two downlights by the door are out');
    await page.getByRole('button', { name: 'Save zone note' }).click();
    await page.getByRole('status').filter({ hasText: `Note kept for ${zoneName}` }).waitFor({ timeout: 10_000 });
    await page.getByLabel(/^Note on the zone/).fill('Door side of the zone');
    await page.getByLabel('Zone photo').setInputFiles({ name: 'door.png', mimeType: 'image/png', buffer: png });
    await page.getByRole('status').filter({ hasText: `Photo kept for ${zoneName}` }).waitFor({ timeout: 10_000 });
    await expect.poll(() => page.getByTestId('zone-items').getByText('Waiting to sync').count()).toBe(2);
    await expect.poll(() => page.getByTestId('waiting-count').innerText()).toMatch(/^[56] waiting to sync$/);
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
    expect(state.photos).toHaveLength(2);
    expect(state.photos.find((p) => p.point !== null)).toMatchObject({ point: typed[1].label, zoneId });
    expect(state.photos.find((p) => p.point === null)).toMatchObject({ zoneId, note: 'Door side of the zone' });
    const zoneNotes = state.records.filter((r) => r.kind === 'zone_note');
    expect(zoneNotes).toHaveLength(1);
    expect(zoneNotes[0]).toMatchObject({ zoneId, note: 'Two downlights by the door are out' });

    // Judged in their zone: the zone's verdict page lists both points with their values, and the photo.
    await page.goto(`/compliance/surveys/${surveyId}/zones/${zoneId}`);
    for (const t of typed) await page.getByRole('rowheader', { name: t.label, exact: true }).first().waitFor({ timeout: 60_000 });
    await page.getByRole('img', { name: new RegExp(`Photo at ${typed[1].label}`) }).waitFor();
    await page.getByRole('img', { name: `Photo at ${zoneName}: Door side of the zone` }).waitFor();
    await page.getByRole('list', { name: 'Notes on the zone' }).getByText('Two downlights by the door are out').waitFor();
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

  it('fits 360 px phones and 820 px tablets: no sideways scroll, main controls on screen and at least 44 px tall', async () => {
    for (const width of [360, 820]) {
      const viewport = { width, height: width < 600 ? 780 : 1180 };
      const page = await app.newPage(viewport);
      await signInAs(page, 'surveyor@luxtrail.test');
      const { surveyId, labels } = await surveyWithPlannedPoints(page, 'Winter evening check 2026');
      await page.goto(`/field/surveys/${surveyId}`);
      await page.getByRole('heading', { level: 1 }).waitFor({ timeout: 60_000 });
      await page.getByTestId(`point-state-${labels[0]}`).waitFor({ timeout: 30_000 });

      const checkLayout = async (what: string) => {
        const widths = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
        expect(widths.scroll, `${what} at ${width} px scrolls sideways`).toBeLessThanOrEqual(widths.client);
      };
      /** On screen horizontally (after scrolling into view) and at least 44 px tall (WCAG 2.5.5 target size). */
      const checkControl = async (name: string, control: ReturnType<Page['getByRole']>) => {
        await control.scrollIntoViewIfNeeded();
        const box = await control.boundingBox();
        expect(box, `${name} at ${width} px is not shown`).not.toBeNull();
        expect(box!.height, `${name} at ${width} px`).toBeGreaterThanOrEqual(44);
        expect(box!.x, `${name} at ${width} px`).toBeGreaterThanOrEqual(0);
        expect(box!.x + box!.width, `${name} at ${width} px`).toBeLessThanOrEqual(width + 0.5);
      };

      await checkLayout('the field view');
      await checkControl('the waiting count', page.getByTestId('waiting-count') as ReturnType<Page['getByRole']>);
      await checkControl('"Take offline"', page.getByRole('button', { name: /Take offline|Refresh offline copy/ }));
      await checkControl('the first point', page.getByRole('button').filter({ has: page.getByTestId(`point-state-${labels[0]}`) }));
      await checkControl('the zone choice', page.getByLabel('Zone', { exact: true }));
      await checkControl('"Save zone note"', page.getByRole('button', { name: 'Save zone note' }));

      // With a point chosen: the entry's tabs, big value field and save button.
      await page.getByTestId(`point-state-${labels[0]}`).click();
      await page.getByRole('heading', { name: `Point ${labels[0]}` }).waitFor();
      await checkLayout('the point entry');
      await checkControl('the value field', page.getByLabel(/^Value/));
      await checkControl('"Save reading"', page.getByRole('button', { name: 'Save reading' }));
      await checkControl('the "Here now" tab', page.getByRole('tab', { name: 'Here now' }));
      await checkControl('the point photo', page.locator('label').filter({ has: page.getByLabel('Photo', { exact: true }) }) as ReturnType<Page['getByRole']>);
      await page.screenshot({ path: path.join(screenshotDir(), `field-${width}.png`), fullPage: true });
      await page.close();
    }
  });
});
