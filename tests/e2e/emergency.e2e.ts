import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';
import { autoRangeBurst, seededRandom, simProbe, toLogCsv, type SimRow } from '@server/db/demo/simulate-log';
import { DEMO_COUNTING_PROBES } from '@server/db/demo/demo-probes';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

type Planned = { label: string; role: string; xM: number; yM: number };

/** A two-pass log of the given points (LX-4107, 1 s integration): initial 3 min after the mains cut, end pass 170 min after; `dark` is dim at the end. */
function twoPassLog(points: Planned[], mainsOffMs: number, dark: string): string {
  const rnd = seededRandom(16);
  const probe = simProbe(DEMO_COUNTING_PROBES[1]);
  const rows: SimRow[] = [];
  let code = 3;
  for (const [startMin, end] of [[3, false], [170, true]] as const) {
    let t = mainsOffMs + startMin * 60_000;
    for (const p of points) {
      const lux = (p.role === 'centre_line' ? 2.2 : 1.4) * (end ? (p.label === dark ? 0.3 : 0.75) : 1);
      const burst = autoRangeBurst(probe, lux, code, rnd, 1000, 12);
      code = burst.endCode;
      for (const s of burst.samples) { rows.push({ timeMs: t, probe: probe.serial, point: p.label, gain: s.gain, counts: s.counts, xM: p.xM, yM: p.yM, plan: 'Ground floor', intMs: 1000 }); t += 1500; }
      t += 10_000;
    }
  }
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'emergency-')), 'night-test.csv');
  fs.writeFileSync(file, toLogCsv(rows, 'Europe/London'));
  return file;
}

describe('emergency lighting in a real browser', () => {
  it('draws an escape route on the plan, starts a night survey, uploads a two-pass log and reads the verdicts', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    await page.locator('aside').getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Emergency lighting' }).click();
    await page.getByRole('link', { name: 'Ground floor' }).click();
    await page.getByRole('heading', { name: /Routes and areas: Ground floor/ }).waitFor();

    // Draw a centre line near the bottom of the plan: two clicks, then the last point again to finish (leaflet-geoman).
    const form = page.getByRole('form', { name: 'Add an emergency element' });
    await form.getByLabel('Code').fill('R9');
    await form.getByLabel('Name').fill('Drawn exit route');
    await form.getByRole('button', { name: 'Draw on plan' }).click();
    const map = page.getByTestId('emergency-map');
    const image = map.locator('.leaflet-image-layer');
    await image.waitFor();
    // Fractions of the plan image (36 x 20 m): y = 0.9 from the top is 2 m up, inside the reading room.
    const box = (await image.boundingBox())!;
    const a = { x: box.x + box.width * 0.1, y: box.y + box.height * 0.9 };
    const b = { x: box.x + box.width * 0.45, y: box.y + box.height * 0.9 };
    await page.mouse.click(a.x, a.y);
    await page.mouse.click(b.x, b.y);
    await page.mouse.click(b.x, b.y);
    const coords = form.getByLabel(/Centre line/);
    await expect.poll(async () => (await coords.inputValue()).split(';').length, { timeout: 10_000 }).toBe(2);
    await form.getByLabel('Width (m)').fill('1.5');
    await form.getByLabel('Point spacing (m)').fill('3');
    await form.getByRole('button', { name: 'Add escape route' }).click();
    const list = page.getByRole('list', { name: 'Emergency elements' });
    await list.getByText('Drawn exit route').waitFor();

    // The route's planned points, as the API answers them.
    const plansRes = await page.request.get(page.url().replace(/.*\/emergency\/plans\/(\d+).*/, '/api/plans/$1/emergency-elements'));
    const route = ((await plansRes.json()).items as { code: string; plannedPoints: Planned[] }[]).find((e) => e.code === 'R9')!;
    expect(route.plannedPoints.length).toBeGreaterThanOrEqual(6);
    const centre = route.plannedPoints.filter((p) => p.role === 'centre_line');
    const far = centre[centre.length - 1].label;

    await page.goto('/emergency');
    const start = page.getByRole('form', { name: 'Start an emergency survey' });
    await start.getByLabel('Survey name').fill('E2E night test');
    await start.getByLabel(/Mains cut at/).fill('2026-11-25T19:00');
    await start.getByRole('button', { name: 'Start emergency survey' }).click();
    await page.getByRole('heading', { name: 'E2E night test' }).waitFor();

    await page.getByLabel('Meter log (CSV)').setInputFiles(twoPassLog(route.plannedPoints, Date.parse('2026-11-25T19:00:00Z'), far));
    await page.getByRole('button', { name: 'Upload log' }).click();
    await page.getByRole('progressbar', { name: 'Processing: done' }).waitFor({ timeout: 60_000 });

    await expect.poll(async () => (await page.getByTestId('pass-end_of_duration').innerText()), { timeout: 20_000 }).toContain(`${route.plannedPoints.length} readings`);
    expect(await page.getByTestId('pass-initial').innerText()).toContain(`${route.plannedPoints.length} readings`);
    const card = page.getByTestId('element-R9');
    await card.getByText('Falls short').first().waitFor();
    expect(await card.getByTestId('worst-point').innerText()).toContain(far);
    expect(await card.getByTestId('worst-point').innerText()).toMatch(/±/);
    await card.getByText(/Central band minimum/).first().waitFor();
    await card.getByText(/Emax:Emin/).first().waitFor();
    await page.getByTestId('emergency-caution').first().waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'emergency-survey.png'), fullPage: true });

    // The report downloads as a PDF.
    const pdf = await page.request.get(page.url().replace(/.*\/emergency\/surveys\/(\d+).*/, '/api/emergency/surveys/$1/report.pdf'));
    expect(pdf.headers()['content-type']).toBe('application/pdf');
  });

  it('shows the facility manager the library\'s overdue test on a 390 px phone, with nothing wider than the screen', async () => {
    const page = await app.newPage();
    await signInAs(page, 'facilities@luxtrail.test');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto('/emergency');
    const library = page.getByTestId('due-functional').first();
    await library.getByText(/Overdue by 10 days/).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(391);
    await page.screenshot({ path: path.join(screenshotDir(), 'emergency-overview-390.png'), fullPage: true });
    await page.getByRole('link', { name: 'Fernmoor Community Library' }).first().click();
    await page.getByRole('heading', { name: /Test logbook: Fernmoor Community Library/ }).waitFor();
    await page.getByRole('table', { name: 'Logbook entries' }).getByText('EL-G07 (corridor, east end)').waitFor();
    const surveys = (await (await page.request.get('/api/emergency/surveys')).json()).items as { surveyId: number; name: string }[];
    await page.goto(`/emergency/surveys/${surveys.find((s) => s.name === 'Emergency lighting night test')!.surveyId}`);
    await page.getByTestId('element-R1').getByText('Falls short').first().waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(391);
    await page.screenshot({ path: path.join(screenshotDir(), 'emergency-survey-390.png'), fullPage: true });
  });
});
