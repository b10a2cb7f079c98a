import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

const SERIAL = 'E2E-7001';
const SAMPLE = path.resolve('public/samples/bench-run-sample.csv');

describe('calibration workspace in a real browser', () => {
  it('registers a four-step probe, fits a bench run, drafts a set, has a colleague approve it, and shows the new due date', async () => {
    const page = await app.newPage();
    await signInAs(page, 'calibration@luxtrail.test');

    // A probe with four gain steps (the form starts with two).
    await page.goto('/calibration/probes/new');
    const form = page.getByRole('form', { name: 'New probe' });
    await form.getByLabel('Serial number').fill(SERIAL);
    await form.getByLabel('Description').fill('Browser-test tripod probe');
    await form.getByRole('button', { name: 'Add gain step' }).click();
    await form.getByRole('button', { name: 'Add gain step' }).click();
    expect(await form.getByLabel('Nominal gain (step 4)').inputValue()).toBe('512');
    await form.getByRole('button', { name: 'Register probe' }).click();
    await page.getByRole('heading', { name: SERIAL }).waitFor();
    await page.getByText('0: ×1, 1: ×8, 2: ×64, 3: ×512').waitFor();

    // Bench run: upload the shipped sample, land on the fit with its charts.
    await page.getByLabel('Bench CSV').setInputFiles(SAMPLE);
    await page.getByRole('button', { name: 'Upload and fit' }).click();
    await page.getByRole('heading', { name: /Bench run #\d+/ }).waitFor();
    const table = page.getByRole('table', { name: 'Fit per gain code' });
    expect(await table.getByRole('row').count()).toBe(5);
    const chart = page.getByRole('img', { name: /Counts against reference illuminance, gain code 0/ });
    await chart.locator('.recharts-surface').first().waitFor();
    expect(await chart.locator('.recharts-scatter-symbol').count()).toBe(6);
    await page.getByRole('radio', { name: /Code 3/ }).click();
    await page.getByRole('img', { name: /Residuals for gain code 3/ }).locator('.recharts-scatter-symbol').first().waitFor();
    await page.screenshot({ path: path.join(screenshotDir(), 'calibration-bench-run.png'), fullPage: true });

    // Draft from the fit.
    const draft = page.getByRole('form', { name: 'Draft a coefficient set from this fit' });
    await draft.getByLabel('Due date').fill('2027-06-30');
    await draft.getByLabel('Certificate number').fill('E2E-CERT-0001');
    await draft.getByRole('button', { name: 'Draft a coefficient set from this fit' }).click();
    await page.getByRole('heading', { name: SERIAL }).waitFor();
    const version = page.getByRole('listitem', { name: 'Version 1' });
    await version.getByText('Draft', { exact: true }).waitFor();
    expect(await version.getByRole('button', { name: 'Approve version 1' }).isDisabled()).toBe(true);
    const probeUrl = page.url();

    // A second calibration user approves it (four-eyes).
    const colleague = await app.newPage();
    await signInAs(colleague, 'calibration2@luxtrail.test');
    await colleague.goto(probeUrl);
    const theirs = colleague.getByRole('listitem', { name: 'Version 1' });
    await theirs.getByRole('button', { name: 'Approve version 1' }).click();
    // Approval cannot be undone, so it asks first.
    await theirs.getByRole('button', { name: 'Approve for good' }).click();
    await theirs.getByText('Approved', { exact: true }).waitFor();
    await theirs.getByText(/approved by Osric Penhallow/).waitFor();

    // The dashboard shows the new due date.
    await colleague.goto('/calibration');
    await colleague.getByLabel('Search').fill(SERIAL);
    const row = colleague.getByRole('row').filter({ hasText: SERIAL });
    await row.getByText('30 Jun 2027').waitFor();
    expect(await row.getByText('In calibration').isVisible()).toBe(true);
    expect(await row.getByText('v1').isVisible()).toBe(true);
    await colleague.screenshot({ path: path.join(screenshotDir(), 'calibration-dashboard.png'), fullPage: true });
  });

  it('filters the dashboard to overdue probes and shows the audit trail of one probe', async () => {
    const page = await app.newPage();
    await signInAs(page, 'calibration@luxtrail.test');
    // Phone width: the table scrolls sideways, the filters wrap.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto('/calibration');
    await page.getByRole('button', { name: /Overdue/ }).click();
    const rows = page.getByRole('table', { name: 'Calibration due dates' }).locator('tbody tr');
    await rows.first().waitFor();
    expect(await rows.allInnerTexts()).toEqual([expect.stringContaining('LX-3990')]);
    await page.getByRole('link', { name: 'LX-3990' }).click();
    await page.getByRole('link', { name: 'Audit trail' }).first().click();
    await page.getByText(/Priya Calloway drafted coefficient set/).first().waitFor();
    expect(await page.getByText(/Osric Penhallow approved coefficient set/).count()).toBeGreaterThan(0);
    expect(await page.getByText(/of probe LX-3990/).count()).toBeGreaterThan(2);
    expect(await page.getByText(/of probe LX-4102/).count()).toBe(0);
  });
});
