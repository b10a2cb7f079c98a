import { describe, it, expect } from 'vitest';
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { loadConfig, ConfigError } from '@server/config';

function tmpDir() { return fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-cfg-')); }

describe('configuration read once from the environment', () => {
  it('uses the documented defaults and generates a session secret it keeps', () => {
    const dir = tmpDir();
    const a = loadConfig({ DATA_DIR: dir });
    const b = loadConfig({ DATA_DIR: dir });
    expect(a.port).toBe(3000);
    expect(a.databaseUrl).toBe('data/luxtrail.db');
    expect(a.smtpUrl).toBeNull();
    expect(a.publicUrl).toBe('http://localhost:3000');
    expect(a.sessionSecret.length).toBeGreaterThanOrEqual(32);
    expect(b.sessionSecret).toBe(a.sessionSecret);
    expect(a.secureCookies).toBe(false);
  });

  it('fails fast naming every bad variable', () => {
    expect(() => loadConfig({ DATA_DIR: tmpDir(), PORT: 'eighty', SMTP_URL: 'not a url' })).toThrow(ConfigError);
    try {
      loadConfig({ DATA_DIR: tmpDir(), PORT: 'eighty', SMTP_URL: 'not a url' });
    } catch (err) {
      expect((err as Error).message).toMatch(/PORT/);
      expect((err as Error).message).toMatch(/SMTP_URL/);
    }
  });

  it('marks cookies Secure when the public URL is https', () => {
    expect(loadConfig({ DATA_DIR: tmpDir(), PUBLIC_URL: 'https://luxtrail.example' }).secureCookies).toBe(true);
  });
});

function runServer(env: Record<string, string>) {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  child.stdout.on('data', (d) => { out += d; });
  child.stderr.on('data', (d) => { out += d; });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  return { child, exited, output: () => out };
}

describe('the server process', () => {
  it('exits with a clear message when the environment is invalid', async () => {
    const s = runServer({ DATA_DIR: tmpDir(), PORT: 'not-a-port' });
    expect(await s.exited).toBe(1);
    expect(s.output()).toMatch(/Luxtrail cannot start: the environment is invalid/);
    expect(s.output()).toMatch(/PORT/);
  }, 30_000);

  it('starts on an empty database, seeds it, serves, and shuts down cleanly on SIGTERM', async () => {
    const dir = tmpDir();
    fs.mkdirSync('dist', { recursive: true });
    const hadIndex = fs.existsSync('dist/index.html');
    if (!hadIndex) fs.writeFileSync('dist/index.html', '<!doctype html><title>placeholder</title>');
    const s = runServer({ DATA_DIR: dir, DATABASE_URL: path.join(dir, 'db.sqlite'), PORT: '0' });
    try {
      // Seeding the demo on a busy 2-core machine can take a minute; the deadline only bounds a hang.
      const deadline = Date.now() + 100_000;
      while (!/serving on http:\/\/localhost:(\d+)/.test(s.output())) {
        if (Date.now() > deadline) throw new Error(`did not start: ${s.output()}`);
        await new Promise((r) => setTimeout(r, 100));
      }
      const port = /serving on http:\/\/localhost:(\d+)/.exec(s.output())![1];
      expect(s.output()).toMatch(/demo data seeded/);
      const health = await fetch(`http://localhost:${port}/api/health`);
      expect(health.status).toBe(200);
      s.child.kill('SIGTERM');
      expect(await s.exited).toBe(0);
      expect(fs.existsSync(path.join(dir, 'db.sqlite'))).toBe(true);
    } finally {
      if (!hadIndex) fs.rmSync('dist/index.html', { force: true });
      s.child.kill('SIGKILL');
    }
  }, 120_000);
});
