import { describe, it, expect, beforeEach } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, tokenFromMail, type TestApp } from './helpers';
import { rateLimitHits, sessions, users } from '@server/db/schema/organizations';
import { LIMIT_WINDOW_MS } from '@server/modules/auth/auth-routes';
import { loadConfig, ConfigError } from '@server/config';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

const idOf = (email: string) => t.db.select().from(users).where(eq(users.email, email)).get()!.id;
const sessionsOf = (email: string) => t.db.select().from(sessions).where(eq(sessions.userId, idOf(email))).all();
const me = async (c: Awaited<ReturnType<TestApp['signIn']>>) => (await c.get('/api/auth/me')).status;

describe('an account\'s other sessions end', () => {
  it('a password reset, when used, signs the account out on every device and the resetting browser is signed in afresh', async () => {
    const laptop = await t.signIn(DEMO.surveyor);
    const phone = await t.signIn(DEMO.surveyor);
    const bystander = await t.signIn(DEMO.admin);
    expect(sessionsOf(DEMO.surveyor)).toHaveLength(2);
    await t.client().post('/api/auth/forgot-password').send({ email: DEMO.surveyor });
    const token = tokenFromMail(t.lastMail()!.text);
    const browser = t.client();
    const reset = await browser.post('/api/auth/reset-password').send({ token, password: 'fresh-password-1', confirmPassword: 'fresh-password-1' });
    expect(reset.status).toBe(200);
    expect(await me(laptop)).toBe(401);
    expect(await me(phone)).toBe(401);
    expect(await me(browser)).toBe(200);
    expect(sessionsOf(DEMO.surveyor)).toHaveLength(1);
    expect(await me(bystander)).toBe(200);
  });

  it('an account, when an admin disables it, loses every session, and stays signed out when enabled again', async () => {
    const surveyor = await t.signIn(DEMO.surveyor);
    const admin = await t.signIn(DEMO.admin);
    expect((await admin.patch(`/api/users/${idOf(DEMO.surveyor)}`).send({ status: 'disabled' })).status).toBe(200);
    expect(sessionsOf(DEMO.surveyor)).toHaveLength(0);
    expect((await admin.patch(`/api/users/${idOf(DEMO.surveyor)}`).send({ status: 'active' })).status).toBe(200);
    expect(await me(surveyor)).toBe(401);
  });

  it('an account, when its role changes, is signed out; a change of name only keeps its sessions', async () => {
    const fm = await t.signIn(DEMO.facility_manager);
    const admin = await t.signIn(DEMO.admin);
    expect((await admin.patch(`/api/users/${idOf(DEMO.facility_manager)}`).send({ name: 'Marguerite Oakhurst-Lee' })).status).toBe(200);
    expect(await me(fm)).toBe(200);
    expect((await admin.patch(`/api/users/${idOf(DEMO.facility_manager)}`).send({ role: 'surveyor' })).status).toBe(200);
    expect(await me(fm)).toBe(401);
    expect(await me(admin)).toBe(200);
  });
});

