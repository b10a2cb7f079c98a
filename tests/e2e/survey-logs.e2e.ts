import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

const sample = (name: string) => path.resolve(__dirname, '../../public/samples', name);

describe('survey logs in a real browser', () => {
  it('lets a surveyor create a survey, upload a log to done, see the over-range point, switch to foot-candles, and read a broken file\'s errors', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    await page.goto('/surveys');
    const form = page.getByRole('form', { name: 'Start a survey' });
    await form.getByLabel('Site').selectOption({ label: 'Fernmoor Community Library' });
    await form.getByLabel('Survey name').fill('Browser walk-through');
    await form.getByRole('button', { name: 'Start survey' }).click();
    await page.getByRole('heading', { name: 'Browser walk-through' }).waitFor();

    // The sample log names each row's plan; the upload's plan choice stays on the log's column.
    const planChoice = page.getByLabel('Plan of the readings');
    await expect.poll(() => planChoice.locator('option').allTextContents(), { timeout: 10_000 }).toEqual(['From the log\'s plan column', 'Ground floor', 'First floor', 'Car park and entrance']);
    expect(await planChoice.inputValue()).toBe('');
    await page.getByLabel('Meter log (CSV)').setInputFiles(sample('library-walk.csv'));
    await page.getByRole('button', { name: 'Upload log' }).click();
    await page.getByRole('progressbar', { name: 'Processing: done' }).waitFor({ timeout: 30_000 });
    expect(await page.getByRole('progressbar', { name: 'Transfer' }).getAttribute('aria-valuenow')).toBe('100');
    expect(await page.getByRole('progressbar', { name: 'Processing: done' }).getAttribute('aria-valuenow')).toBe('100');
    await page.getByRole('status').getByText(/readings added/).waitFor();

    const readings = page.getByRole('table', { name: 'Readings' });
    await readings.waitFor();
    await page.getByLabel('Flag', { exact: true }).selectOption('over_range');
    await page.getByRole('status').getByText('1 reading', { exact: true }).waitFor();
    const row = readings.getByRole('row').filter({ hasText: 'EC-01' });
    await row.getByText('Over range').waitFor();
    const luxCell = await row.getByRole('cell').nth(4).textContent();
    expect(luxCell).toMatch(/^≥ /); // a lower bound, not a value

    await page.getByRole('radio', { name: 'foot-candles' }).first().click();
    await readings.getByRole('columnheader', { name: 'Illuminance (fc)' }).waitFor();
    const fcCell = await row.getByRole('cell').nth(4).textContent();
    // 1 fc = 10.7639 lx: the same bound, about a tenth of the lux figure.
    const num = (s: string | null) => Number((s ?? '').replace(/[^\d.]/g, ''));
    expect(num(fcCell)).toBeCloseTo(num(luxCell) / 10.7639104167, -2);
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-page.png'), fullPage: true });

    await page.getByLabel('Meter log (CSV)').setInputFiles(sample('broken-log.csv'));
    await page.getByRole('button', { name: 'Upload log' }).click();
    const problems = page.getByRole('table', { name: 'Problems in broken-log.csv' });
    await problems.waitFor({ timeout: 30_000 });
    const lines = await problems.locator('tbody tr td:first-child').allTextContents();
    expect(lines).toEqual(['3', '4', '5', '6', '7', '8']);
    await problems.getByText(/LX-9999 is not registered/).waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'survey-import-errors.png'), fullPage: true });
  });
});
