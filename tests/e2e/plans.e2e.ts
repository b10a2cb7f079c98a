import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { PNG } from 'pngjs';
import type { Page } from 'playwright-core';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

/** A plain plan image (800 x 500 px unless asked) with an outline and a middle wall, as a file to upload. */
function planImageFile(width = 800, height = 500): string {
  const png = new PNG({ width, height });
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    const i = (y * width + x) * 4;
    const wall = x < 6 || y < 6 || x > width - 7 || y > height - 7 || Math.abs(x - width / 2) < 4;
    png.data.set(wall ? [50, 54, 60, 255] : [246, 244, 238, 255], i);
  }
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'plan-')), `e2e-floor-${width}x${height}.png`);
  fs.writeFileSync(file, PNG.sync.write(png));
  return file;
}

/** Distinct colours in a PNG (a blank or failed map has a handful). */
function distinctColours(buf: Buffer): number {
  const png = PNG.sync.read(buf);
  const set = new Set<number>();
  for (let i = 0; i < png.data.length; i += 4) set.add((png.data[i] << 16) | (png.data[i + 1] << 8) | png.data[i + 2]);
  return set.size;
}

/** Screen position of a strongly coloured pixel (a marker: the plan and chrome are near-grey). */
function firstMarkerPixel(buf: Buffer): [number, number] | null {
  const png = PNG.sync.read(buf);
  for (let y = 10; y < png.height - 10; y += 2) for (let x = 10; x < png.width - 10; x += 2) {
    const i = (y * png.width + x) * 4;
    const [r, g, b] = [png.data[i], png.data[i + 1], png.data[i + 2]];
    if (Math.max(r, g, b) - Math.min(r, g, b) > 70) return [x, y];
  }
  return null;
}

async function demoIds(page: Page) {
  const sites = (await (await page.request.get('/api/sites')).json()).items as { id: number; name: string }[];
  const site = sites.find((s) => s.name === 'Fernmoor Community Library')!;
  const plans = (await (await page.request.get(`/api/sites/${site.id}/plans`)).json()).items as { id: number; name: string }[];
  const surveys = (await (await page.request.get(`/api/surveys?siteId=${site.id}`)).json()).items as { id: number; name: string; readingCount: number }[];
  return {
    site, ground: plans.find((p) => p.name === 'Ground floor')!,
    autumn: surveys.find((s) => s.name === 'Autumn walk-through 2026')!, spring: surveys.find((s) => s.name === 'Spring walk-through 2026')!,
  };
}

