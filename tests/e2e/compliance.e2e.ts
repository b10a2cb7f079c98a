import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import { startE2eApp, signInAs, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

describe('verdicts, sign-off and the report in a real browser', () => {
  // A long journey (two sign-ins, a PDF rendered at sign-off): a generous limit for a busy machine.
  it('a facility manager opens the demo site, finds a zone falling short, signs the survey off and the report reaches the outbox', { timeout: 180_000 }, async () => {
    const page = await app.newPage();
    await signInAs(page, 'facilities@luxtrail.test');
    await page.locator('aside').getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Verdicts' }).click();
    await page.getByRole('heading', { name: 'Sites and verdicts' }).waitFor();
    const site = page.getByRole('listitem').filter({ hasText: 'Fernmoor Community Library' });
    await site.getByRole('link', { name: /Autumn walk-through 2026/ }).click();

    // The zone table, worst first, with the rule printed above it.
    const table = page.getByTestId('zone-table');
    await table.waitFor();
    await expect.poll(() => page.getByTestId('rule-note').innerText()).toMatch(/Decision rule: Guarded/);
    const corridor = table.getByRole('row').filter({ has: page.getByRole('link', { name: 'Corridor', exact: true }) });
    await expect.poll(() => corridor.innerText()).toMatch(/Falls short/);
    const shortRows = await table.getByRole('row').filter({ hasText: 'Falls short' }).count();
    expect(shortRows).toBeGreaterThanOrEqual(1);
    // The spring walk-through was signed off by the seed: the change column is there.
    await expect.poll(() => page.getByRole('columnheader', { name: 'Since last sign-off' }).count()).toBe(1);
    await page.screenshot({ path: path.join(screenshotDir(), 'compliance-survey.png'), fullPage: true });

    // The zone: points, statistics, target and its source.
    await corridor.getByRole('link', { name: 'Corridor', exact: true }).click();
    await page.getByRole('heading', { name: 'Corridor', level: 1 }).waitFor();
    await expect.poll(() => page.getByText('Corridors and circulation areas').count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByText(/EN 12464-1/).count()).toBeGreaterThan(0);
    expect(await page.getByRole('table', { name: 'Points of the zone' }).getByRole('row').count()).toBeGreaterThan(10);
    await page.getByRole('link', { name: 'Back to the survey' }).click();

    // Sign off the submitted survey.
    await page.getByRole('button', { name: 'Sign off…' }).click();
    await page.getByLabel('Comment (optional)').fill('Corridor relamping to be scheduled');
    await page.getByRole('button', { name: 'Confirm sign-off' }).click();
    await expect.poll(() => page.getByText('Signed off', { exact: true }).count(), { timeout: 20_000 }).toBeGreaterThan(0);
    await expect.poll(() => page.getByTestId('rule-note').innerText()).toMatch(/frozen at sign-off/);

    // The facility manager cannot read the outbox; the admin finds the signed-off report there.
    const admin = await app.newPage();
    await signInAs(admin, 'admin@luxtrail.test');
    await admin.goto('/outbox');
    const mail = admin.getByRole('button', { name: /Survey signed off: Fernmoor Community Library, Autumn walk-through 2026/ });
    await mail.first().waitFor();
    // The newest message opens by itself; open it only if it is closed.
    if ((await mail.first().getAttribute('aria-expanded')) !== 'true') await mail.first().click();
    const attachment = admin.getByRole('link', { name: /luxtrail-report-.*autumn-walk-through-2026-signed-\d{4}-\d{2}-\d{2}\.pdf/ }).first();
    await attachment.waitFor();
    const href = await attachment.getAttribute('href');
    const pdf = await admin.request.get(href!);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
  });
  it('the commissioned office shows its desk cluster\'s surrounding and background bands on the plan, each with its verdict in words, and they can be hidden', { timeout: 120_000 }, async () => {
    const page = await app.newPage();
    await signInAs(page, 'facilities@luxtrail.test');
    await page.goto('/compliance');
    await page.getByRole('heading', { name: 'Sites and verdicts' }).waitFor();
    const site = page.getByRole('listitem').filter({ hasText: 'Fernmoor Trust office, Kiln Street' });
    await site.getByRole('link').first().click();
    await page.getByTestId('zone-table').waitFor();
    const legend = page.getByTestId('task-bands-legend');
    await legend.waitFor({ timeout: 60_000 });
    await expect.poll(() => legend.innerText()).toMatch(/Desk cluster, immediate surrounding area \([\d.]+ m²\): /);
    await expect.poll(() => legend.innerText()).toMatch(/Desk cluster, background area \([\d.]+ m²\): /);
    // Drawn on the plan: one dash-dotted (surrounding) and one dotted (background) outline.
    const dashed = page.locator('.leaflet-overlay-pane path[stroke-dasharray="10 3 2 3"]');
    const dotted = page.locator('.leaflet-overlay-pane path[stroke-dasharray="1 5"]');
    await expect.poll(() => dashed.count()).toBe(1);
    await expect.poll(() => dotted.count()).toBe(1);
    await page.getByLabel('Bands around task areas').uncheck();
    await expect.poll(() => dashed.count()).toBe(0);
    await expect.poll(() => legend.count()).toBe(0);
  });
});
