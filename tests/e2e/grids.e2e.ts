import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

// Generous waits: the machine is shared and the server imports logs on worker threads.
const LONG = { timeout: 60_000 };

/** No page may scroll sideways: the document is no wider than the viewport. */
async function expectNoSidewaysScroll(page: Page, what: string) {
  const { scroll, inner } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, inner: window.innerWidth }));
  expect(scroll, `${what} is ${scroll} px wide in a ${inner} px viewport`).toBeLessThanOrEqual(inner);
}

type Ids = { surveyId: number; planId: number };
let ids: Ids | null = null;

describe('measurement grids and placement in a real browser', () => {
  it('generates a room\'s grid, downloads the walk sheet, uploads a label-only log, sees its points placed and drags an unplaced reading onto the plan', { timeout: 300_000 }, async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const headers = { Origin: app.baseUrl };
    const sites = (await (await page.request.get('/api/sites')).json()).items as { id: number; name: string }[];
    const site = sites.find((s) => s.name === 'Fernmoor Community Library')!;
    const plans = (await (await page.request.get(`/api/sites/${site.id}/plans`)).json()).items as { id: number; name: string }[];
    const ground = plans.find((p) => p.name === 'Ground floor')!;
    const created = await page.request.post('/api/surveys', { headers, data: { siteId: site.id, name: 'Browser grid walk' } });
    expect(created.status()).toBe(201);
    const survey = await created.json() as { id: number };
    ids = { surveyId: survey.id, planId: ground.id };

    // Generate Office A's grid on the survey map.
    await page.goto(`/surveys/${survey.id}/map?planId=${ground.id}`);
    const zoneChoice = page.getByLabel('Zone', { exact: true });
    await zoneChoice.waitFor(LONG);
    await zoneChoice.selectOption({ label: 'Office A' });
    await page.getByRole('button', { name: 'Generate grid for zone' }).click();
    const grid = page.getByTestId('grid-OA');
    await grid.waitFor(LONG);
    // Office A is 8 m × 6 m: less its 0.5 m band 7 m × 5 m, d = 7 m, p = 0.2 × 5^log10(7) = 0.78 m
    // (EN 12464-1 formula), 7 / 0.78 = 8.98 → 9 and 5 / 0.78 = 6.41 → 7 under the next-higher reading: 63 points.
    await expect.poll(() => grid.textContent(), LONG).toContain('63 point(s)');
    await expect.poll(() => page.locator('.lt-pp').count(), LONG).toBe(63);
    expect(await page.locator('.lt-pp-dot.is-visited').count()).toBe(0);
    await expect.poll(() => page.locator('.lt-pp').filter({ hasText: 'OA-A1' }).count(), LONG).toBe(1);

    // The walk sheet downloads as a PDF.
    const [download] = await Promise.all([page.waitForEvent('download', LONG), page.getByTestId('walk-sheet-link').click()]);
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
    const sheet = fs.readFileSync((await download.path())!);
    expect(sheet.subarray(0, 5).toString()).toBe('%PDF-');

    // A label-only log: three planned labels (one in lower case, one with spaces) and one label that is not planned.
    const t0 = Date.now() - 3600_000;
    const at = (min: number) => new Date(t0 + min * 60_000).toISOString();
    const csv = ['timestamp,probe,point,gain,counts', `${at(0)},LX-4102,OA-A1,2,16000`, `${at(1)},LX-4102,oa-a2,2,16500`, `${at(2)},LX-4102, OA-A3 ,2,15800`, `${at(3)},LX-4102,DOOR-1,2,15000`, ''].join('\n');
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'labels-')), 'label-walk.csv');
    fs.writeFileSync(file, csv);
    await page.goto(`/surveys/${survey.id}`);
    await page.getByLabel('Meter log (CSV)').setInputFiles(file, LONG);
    await page.getByRole('button', { name: 'Upload log' }).click();
    const placement = page.getByTestId('import-placement');
    await placement.waitFor({ timeout: 120_000 });
    expect(await placement.textContent()).toMatch(/by their coordinates: 0; by a planned point's label: 3; without a place: 1/);
    await expect.poll(() => page.getByTestId('planned-points-card').textContent(), LONG).toMatch(/3 of 63 planned point\(s\) have a reading/);
    // The survey page lists the reading without a place too.
    await expect.poll(() => page.getByTestId('unplaced-panel').getByTestId('unplaced-reading').count(), LONG).toBe(1);

    // On the map the three points are visited and DOOR-1 waits in the unplaced list; drag it onto the plan.
    await page.goto(`/surveys/${survey.id}/map?planId=${ground.id}`);
    await expect.poll(() => page.locator('.lt-pp-dot.is-visited').count(), LONG).toBe(3);
    const unplaced = page.getByTestId('unplaced-reading');
    await unplaced.first().waitFor(LONG);
    expect(await unplaced.count()).toBe(1);
    expect(await page.getByTestId('unplaced-panel').textContent()).toContain('DOOR-1');
    // HTML drag and drop as the browser dispatches it: dragstart on the reading, dragover and drop on the
    // map, a few pixels from a planned point of Office A (so certainly on the plan).
    const map = page.getByTestId('survey-map').locator('.leaflet-container');
    const target = (await page.locator('.lt-pp-dot').first().boundingBox())!;
    const where = { clientX: Math.round(target.x + target.width / 2 + 8), clientY: Math.round(target.y + target.height / 2 + 8) };
    const dataTransfer = await page.evaluateHandle(() => new DataTransfer());
    await unplaced.first().dispatchEvent('dragstart', { dataTransfer });
    await map.dispatchEvent('dragover', { dataTransfer, ...where });
    await map.dispatchEvent('drop', { dataTransfer, ...where });
    await expect.poll(() => page.getByTestId('unplaced-panel').textContent(), LONG).toContain('Every reading has a place on a plan.');
    const after = (await (await page.request.get(`/api/surveys/${survey.id}/readings?point=DOOR-1`)).json()).items as { xM: number | null; yM: number | null; planId: number | null }[];
    expect(after).toHaveLength(1);
    expect(after[0].planId).toBe(ground.id);
    // Dropped inside Office A (x 20-28 m, y 0-6 m on the ground floor), near the grid's first point.
    expect(after[0].xM).toBeGreaterThan(20);
    expect(after[0].xM).toBeLessThan(28);
    expect(after[0].yM).toBeGreaterThan(0);
    expect(after[0].yM).toBeLessThan(6);
    await page.screenshot({ path: path.join(screenshotDir(), 'grids-survey-map.png'), fullPage: true });

    // The plan page shows the survey's planned points, visited or not, and the (now empty) unplaced panel.
    await page.goto(`/plans/${ground.id}?survey=${survey.id}`);
    await expect.poll(() => page.getByTestId('plan-planned-points').textContent(), LONG).toMatch(/3 of 63 planned point\(s\) have a reading/);
    await expect.poll(() => page.getByTestId('plan-editor-map').locator('.lt-pp').count(), LONG).toBe(63);
    expect(await page.getByTestId('plan-editor-map').locator('.lt-pp-dot.is-visited').count()).toBe(3);
    await expect.poll(() => page.getByTestId('unplaced-panel').textContent(), LONG).toContain('Every reading has a place on a plan.');
    await page.close();
  });

  it('at 390 px the survey map, the survey page and the plan page with planned points do not scroll sideways, and a planned point takes keyboard focus', { timeout: 240_000 }, async () => {
    expect(ids, 'the first test made the survey').not.toBeNull();
    const { surveyId, planId } = ids!;
    const page = await app.newPage({ width: 390, height: 844 });
    await signInAs(page, 'surveyor@luxtrail.test');

    await page.goto(`/surveys/${surveyId}/map?planId=${planId}`);
    await expect.poll(() => page.locator('.lt-pp').count(), LONG).toBe(63);
    await page.getByTestId('grid-OA').waitFor(LONG);
    await page.getByTestId('unplaced-panel').getByText('Every reading has a place on a plan.').waitFor(LONG);
    await expectNoSidewaysScroll(page, 'The survey map');
    // Planned points are buttons in the tab order, named by their label and whether they have a reading.
    const marker = page.locator('.lt-pp').filter({ hasText: 'OA-A1' });
    expect(await marker.getAttribute('role')).toBe('button');
    expect(await marker.getAttribute('tabindex')).toBe('0');
    await marker.focus();
    expect(await page.evaluate(() => document.activeElement?.getAttribute('title'))).toMatch(/^OA-A1\b.*: 1 reading\(s\)$/);
    await page.screenshot({ path: path.join(screenshotDir(), 'grids-survey-map-390.png'), fullPage: true });

    await page.goto(`/surveys/${surveyId}`);
    await expect.poll(() => page.getByTestId('planned-points-card').textContent(), LONG).toMatch(/3 of 63 planned point\(s\) have a reading/);
    await page.getByTestId('unplaced-panel').getByText('Every reading has a place on a plan.').waitFor(LONG);
    await expectNoSidewaysScroll(page, 'The survey page');

    await page.goto(`/plans/${planId}?survey=${surveyId}`);
    await expect.poll(() => page.getByTestId('plan-editor-map').locator('.lt-pp').count(), LONG).toBe(63);
    await expect.poll(() => page.getByTestId('plan-planned-points').textContent(), LONG).toMatch(/3 of 63/);
    await expectNoSidewaysScroll(page, 'The plan page');
    await page.screenshot({ path: path.join(screenshotDir(), 'grids-plan-390.png'), fullPage: true });

    // The demo's label walk, with three rooms' grids, at phone width too.
    const surveys = (await (await page.request.get('/api/surveys')).json()).items as { id: number; name: string }[];
    const labelWalk = surveys.find((s) => s.name === 'Ground-floor offices, label walk 2026')!;
    await page.goto(`/surveys/${labelWalk.id}/map?planId=${planId}`);
    await page.getByTestId('grid-OA').waitFor(LONG);
    await expect.poll(() => page.locator('.lt-pp-dot.is-visited').count(), LONG).toBeGreaterThan(100);
    expect(await page.locator('.lt-pp-dot:not(.is-visited)').count()).toBe(0);
    await expectNoSidewaysScroll(page, 'The label walk\'s survey map');
    await page.close();
  });
});
