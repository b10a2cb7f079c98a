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

    // The log holds both passes, so it is split by time (the default the surveyor could change).
    const logs = page.getByRole('list', { name: 'Logs and their passes' });
    expect(await logs.getByLabel('Pass of night-test.csv').inputValue()).toBe('by_time');

    // Submitted by the surveyor, signed off by the facility manager on the same page: the verdicts are then frozen.
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText('submitted', { exact: false }).first().waitFor();
    const surveyUrl = page.url();
    const fm = await app.newPage();
    await signInAs(fm, 'facilities@luxtrail.test');
    await fm.goto(surveyUrl);
    await fm.getByRole('button', { name: 'Sign off…' }).click();
    await fm.getByRole('button', { name: 'Confirm sign-off' }).click();
    await fm.getByTestId('frozen-note').waitFor({ timeout: 30_000 });
    await fm.getByTestId('element-R9').getByText('Falls short').first().waitFor();
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

  it('lets an administrator type a route by keyboard, widen it into 2 m strips, base an own criteria set on EN 1838 and edit it, and set the test schedule, at 390 px too', async () => {
    const page = await app.newPage();
    await signInAs(page, 'admin@luxtrail.test');
    await page.goto('/emergency');
    await page.getByRole('link', { name: 'Ground floor' }).first().click();
    await page.getByRole('heading', { name: /Routes and areas: Ground floor/ }).waitFor();

    // A route typed as coordinates (no mouse), then edited: 3.6 m wide becomes two 1.8 m strips.
    const add = page.getByRole('form', { name: 'Add an emergency element' });
    await add.getByLabel('Code').fill('R8');
    await add.getByLabel('Name').fill('Typed side route');
    await add.getByLabel(/Centre line/).fill('2 3; 10 3');
    await add.getByLabel('Width (m)').fill('1.2');
    await add.getByLabel('Point spacing (m)').press('Enter');
    const list = page.getByRole('list', { name: 'Emergency elements' });
    await list.getByText('Typed side route').waitFor();
    await list.getByRole('button', { name: 'Edit R8 Typed side route' }).click();
    const edit = page.getByRole('form', { name: 'Edit R8 Typed side route' });
    await expect.poll(() => edit.getByLabel('Name').evaluate((el) => el === document.activeElement), { timeout: 10_000 }).toBe(true);
    expect(await edit.getByLabel('Kind').isDisabled()).toBe(true);
    await edit.getByLabel('Width (m)').fill('3.6');
    await edit.getByRole('button', { name: 'Save R8' }).click();
    await page.getByRole('form', { name: 'Add an emergency element' }).waitFor();
    await list.getByText(/3\.6 m wide.*2 strips of ≤ 2 m/).waitFor();
    const planId = page.url().replace(/.*\/emergency\/plans\/(\d+).*/, '$1');
    const r8 = ((await (await page.request.get(`/api/plans/${planId}/emergency-elements`)).json()).items as { code: string; widthM: number; plannedPoints: { label: string }[] }[]).find((e) => e.code === 'R8')!;
    expect(r8.widthM).toBe(3.6);
    expect(r8.plannedPoints.map((p) => p.label)).toEqual(expect.arrayContaining(['R8-S1-C01', 'R8-S2-C01']));

    // Criteria sets: base an own set on EN 1838:2013 with 1 lx over the central band (the reported 2024 draft), then edit its source.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto('/emergency');
    await page.getByRole('link', { name: 'Criteria sets and test schedule' }).click();
    await page.getByRole('heading', { name: 'Criteria sets and test schedule' }).waitFor();
    await page.getByRole('button', { name: 'Base a new set on EN 1838:2013' }).click();
    const editor = page.getByRole('form', { name: 'New criteria set based on EN 1838:2013' });
    await editor.getByLabel('Name').fill('E2E: 1 lx central band');
    await editor.getByLabel('Limit (route-band-min)').fill('1');
    await editor.getByLabel('Source of route-band-min').fill('Organisation policy after the reported 2024 draft of EN 1838: 1 lx over the whole central band');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(391);
    await page.screenshot({ path: path.join(screenshotDir(), 'emergency-criteria-390.png'), fullPage: true });
    await editor.getByRole('button', { name: 'Create criteria set' }).click();
    const sets = page.getByRole('list', { name: 'Criteria sets' });
    await sets.getByText('E2E: 1 lx central band').waitFor();
    await page.getByRole('button', { name: 'Edit E2E: 1 lx central band' }).click();
    const own = page.getByRole('form', { name: 'Edit E2E: 1 lx central band' });
    await own.getByLabel('Source', { exact: true }).fill('E2E policy, revised');
    await own.getByRole('button', { name: 'Save changes' }).click();
    await sets.getByText('E2E policy, revised').waitFor();
    const saved = ((await (await page.request.get('/api/emergency/criteria-sets')).json()).items as { name: string; builtIn: boolean; checks: { id: string; limit?: { value: number } }[] }[]).find((x) => x.name === 'E2E: 1 lx central band')!;
    expect(saved.builtIn).toBe(false);
    expect(saved.checks.find((c) => c.id === 'route-band-min')?.limit?.value).toBe(1);

    // The test schedule: a refused value says why; a good one is saved; then the default again (other tests read the demo's overdue days).
    const schedule = page.getByRole('form', { name: 'Test schedule' });
    const days = schedule.getByLabel('Functional test every (days)');
    await days.fill('0');
    await schedule.getByRole('button', { name: 'Save schedule' }).click();
    await schedule.getByRole('alert').getByText(/whole number of days from 1 to 366/).waitFor();
    await days.fill('28');
    await schedule.getByRole('button', { name: 'Save schedule' }).click();
    await schedule.getByRole('status').waitFor();
    expect((await (await page.request.get('/api/emergency/test-schedule')).json()).functionalEveryDays).toBe(28);
    await days.fill('30');
    await schedule.getByRole('button', { name: 'Save schedule' }).click();
    await expect.poll(async () => (await (await page.request.get('/api/emergency/test-schedule')).json()).functionalEveryDays, { timeout: 10_000 }).toBe(30);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(391);
  });
});
