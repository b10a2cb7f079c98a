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

type Box = { l: number; r: number; t: number; b: number };
const intersects = (a: Box, b: Box) => a.l < b.r && b.l < a.r && a.t < b.b && b.t < a.b;

describe('the survey list and a new site', () => {
  // Issue #17, item 8: "Newest first" sorted by creation. Two surveys created in the opposite order of their start dates.
  it('lists surveys newest first by their start date, not by when they were created', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const create = async (name: string, startedOn: string) => {
      await page.goto('/surveys');
      const form = page.getByRole('form', { name: 'Start a survey' });
      await form.getByLabel('Survey name').fill(name);
      await form.getByLabel('Started on (optional)').fill(startedOn);
      await form.getByRole('button', { name: 'Start survey' }).click();
      await page.getByRole('heading', { name }).waitFor(LONG);
    };
    await create('Order check, started later', '2019-06-02');
    await create('Order check, started earlier', '2019-06-01');
    await page.goto('/surveys');
    const names = page.locator('table.stack-table tbody tr td[data-lead]');
    await names.first().waitFor(LONG);
    await expect.poll(() => names.allInnerTexts(), LONG).toContain('Order check, started earlier');
    const order = await names.allInnerTexts();
    expect(order.indexOf('Order check, started later')).toBeLessThan(order.indexOf('Order check, started earlier'));
    // The demo's autumn walk (started 2026) comes before both.
    expect(order.indexOf('Autumn walk-through 2026')).toBeLessThan(order.indexOf('Order check, started later'));
  });
});

/**
 * A new survey of the demo library holding a short log on the ground floor: LX-4102 (demo probe:
 * dark about 90 counts and a floor of 200 at code 3, so 100 counts there is under range; 65,535
 * counts at code 0 is past its saturation of 65,000, so over range), readings at all four gain
 * codes, and point CH-R measured twice.
 */
async function surveyWithChartLog(name: string) {
  const page = await app.newPage();
  await signInAs(page, 'surveyor@luxtrail.test');
  await page.goto('/surveys');
  const form = page.getByRole('form', { name: 'Start a survey' });
  await form.getByLabel('Site').selectOption({ label: 'Fernmoor Community Library' });
  await form.getByLabel('Survey name').fill(name);
  await form.getByRole('button', { name: 'Start survey' }).click();
  await page.getByRole('heading', { name }).waitFor(LONG);
  const log = [
    'timestamp,probe,point,gain,counts,x_m,y_m,plan',
    '2026-11-25T10:00:00Z,LX-4102,CH-1,2,16061,2,2,Ground floor',
    '2026-11-25T10:00:30Z,LX-4102,CH-2,1,20000,4,2,Ground floor',
    '2026-11-25T10:01:00Z,LX-4102,CH-3,3,30000,6,2,Ground floor',
    '2026-11-25T10:01:30Z,LX-4102,CH-4,0,65535,8,2,Ground floor',
    '2026-11-25T10:02:00Z,LX-4102,CH-5,3,100,10,2,Ground floor',
    '2026-11-25T10:02:30Z,LX-4102,CH-R,2,8000,12,2,Ground floor',
    '2026-11-25T10:09:30Z,LX-4102,CH-R,2,8000,12,2,Ground floor',
    '',
  ].join('\n');
  await page.getByLabel('Meter log (CSV)').setInputFiles({ name: 'chart-log.csv', mimeType: 'text/csv', buffer: Buffer.from(log) });
  await page.getByRole('button', { name: 'Upload log' }).click();
  await page.getByRole('progressbar', { name: 'Processing: done' }).waitFor(LONG);
  return { page, surveyId: Number(new URL(page.url()).pathname.split('/').pop()) };
}

