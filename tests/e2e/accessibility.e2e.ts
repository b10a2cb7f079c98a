import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { startE2eApp, signInAs, type E2eApp } from './harness';

// axe-core (the open-source accessibility engine) injected into each page; WCAG 2 A/AA rules.
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

type Violation = { id: string; impact: string | null; help: string; nodes: { target: string[] }[] };

async function seriousViolations(page: Page): Promise<Violation[]> {
  // Evaluated through the debugging protocol: the app's Content-Security-Policy rightly refuses inline scripts.
  await page.evaluate(axeSource);
  const result = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: Violation[] }> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa'] } });
  });
  return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

const describeViolations = (vs: Violation[]) => vs.map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

describe('accessibility of the main pages (axe-core, WCAG 2 A and AA)', () => {
  it('has no serious or critical violations on the sign-in page', async () => {
    const page = await app.newPage();
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(describeViolations(await seriousViolations(page))).toEqual([]);
  });

  const pages: [string, string, string][] = [
    ['admin@luxtrail.test', '/', 'Hello, Imogen'],
    ['admin@luxtrail.test', '/users', 'People'],
    ['admin@luxtrail.test', '/outbox', 'reminders and reports'],
    ['surveyor@luxtrail.test', '/surveys', 'Surveys'],
    ['calibration@luxtrail.test', '/calibration', 'Calibration due dates'],
    ['facilities@luxtrail.test', '/compliance', 'Sites and verdicts'],
    ['admin@luxtrail.test', '/targets', 'Targets'],
    // Demo ids are stable on a fresh database: survey 3 is the autumn walk, probe 1 is LX-4102.
    ['surveyor@luxtrail.test', '/surveys/3', 'The walk'],
    ['surveyor@luxtrail.test', '/surveys/3/map?planId=1', 'Layers'],
    ['facilities@luxtrail.test', '/compliance/surveys/3', 'Zones, worst first'],
    ['calibration@luxtrail.test', '/calibration/probes/1', 'Coefficient sets'],
    ['facilities@luxtrail.test', '/compliance/maintenance', 'Maintenance due'],
    ['facilities@luxtrail.test', '/emergency', 'Tests due'],
    ['admin@luxtrail.test', '/emergency/criteria', 'Test schedule'],
    ['admin@luxtrail.test', '/emergency/plans/1', 'On this plan'],
    // Surveys found by name (their ids depend on the seed steps before them): the emergency night
    // test, and the label walk's planned points on the survey map and on the ground-floor plan (plan 1).
    ['facilities@luxtrail.test', '/emergency/surveys/{night}', 'Criteria, conditions and passes'],
    ['surveyor@luxtrail.test', '/surveys/{labelWalk}/map?planId=1', 'Readings without a place'],
    ['surveyor@luxtrail.test', '/plans/1?survey={labelWalk}', 'Readings without a place'],
  ];
  const surveyNames: Record<string, string> = { night: 'Emergency lighting night test', labelWalk: 'Ground-floor offices, label walk 2026' };
  async function resolvePath(page: Page, path: string): Promise<string> {
    const found = /\{(\w+)\}/.exec(path);
    if (!found) return path;
    const items = (await (await page.request.get('/api/surveys')).json()).items as { id: number; name: string }[];
    const survey = items.find((x) => x.name === surveyNames[found[1]]);
    expect(survey, `demo survey "${surveyNames[found[1]]}"`).toBeDefined();
    return path.replace(found[0], String(survey!.id));
  }
  for (const [email, path, heading] of pages) {
    it(`has no serious or critical violations on ${path} for ${email}`, async () => {
      const page = await app.newPage();
      await signInAs(page, email);
      await page.goto(await resolvePath(page, path));
      await page.getByText(heading).first().waitFor();
      await page.waitForLoadState('networkidle');
      expect(describeViolations(await seriousViolations(page))).toEqual([]);
    });
  }

  it('at 390 px, no page of the list scrolls sideways (a wide table scrolls inside its own box)', async () => {
    const wider: string[] = [];
    for (const email of new Set(pages.map(([e]) => e))) {
      const page = await app.newPage({ width: 390, height: 844 });
      await signInAs(page, email);
      for (const [, path, heading] of pages.filter(([e]) => e === email)) {
        await page.goto(await resolvePath(page, path));
        // At phone width the navigation is folded away: wait for the page's own text.
        await page.getByText(heading).filter({ visible: true }).first().waitFor();
        await page.waitForLoadState('networkidle');
        const w = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
        if (w.scroll > w.client) wider.push(`${path} for ${email}: ${w.scroll} px wide`);
      }
      await page.close();
    }
    expect(wider).toEqual([]);
  }, 240_000);

  it('reaches the main navigation and the unit switch by keyboard alone', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    const reached: string[] = [];
    for (let i = 0; i < 12; i++) {
      await page.keyboard.press('Tab');
      reached.push(await page.evaluate(() => (document.activeElement as HTMLElement | null)?.innerText?.trim() ?? ''));
    }
    expect(reached).toContain('Skip to content');
    expect(reached).toContain('Surveys');
    expect(reached.some((t) => t === 'foot-candles')).toBe(true);
  });
});
