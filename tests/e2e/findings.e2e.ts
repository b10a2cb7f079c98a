import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';
import { formatClock } from '@shared/datetime';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

const PHONE = { width: 390, height: 844 };
const LONG = { timeout: 30_000 };

/** No page may scroll sideways: the document is no wider than the viewport. */
async function expectNoSidewaysScroll(page: Page, what: string) {
  const { scroll, inner } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, inner: window.innerWidth }));
  expect(scroll, `${what} is ${scroll} px wide in a ${inner} px viewport`).toBeLessThanOrEqual(inner);
}

/** Each located element is shown, and lies wholly inside the viewport's width. */
async function expectWithinViewport(page: Page, selector: string, what: string, atLeast = 1) {
  const boxes = await page.locator(selector).evaluateAll((els) => els.map((e) => {
    const r = e.getBoundingClientRect();
    const style = getComputedStyle(e);
    return { left: r.left, right: r.right, width: r.width, visible: style.visibility !== 'hidden' && style.display !== 'none' && r.width > 0, text: (e as HTMLElement).innerText };
  }));
  expect(boxes.length, `${what}: how many`).toBeGreaterThanOrEqual(atLeast);
  const width = await page.evaluate(() => window.innerWidth);
  for (const b of boxes) {
    expect(b.visible, `${what} "${b.text}" shown`).toBe(true);
    expect(b.left, `${what} "${b.text}" left edge`).toBeGreaterThanOrEqual(0);
    expect(b.right, `${what} "${b.text}" right edge`).toBeLessThanOrEqual(width);
  }
}

async function surveyIdByName(page: Page, name: string): Promise<number> {
  const res = await page.request.get('/api/surveys');
  const s = (await res.json()).items.find((x: { name: string }) => x.name === name);
  return s.id as number;
}

describe('at phone width (390 px) the main pages fit and show each row\'s key value', () => {
  it('surveys, a survey\'s readings, the verdicts and the calibration due dates', async () => {
    const page = await app.newPage(PHONE);
    await signInAs(page, 'admin@luxtrail.test');

    await page.goto('/surveys');
    await page.getByRole('link', { name: 'Autumn walk-through 2026' }).first().waitFor(LONG);
    await expectNoSidewaysScroll(page, 'Surveys');
    await expectWithinViewport(page, 'table.stack-table tbody tr td[data-key]', 'survey status and start');

    const autumn = await surveyIdByName(page, 'Autumn walk-through 2026');
    await page.goto(`/surveys/${autumn}`);
    await page.locator('[data-testid="reading-row"] [data-key-value]').first().waitFor(LONG);
    await expectNoSidewaysScroll(page, 'Survey page');
    await page.getByRole('rowgroup', { name: /Readings list/ }).scrollIntoViewIfNeeded();
    await expectWithinViewport(page, '[data-testid="reading-row"] [data-key-value]', 'reading illuminance', 5);
    await page.screenshot({ path: path.join(screenshotDir(), 'phone-survey.png'), fullPage: true });

    await page.goto(`/compliance/surveys/${autumn}`);
    await page.getByTestId('zone-table').waitFor(LONG);
    await expectNoSidewaysScroll(page, 'Verdicts');
    await expectWithinViewport(page, '[data-testid="zone-eavg"]', 'zone Eavg', 5);
    const eavgs = await page.locator('[data-testid="zone-eavg"]').allInnerTexts();
    // Whole figures, not cut: each ends in its unit.
    for (const t of eavgs) expect(t).toMatch(/(lx|fc)( ± [\d,.]+)?$|–$/);
    await page.screenshot({ path: path.join(screenshotDir(), 'phone-verdicts.png'), fullPage: true });

    await page.goto('/calibration');
    await page.getByRole('table', { name: 'Calibration due dates' }).waitFor(LONG);
    await expectNoSidewaysScroll(page, 'Calibration');
    await expectWithinViewport(page, 'table.stack-table tbody tr td[data-key]', 'probe state, due date and time left', 6);
    await page.screenshot({ path: path.join(screenshotDir(), 'phone-calibration.png'), fullPage: true });
  });
});