describe('charts', () => {
  // Issue #17, item 12: the walk chart's marks, legend and gain panel.
  it('the walk chart draws under range as ▼ and over range as a whole ▲, its legend in the marks\' colours, and labels every gain code used', async () => {
    const { page, surveyId } = await surveyWithChartLog('Chart marks check');
    const series = (await (await page.request.get(`/api/surveys/${surveyId}/readings/series`)).json()) as { items: { flag: string; role: string; gainCode: number | null }[] };
    expect(series.items.map((p) => p.flag)).toEqual(expect.arrayContaining(['under_range', 'over_range']));

    const figure = page.getByRole('figure', { name: /Illuminance over the walk/ });
    await figure.locator('.recharts-surface').first().waitFor(LONG);
    const marks = await figure.evaluate((f) => {
      const [upper, lower] = [...f.querySelectorAll('svg.recharts-surface')];
      const box = (e: Element) => { const r = e.getBoundingClientRect(); return { l: r.left, r: r.right, t: r.top, b: r.bottom }; };
      const plot = upper.querySelector('.recharts-cartesian-grid')!;
      const legend = Object.fromEntries([...f.querySelectorAll('[aria-label="Chart legend"] li')].map((li) => {
        const symbol = li.querySelector('span');
        return [li.textContent!.trim(), symbol ? getComputedStyle(symbol).color : null];
      }));
      const colourOf = (hex: string) => { const s = document.createElement('span'); s.style.color = hex; document.body.append(s); const c = getComputedStyle(s).color; s.remove(); return c; };
      return {
        plot: box(plot),
        over: [...upper.querySelectorAll('path[fill="#dc2626"]')].map(box),
        under: [...upper.querySelectorAll('path[fill="#7c3aed"]')].map(box),
        overFill: colourOf('#dc2626'), underFill: colourOf('#7c3aed'), taskFill: colourOf('#d97706'),
        legend,
        gainTicks: [...lower.querySelectorAll('.recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value')].map((t) => t.textContent),
      };
    });
    expect(marks.under.length, 'under-range marks (▼)').toBe(series.items.filter((p) => p.flag === 'under_range').length);
    expect(marks.over.length, 'over-range marks (▲)').toBe(series.items.filter((p) => p.flag === 'over_range').length);
    for (const m of [...marks.over, ...marks.under]) {
      expect(m.t, 'a bound mark is not cut at the top').toBeGreaterThanOrEqual(marks.plot.t - 0.5);
      expect(m.b, 'nor at the bottom').toBeLessThanOrEqual(marks.plot.b + 0.5);
    }
    expect(marks.legend['▼ under range (at most)']).toBe(marks.underFill);
    expect(marks.legend['▲ over range (at least)']).toBe(marks.overFill);
    expect(marks.legend['● task readings']).toBe(marks.taskFill);
    const codes = [...new Set(series.items.filter((p) => p.role === 'task' && p.gainCode !== null).map((p) => String(p.gainCode)))].sort();
    expect(codes.length).toBeGreaterThanOrEqual(4);
    expect([...marks.gainTicks].sort()).toEqual(codes);
  });

  // Issue #17, item 12: the bench-run charts' tooltips, residual ticks and counts axis title.
  it('the bench-run charts name each quantity with its unit in the tooltip, tick residuals at round values, and keep the counts title off its ticks', async () => {
    const page = await app.newPage();
    await signInAs(page, 'calibration@luxtrail.test');
    const serial = `E2E-CH-${Date.now().toString(36).toUpperCase()}`;
    const created = await page.evaluate(async (s) => {
      const res = await fetch('/api/probes', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({
        serial: s, kind: 'counts', description: 'Chart check probe', fullScaleCounts: 65535, saturationCounts: 65000, floorCounts: 200,
        gains: [{ code: 0, nominalGain: 1 }, { code: 1, nominalGain: 8 }, { code: 2, nominalGain: 64 }, { code: 3, nominalGain: 512 }],
      }) });
      return { status: res.status, id: (await res.json()).id as number };
    }, serial);
    expect(created.status).toBe(201);
    await page.goto(`/calibration/probes/${created.id}`);
    await page.getByLabel('Bench CSV').setInputFiles(path.resolve(__dirname, '../../public/samples/bench-run-sample.csv'));
    await page.getByRole('button', { name: 'Upload and fit' }).click();
    await page.getByRole('heading', { name: /Bench run #\d+/ }).waitFor(LONG);

    const counts = page.getByRole('img', { name: /Counts against reference illuminance, gain code 0/ });
    const residuals = page.getByRole('img', { name: /Residuals for gain code 0/ });
    await counts.locator('.recharts-scatter-symbol').first().waitFor(LONG);
    await residuals.locator('.recharts-scatter-symbol').first().waitFor(LONG);

    // Tooltip: named quantities with units, at most six significant figures (not "x : 119857").
    await counts.locator('.recharts-scatter-symbol').nth(2).hover();
    const tip = counts.locator('.recharts-tooltip-wrapper');
    await expect.poll(() => tip.innerText(), LONG).toMatch(/Reference [\d,.]+ lx/);
    const text = await tip.innerText();
    expect(text).toMatch(/Measured: [\d,.]+ counts/);
    expect(text).toMatch(/Fitted line: [\d,.]+ counts/);
    for (const n of text.match(/\d[\d,]*(\.\d+)?/g) ?? []) expect(n.replace(/[,.]/g, '').replace(/^0+/, '').length, `${n} has at most 6 significant figures`).toBeLessThanOrEqual(6);
    await residuals.locator('.recharts-scatter-symbol').first().hover();
    await expect.poll(() => residuals.locator('.recharts-tooltip-wrapper').innerText(), LONG).toMatch(/Residual: −?-?[\d,.]+ counts/);

    // Residual ticks: symmetric about zero, one step apart, the step 1, 2, 2.5 or 5 times a power of ten.
    const ticks = (await residuals.locator('.recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value').allTextContents()).map((s) => Number(s.replace('−', '-').replace(/,/g, '')));
    expect(ticks.length).toBeGreaterThanOrEqual(3);
    expect(ticks).toContain(0);
    expect(ticks[0]).toBe(-ticks[ticks.length - 1]);
    const step = Math.abs(ticks[1] - ticks[0]);
    const mantissa = step / 10 ** Math.floor(Math.log10(step));
    expect([1, 2, 2.5, 5].some((m) => Math.abs(m - mantissa) < 1e-9), `step ${step}`).toBe(true);
    for (let i = 1; i < ticks.length; i++) expect(Math.abs(ticks[i] - ticks[i - 1] - (ticks[1] - ticks[0]))).toBeLessThan(1e-9);

    // The counts axis title and its tick labels do not overlap.
    const layout = await counts.evaluate((f) => {
      const box = (e: Element) => { const r = e.getBoundingClientRect(); return { l: r.left, r: r.right, t: r.top, b: r.bottom }; };
      const title = [...f.querySelectorAll('text.recharts-label')].find((t) => t.textContent === 'Counts')!;
      return { title: box(title), ticks: [...f.querySelectorAll('.recharts-yAxis-tick-labels .recharts-cartesian-axis-tick-value')].map(box) };
    });
    expect(layout.ticks.length).toBeGreaterThan(2);
    for (const t of layout.ticks) expect(intersects(layout.title, t), 'counts title over a tick label').toBe(false);
  });

  // Issue #17, item 12: "Find a point" listed the roof reference many times with nothing to tell the entries apart.
  it('"Find a point" tells apart the entries of a point measured more than once by their time', async () => {
    const { page, surveyId } = await surveyWithChartLog('Find a point check');
    await page.goto(`/surveys/${surveyId}/map`);
    const finder = page.getByLabel('Find a point');
    await expect.poll(() => finder.locator('option').count(), LONG).toBeGreaterThan(5);
    const options = (await finder.locator('option').allTextContents()).slice(1);
    const repeated = options.filter((o) => o.startsWith('CH-R · '));
    expect(repeated).toHaveLength(2);
    for (const e of repeated) expect(e).toMatch(/^CH-R · \d{2}:\d{2}:\d{2} · /);
    expect(new Set(repeated).size).toBe(2);
    // Measured once: no time needed.
    expect(options.find((o) => o.startsWith('CH-1 · '))).toMatch(/^CH-1 · [\d,.]+ lx$/);
  });
});