describe('sign-in and reset limits', () => {
  const fail = (c: ReturnType<TestApp['client']>, email: string, ip?: string) => {
    const req = c.post('/api/auth/login');
    if (ip) req.set('X-Forwarded-For', ip);
    return req.send({ email, password: 'not-the-password' });
  };

  it('someone elsewhere who knows only the e-mail, after five bad passwords, is refused while the real user still signs in', async () => {
    const attacker = t.client();
    for (let i = 0; i < 5; i++) expect((await fail(attacker, DEMO.surveyor)).status).toBe(401);
    expect((await fail(attacker, DEMO.surveyor)).status).toBe(429);
    // The real user's attempts are counted per account AND address: in the test both come from
    // loopback, so stand the real user on another address through a configured proxy.
    const proxied = await createTestApp({ trustProxy: ['loopback'] });
    const from = (ip: string) => proxied.client().post('/api/auth/login').set('X-Forwarded-For', ip);
    for (let i = 0; i < 5; i++) await from('203.0.113.9').send({ email: DEMO.surveyor, password: 'nope-nope-nope' });
    expect((await from('203.0.113.9').send({ email: DEMO.surveyor, password: 'luxtrail-demo' })).status).toBe(429);
    expect((await from('198.51.100.4').send({ email: DEMO.surveyor, password: 'luxtrail-demo' })).status).toBe(200);
  });

  it('successful sign-ins, more than the account budget of five, are never counted against the account', async () => {
    // express-rate-limit takes a success back only while the window it was told of has not ended by
    // the wall clock; the store's windows run on the injected clock (here fixed in the past).
    const fresh = await createTestApp();
    for (let i = 0; i < 8; i++) expect((await fresh.client().post('/api/auth/login').send({ email: DEMO.facility_manager, password: 'luxtrail-demo' })).status).toBe(200);
  });

  it('X-Forwarded-For from a client, when TRUST_PROXY is not set, is ignored: a new header buys no new budget', async () => {
    const c = t.client();
    for (let i = 0; i < 5; i++) await fail(c, DEMO.admin, `192.0.2.${i}`);
    expect((await c.post('/api/auth/login').set('X-Forwarded-For', '192.0.2.77').send({ email: DEMO.admin, password: 'luxtrail-demo' })).status).toBe(429);
  });

  it('the counters, when the server restarts on the same database, are still there', async () => {
    const c = t.client();
    for (let i = 0; i < 5; i++) await fail(c, DEMO.calibration);
    const stored = t.db.select().from(rateLimitHits).all();
    expect(stored.some((r) => r.key.startsWith('sign-in:account:') && r.key.includes(DEMO.calibration) && r.hits === 5)).toBe(true);
    // A second app on the same database is a restarted server.
    const { createApp } = await import('@server/app');
    const restarted = createApp(t.deps).app;
    const { default: request } = await import('supertest');
    const res = await request(restarted).post('/api/auth/login').set('Origin', 'http://localhost:3000').send({ email: DEMO.calibration, password: 'luxtrail-demo' });
    expect(res.status).toBe(429);
    t.clock.advance(LIMIT_WINDOW_MS);
    expect((await request(restarted).post('/api/auth/login').set('Origin', 'http://localhost:3000').send({ email: DEMO.calibration, password: 'luxtrail-demo' })).status).toBe(200);
  });

  it('forgot-password, when used up, does not spend the sign-in budget, and its own limit answers 429 without queuing more mail', async () => {
    const c = t.client();
    for (let i = 0; i < 3; i++) expect((await c.post('/api/auth/forgot-password').send({ email: DEMO.surveyor })).status).toBe(202);
    const mails = t.db.$client.prepare('select count(*) n from outbox_messages').get() as { n: number };
    expect((await c.post('/api/auth/forgot-password').send({ email: DEMO.surveyor })).status).toBe(429);
    expect((t.db.$client.prepare('select count(*) n from outbox_messages').get() as { n: number }).n).toBe(mails.n);
    expect((await c.post('/api/auth/login').send({ email: DEMO.surveyor, password: 'luxtrail-demo' })).status).toBe(200);
  });
});

describe('TRUST_PROXY', () => {
  const env = (v: string) => ({ DATA_DIR: t.config.dataDir, TRUST_PROXY: v });
  it('is off when unset, and takes a hop count or proxy addresses', () => {
    expect(loadConfig({ DATA_DIR: t.config.dataDir }).trustProxy).toBe(false);
    expect(loadConfig(env('1')).trustProxy).toBe(1);
    expect(loadConfig(env('loopback, 10.0.0.0/8, fd00::1')).trustProxy).toEqual(['loopback', '10.0.0.0/8', 'fd00::1']);
  });
  it('refuses "true" and anything that is not an address, naming the variable', () => {
    expect(() => loadConfig(env('true'))).toThrow(ConfigError);
    expect(() => loadConfig(env('true'))).toThrow(/TRUST_PROXY/);
    expect(() => loadConfig(env('proxy.example'))).toThrow(/TRUST_PROXY: "proxy.example"/);
    expect(() => loadConfig(env('10.0.0.0/40'))).toThrow(/TRUST_PROXY/);
  });
});