describe('one clock', () => {
  it('a survey recorded in summer time shows the same times on the chart and in the table, in the site\'s zone, for a viewer elsewhere', async () => {
    const page = await app.newPage({ timezoneId: 'America/New_York' });
    await signInAs(page, 'surveyor@luxtrail.test');
    const spring = await surveyIdByName(page, 'Spring walk-through 2026');
    const first = (await (await page.request.get(`/api/surveys/${spring}/readings?limit=1&sort=time`)).json()).items[0];
    const expected = formatClock(first.timestamp, 'Europe/London');
    await page.goto(`/surveys/${spring}`);
    const span = page.getByTestId('walk-span');
    await span.waitFor(LONG);
    expect(await span.innerText()).toContain(`From ${expected} to`);
    expect(await span.innerText()).toContain('Europe/London, BST');
    const row = page.locator('[data-testid="reading-row"]').first();
    await row.waitFor(LONG);
    expect(await row.innerText()).toContain(`${expected}:`);
    await expect.poll(() => page.getByRole('columnheader', { name: /Time \(Europe\/London, BST\)/ }).count()).toBe(1);
  });

  it('a new site\'s time zone starts at the browser\'s own', async () => {
    const page = await app.newPage({ timezoneId: 'America/Chicago' });
    await signInAs(page, 'surveyor@luxtrail.test');
    await page.goto('/surveys');
    const zone = page.getByLabel('Time zone');
    await zone.waitFor(LONG);
    expect(await zone.inputValue()).toBe('America/Chicago');
  });
});

describe('sign-in and sign-off leave no stale or noisy state', () => {
  it('the sign-in page logs no error to the console', async () => {
    const page = await app.newPage();
    const errors: string[] = [];
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor(LONG);
    await page.waitForLoadState('networkidle');
    expect(errors).toEqual([]);
  });

  it('after sign-off the page shows the signed record at once, even while the verdicts are fetched again', async () => {
    const page = await app.newPage();
    await signInAs(page, 'facilities@luxtrail.test');
    const autumn = await surveyIdByName(page, 'Autumn walk-through 2026');
    await page.goto(`/compliance/surveys/${autumn}`);
    await page.getByTestId('zone-table').waitFor(LONG);
    // Four counters always, "not assessed" too, even at zero.
    await page.goto('/compliance');
    const counters = page.getByRole('listitem').filter({ hasText: 'Fernmoor Community Library' }).getByLabel('Zones by verdict');
    await counters.waitFor(LONG);
    expect(await counters.innerText()).toMatch(/Not assessed/);
    await page.goto(`/compliance/surveys/${autumn}`);
    await page.getByTestId('zone-table').waitFor(LONG);
    // Hold back the verdicts' refetch: what shows meanwhile must already be the signed state.
    let release: () => void = () => {};
    const held = new Promise<void>((r) => { release = r; });
    // unroute below may settle a held request first; continuing it then is not an error of the page.
    await page.route(`**/api/surveys/${autumn}/compliance`, async (route) => { await held; await route.continue().catch(() => {}); });
    await page.getByRole('button', { name: 'Sign off…' }).click();
    await page.getByLabel('Comment (optional)').fill('Checked on site');
    await Promise.all([page.waitForResponse((r) => r.url().endsWith(`/api/surveys/${autumn}/sign-off`)), page.getByRole('button', { name: 'Confirm sign-off' }).click()]);
    const record = page.getByLabel('Signed record');
    await record.waitFor({ timeout: 10_000 });
    expect(await record.innerText()).toMatch(/Marguerite Oakhurst[\s\S]*Checked on site/);
    expect(await page.getByRole('button', { name: 'Confirm sign-off' }).count()).toBe(0);
    expect(await page.getByText('Submitted', { exact: true }).count()).toBe(0);
    release();
    await page.unroute(`**/api/surveys/${autumn}/compliance`);
  });
});

