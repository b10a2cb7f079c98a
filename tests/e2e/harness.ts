import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import net from 'node:net';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const DEMO_PASSWORD = 'luxtrail-demo';
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export type E2eApp = { baseUrl: string; dataDir: string; browser: Browser; stop: () => Promise<void>; newPage: (opts?: { width?: number; height?: number; timezoneId?: string; serviceWorkers?: 'allow' | 'block' }) => Promise<Page>; serverLog: () => string };

/**
 * Starts the built app (`npm run build` must have run: test:e2e does it) on a free port with
 * a fresh database and demo data, and a headless Debian Chromium with a fresh profile.
 */
export async function startE2eApp(): Promise<E2eApp> {
  const port = await freePort();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-e2e-'));
  let log = '';
  const server: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DATA_DIR: dataDir, DATABASE_URL: path.join(dataDir, 'e2e.db'), PUBLIC_URL: `http://localhost:${port}`, LOG_LEVEL: 'warn', NODE_ENV: 'production' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  server.stdout?.on('data', (d) => { log += d; });
  server.stderr?.on('data', (d) => { log += d; });
  const baseUrl = `http://localhost:${port}`;
  const deadline = Date.now() + 120_000; // a busy 2-core machine seeds slowly
  for (;;) {
    if (server.exitCode !== null) throw new Error(`server exited early:\n${log}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) break;
    } catch { /* not up yet */ }
    if (Date.now() > deadline) throw new Error(`server did not start within 120 s:\n${log}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    // Playwright gives each launch a fresh, empty user-data dir of its own.
  });
  const contexts: BrowserContext[] = [];
  return {
    baseUrl,
    dataDir,
    browser,
    serverLog: () => log,
    async newPage(opts = {}) {
      // The app's service worker is blocked unless a test asks for it (the offline test): request
      // routing in the other tests must see every request the page makes.
      const context = await browser.newContext({ baseURL: baseUrl, viewport: { width: opts.width ?? 1280, height: opts.height ?? 860 }, serviceWorkers: opts.serviceWorkers ?? 'block', ...(opts.timezoneId ? { timezoneId: opts.timezoneId } : {}) });
      contexts.push(context);
      return context.newPage();
    },
    async stop() {
      for (const c of contexts) await c.close().catch(() => {});
      await browser.close().catch(() => {});
      server.kill('SIGTERM');
      await new Promise((r) => server.once('exit', r));
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Signs in through the real form and waits for the shell. */
export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // The shell: the sidebar's navigation on a desktop, the menu button at phone width (the sidebar is hidden there).
  await page.getByRole('navigation', { name: 'Main' }).or(page.getByRole('button', { name: 'Open menu' })).filter({ visible: true }).first().waitFor();
}

/** Names of the main navigation's links, in order. */
export async function navLabels(page: Page): Promise<string[]> {
  const nav = page.locator('aside').getByRole('navigation', { name: 'Main' });
  return (await nav.getByRole('link').allInnerTexts()).map((s) => s.trim());
}

export const screenshotDir = () => {
  const dir = path.resolve('tests/e2e/screenshots');
  fs.mkdirSync(dir, { recursive: true });
  return dir;
};