describe('plans and the survey map in a real browser', () => {
  it('uploads a plan, sets its scale with two clicks and draws a zone on it', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    await page.goto('/plans');
    const form = page.getByRole('form', { name: 'Upload a plan' });
    await form.getByLabel('Plan image').setInputFiles(planImageFile());
    await form.getByLabel('Name').fill('E2E annexe');
    await form.getByRole('button', { name: 'Upload plan' }).click();
    await page.getByRole('link', { name: /E2E annexe/ }).click();
    await page.getByText('The scale is not set yet').waitFor();

    const map = page.getByTestId('plan-editor-map');
    await map.locator('.leaflet-image-layer').waitFor();
    const box = (await map.boundingBox())!;
    await page.getByRole('button', { name: 'Pick two points on the plan' }).click();
    const y = box.y + box.height / 2;
    await page.mouse.click(box.x + box.width * 0.2, y);
    await page.mouse.click(box.x + box.width * 0.8, y);
    await page.getByText('2 of 2 points picked.').waitFor();
    await page.getByLabel('Distance between the points (m)').fill('12');
    await page.getByRole('button', { name: 'Set scale' }).click();
    await page.getByRole('status').getByText('Scale set from two points 12 m apart.').waitFor();
    await expect.poll(async () => (await page.getByTestId('plan-scale-bar').innerText()).trim()).toMatch(/\d+ (m|cm)/);

    await page.getByRole('button', { name: 'Add zone' }).click();
    const corners: [number, number][] = [[0.3, 0.3], [0.45, 0.3], [0.45, 0.6], [0.3, 0.6]];
    for (const [fx, fy] of corners) await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
    await page.mouse.click(box.x + box.width * corners[0][0], box.y + box.height * corners[0][1]);
    const zoneForm = page.getByRole('form', { name: 'Add a zone' });
    await expect.poll(async () => (await zoneForm.getByLabel(/Corners/).inputValue()).split('\n').length).toBe(4);
    await zoneForm.getByLabel('Zone name').fill('Drawn room');
    await zoneForm.getByRole('button', { name: 'Add zone' }).click();
    await page.getByRole('list', { name: 'Zones' }).getByText('Drawn room').waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'plan-editor.png') });
  });

  it('edits a zone by dragging a corner on the map, and the saved outline has the moved corner', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const { site } = await demoIds(page);
    const headers = { Origin: app.baseUrl };
    // A 20 m wide plan (800 x 500 px, so 12.5 m high) with one square room, made through the API.
    const planRes = await page.request.post(`/api/sites/${site.id}/plans`, {
      headers, multipart: { file: { name: 'edit.png', mimeType: 'image/png', buffer: fs.readFileSync(planImageFile()) }, name: 'E2E outline edit', widthM: '20' },
    });
    expect(planRes.status()).toBe(201);
    const plan = await planRes.json() as { id: number };
    const zoneRes = await page.request.post(`/api/plans/${plan.id}/zones`, { headers, data: { name: 'Square room', kind: 'room', useType: 'corridor', polygon: [[2, 2], [8, 2], [8, 8], [2, 8]] } });
    expect(zoneRes.status()).toBe(201);

    await page.goto(`/plans/${plan.id}`);
    await page.getByRole('button', { name: 'Edit Square room' }).click();
    const form = page.getByRole('form', { name: 'Edit zone Square room' });
    const corners = form.getByLabel(/Corners/);
    await expect.poll(() => corners.inputValue()).toMatch(/^2(\.0+)?, 2/);
    const map = page.getByTestId('plan-editor-map');
    const handles = map.locator('.marker-icon:not(.marker-icon-middle)');
    await expect.poll(() => handles.count()).toBe(4);
    // The upper-right corner (8, 8) is the handle furthest right and highest on screen.
    const boxes = await Promise.all((await handles.all()).map(async (h) => (await h.boundingBox())!));
    const upperRight = boxes.reduce((best, b) => (b.x - b.y > best.x - best.y ? b : best));
    const from = { x: upperRight.x + upperRight.width / 2, y: upperRight.y + upperRight.height / 2 };
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (let i = 1; i <= 10; i++) await page.mouse.move(from.x + i * 8, from.y, { steps: 2 });
    await page.mouse.up();
    // The form follows the map: the dragged corner's x grew, its y stayed about 8 m.
    const movedCorner = async () => (await corners.inputValue()).split('\n').map((l) => l.split(',').map(Number)).find(([x, y]) => x > 8.5 && Math.abs(y - 8) < 0.5);
    await expect.poll(movedCorner).toBeDefined();
    const moved = (await movedCorner())!;
    await form.getByRole('button', { name: 'Save zone' }).click();
    await form.waitFor({ state: 'detached' });
    const saved = (await (await page.request.get(`/api/plans/${plan.id}/zones`)).json()).items as { name: string; polygon: [number, number][] }[];
    const polygon = saved.find((z) => z.name === 'Square room')!.polygon;
    expect(polygon).toHaveLength(4);
    expect(polygon.some(([x, y]) => Math.abs(x - moved[0]) < 0.01 && Math.abs(y - moved[1]) < 0.01)).toBe(true);
    // The other three corners did not move.
    for (const c of [[2, 2], [8, 2], [2, 8]]) expect(polygon.some(([x, y]) => Math.abs(x - c[0]) < 0.01 && Math.abs(y - c[1]) < 0.01)).toBe(true);
  });

  it('replaces a plan\'s image keeping its zone, and deletes a plan uploaded by mistake; one with a zone is refused with the reason shown', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const { site } = await demoIds(page);
    const headers = { Origin: app.baseUrl };
    const make = async (name: string) => (await (await page.request.post(`/api/sites/${site.id}/plans`, {
      headers, multipart: { file: { name: 'p.png', mimeType: 'image/png', buffer: fs.readFileSync(planImageFile()) }, name, widthM: '20' },
    })).json()) as { id: number };
    const keep = await make('E2E plan with a zone');
    await page.request.post(`/api/plans/${keep.id}/zones`, { headers, data: { name: 'Kept room', kind: 'room', useType: 'corridor', polygon: [[2, 2], [8, 2], [8, 8], [2, 8]] } });
    const wrong = await make('E2E wrong upload');

    page.on('dialog', (d) => void d.accept());
    await page.goto(`/plans/${keep.id}`);
    await page.getByRole('button', { name: 'Delete plan' }).click();
    await page.getByRole('alert').getByText('Plan "E2E plan with a zone" has 1 zone(s): delete them first, then the plan').waitFor();

    // The kept plan gets a revised drawing at twice the resolution: it stays 20 m wide, its zone stays put.
    await page.getByLabel('New image').setInputFiles(planImageFile(1600, 1000));
    await page.getByRole('button', { name: 'Replace image' }).click();
    await page.getByRole('status').getByText('The plan image was replaced.').waitFor();
    const revised = await (await page.request.get(`/api/plans/${keep.id}`)).json() as { widthPx: number; widthM: number };
    expect(revised).toMatchObject({ widthPx: 1600, widthM: 20 });
    const kept = (await (await page.request.get(`/api/plans/${keep.id}/zones`)).json()).items as { polygon: [number, number][] }[];
    expect(kept[0].polygon).toEqual([[2, 2], [8, 2], [8, 8], [2, 8]]);
    await page.getByTestId('plan-editor-map').locator('.leaflet-image-layer').waitFor();

    await page.goto(`/plans/${wrong.id}`);
    await page.getByRole('button', { name: 'Delete plan' }).click();
    await page.waitForURL((u) => u.pathname === '/plans');
    await page.getByRole('link', { name: /E2E plan with a zone/ }).waitFor();
    expect(await page.getByRole('link', { name: /E2E wrong upload/ }).count()).toBe(0);
  });

  it('compares the autumn walk with the spring one: the map switches to the change scale and a point tells its change', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const { ground, autumn, spring } = await demoIds(page);
    await page.goto(`/surveys/${autumn.id}/map?planId=${ground.id}`);
    const map = page.getByTestId('survey-map');
    await expect.poll(() => map.getAttribute('data-painted-ms'), { timeout: 20_000 }).not.toBeNull();
    await page.getByLabel('Compare with').selectOption(String(spring.id));
    await page.getByRole('figure', { name: 'Colour scale of the change' }).waitFor();
    const summary = await page.getByText(/point\(s\) matched by label/).innerText();
    expect(Number(/(\d+) point\(s\) matched/.exec(summary)![1])).toBeGreaterThan(0);
    expect(new URL(page.url()).searchParams.get('compare')).toBe(String(spring.id));
    // A point's details now say how it changed since spring (both walks measured the same labels).
    await page.getByLabel('Find a point').selectOption({ index: 1 });
    const popup = page.locator('.leaflet-popup').filter({ hasText: 'Point ' });
    await popup.waitFor();
    expect(await popup.innerText()).toMatch(/Change\s*[+−]\d[\d.,]* lx \(was \d[\d.,]* lx\)/);
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-map-change.png') });
  });

  it('shows the demo survey\'s points on the ground floor, with details on hover, and the map is not blank', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const { ground, autumn } = await demoIds(page);
    expect(autumn.readingCount).toBeGreaterThan(0);
    await page.goto(`/plans/${ground.id}`);
    await page.getByRole('link', { name: 'Autumn walk-through 2026' }).click();
    const map = page.getByTestId('survey-map');
    await expect.poll(() => map.getAttribute('data-painted-ms'), { timeout: 20_000 }).not.toBeNull();
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-map.png') });
    expect(distinctColours(await map.screenshot())).toBeGreaterThan(40);

    // Only markers keep strong colours once zone shading and isolux lines are off.
    await page.getByLabel('Zones').uncheck();
    await page.getByLabel('Isolux lines').uncheck();
    await page.mouse.move(0, 0);
    const box = (await map.boundingBox())!;
    const at = firstMarkerPixel(await map.screenshot());
    expect(at).not.toBeNull();
    await page.mouse.move(box.x + at![0] + 2, box.y + at![1] + 2);
    const tip = page.locator('.leaflet-tooltip').filter({ hasText: 'Point ' });
    await tip.waitFor({ timeout: 5000 });
    expect(await tip.innerText()).toMatch(/Illuminance[\s\S]*(lx)[\s\S]*Probe[\s\S]*Gain code/);
  });

  it('reads at phone width: the legend and the point finder work without hover', async () => {
    const page = await app.newPage();
    await signInAs(page, 'facilities@luxtrail.test');
    await page.setViewportSize({ width: 390, height: 844 });
    const { ground, autumn } = await demoIds(page);
    await page.goto(`/surveys/${autumn.id}/map?planId=${ground.id}`);
    await page.getByLabel('Find a point').waitFor();
    const option = await page.getByLabel('Find a point').locator('option').nth(1).getAttribute('value');
    await page.getByLabel('Find a point').selectOption(option!);
    await page.locator('.leaflet-popup').filter({ hasText: 'Point ' }).waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-map-phone.png'), fullPage: true });
  });

  it('benchmark (reported, not asserted): renders 20,000 points and prints the time to first paint', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const { site, ground } = await demoIds(page);
    const db = new Database(path.join(app.dataDir, 'e2e.db'));
    const now = Date.now();
    const survey = db.prepare("INSERT INTO surveys (organization_id, site_id, name, status, created_at) SELECT organization_id, id, 'Benchmark 20k', 'draft', ? FROM sites WHERE id = ? RETURNING id").get(now, site.id) as { id: number };
    const probe = db.prepare('SELECT id, organization_id FROM probes ORDER BY id LIMIT 1').get() as { id: number; organization_id: number };
    const file = db.prepare("INSERT INTO stored_files (organization_id, sha256, filename, content_type, size, created_at) VALUES (?, ?, 'bench.csv', 'text/csv', 1, ?) RETURNING id").get(probe.organization_id, '0'.repeat(64), now) as { id: number };
    const imp = db.prepare("INSERT INTO log_imports (survey_id, file_id, status, created_at) VALUES (?, ?, 'done', ?) RETURNING id").get(survey.id, file.id, now) as { id: number };
    const decode = db.prepare("INSERT INTO decodes (survey_id, reason, created_at) VALUES (?, 'benchmark', ?) RETURNING id").get(survey.id, now) as { id: number };
    const insert = db.prepare("INSERT INTO readings (survey_id, decode_id, import_id, point, x_m, y_m, plan_id, role, time_ms, probe_id, lux, u_lux, lux_bound, flag, gain_code, sample_count) VALUES (?, ?, ?, ?, ?, ?, ?, 'task', ?, ?, ?, ?, 'exact', ?, 2, 1)");
    db.transaction(() => {
      for (let i = 0; i < 20_000; i++) {
        const x = (i % 200) * 0.18 + 0.05, yM = Math.floor(i / 200) * 0.2 + 0.05;
        const lux = 80 + 600 * Math.exp(-((x - 10) ** 2 + (yM - 8) ** 2) / 60);
        insert.run(survey.id, decode.id, imp.id, `B${i}`, x, yM, ground.id, now + i, probe.id, lux, lux * 0.08, i % 97 === 0 ? 'low_confidence' : 'ok');
      }
    })();
    db.prepare('UPDATE surveys SET active_decode_id = ? WHERE id = ?').run(decode.id, survey.id);
    db.close();

    const started = Date.now();
    await page.goto(`/surveys/${survey.id}/map?planId=${ground.id}`);
    const map = page.getByTestId('survey-map');
    await expect.poll(() => map.getAttribute('data-painted-ms'), { timeout: 60_000, interval: 50 }).not.toBeNull();
    const fromNavigation = Date.now() - started;
    const paintMs = Number(await map.getAttribute('data-painted-ms'));
    console.log(`[bench] survey map, 20,000 points: markers painted ${paintMs.toFixed(0)} ms after the data arrived; ${fromNavigation} ms from navigation (fetch, isolux, draw)`);
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-map-20k.png') });
    expect(paintMs).toBeGreaterThan(0); // a figure was measured; its size is reported, not judged
  });
});