/** Signs in, opens the Autumn walk's map and waits until its readings are painted. */
async function openAutumnMap() {
  const page = await app.newPage();
  await signInAs(page, 'surveyor@luxtrail.test');
  const autumn = await surveyIdByName(page, 'Autumn walk-through 2026');
  await page.goto(`/surveys/${autumn}/map`);
  const map = page.getByTestId('survey-map');
  await expect.poll(() => map.getAttribute('data-painted-ms'), LONG).not.toBeNull();
  return { page, autumn, map };
}

/**
 * Every map label (zone names, isolux levels) drawn over a reading's marker centre, as text; the
 * markers' screen positions come from the API's plan metres and the plan image's box on screen.
 */
async function labelsOverPoints(page: Page, surveyId: number): Promise<{ labels: number; isolux: number; over: string[] }> {
  const labels = await page.locator('.zone-label, .isolux-label').evaluateAll((els) => els.map((e) => {
    const r = e.getBoundingClientRect();
    return { text: e.textContent ?? '', isolux: e.classList.contains('isolux-label'), l: r.left, r: r.right, t: r.top, b: r.bottom };
  }));
  const map = (await (await page.request.get(`/api/surveys/${surveyId}/map`)).json()) as { planId: number; readings: { xM: number; yM: number }[] };
  const plan = (await (await page.request.get(`/api/plans/${map.planId}`)).json()) as { widthM: number; heightM: number };
  // The plan image spans the plan's extent, so its box on screen maps plan metres to pixels.
  const img = await page.locator('[data-testid="survey-map"] .leaflet-image-layer').evaluate((e) => {
    const r = e.getBoundingClientRect();
    return { l: r.left, t: r.top, w: r.width, h: r.height };
  });
  const over: string[] = [];
  for (const { xM, yM } of map.readings) {
    const sx = img.l + (xM / plan.widthM) * img.w;
    const sy = img.t + (1 - yM / plan.heightM) * img.h;
    for (const b of labels) {
      if (sx > b.l + 1 && sx < b.r - 1 && sy > b.t + 1 && sy < b.b - 1) over.push(`"${b.text}" over point (${xM}, ${yM})`);
    }
  }
  return { labels: labels.length, isolux: labels.filter((b) => b.isolux).length, over };
}

describe('the survey map', () => {
  it('an open popup follows the unit switch', async () => {
    const { page } = await openAutumnMap();
    const finder = page.getByLabel('Find a point');
    await finder.selectOption({ index: 1 });
    const popup = page.locator('.leaflet-popup').filter({ hasText: 'Point ' });
    await popup.waitFor(LONG);
    expect(await popup.innerText()).toMatch(/\d lx/);
    await page.getByRole('radio', { name: 'foot-candles' }).click();
    await expect.poll(() => popup.innerText()).toMatch(/\d fc/);
    expect(await popup.innerText()).not.toMatch(/\d lx/);
    await page.locator('.leaflet-popup-close-button').click();
  });

  // Issue #17, item 10: at the map's first zoom the "Study tables" label used to sit on the point
  // at (11.46, 5.31) (no free place inside the zone or just outside it); checked again zoomed in.
  it('no zone or isolux label sits on a point, at the first zoom and zoomed in', async () => {
    const { page, autumn } = await openAutumnMap();
    const first = await labelsOverPoints(page, autumn);
    expect(first.labels).toBeGreaterThan(3);
    expect(first.over).toEqual([]);

    const imageWidth = () => page.locator('[data-testid="survey-map"] .leaflet-image-layer').evaluate((e) => e.getBoundingClientRect().width);
    const before = await imageWidth();
    await page.getByRole('button', { name: 'Zoom in' }).click();
    await expect.poll(imageWidth, LONG).toBeGreaterThan(before * 1.9);
    // Labels are placed again for the new zoom: poll until the placement has settled on no covered point.
    await expect.poll(async () => (await labelsOverPoints(page, autumn)).over, LONG).toEqual([]);
    expect((await labelsOverPoints(page, autumn)).labels).toBeGreaterThan(3);
  });
});
