import { describe, it, expect, beforeEach } from 'vitest';
import { createTestApp, DEMO, ORIGIN, tokenFromMail, type TestApp } from './helpers';
import { SESSION_TTL_MS } from '@server/app';
import { INVITE_TTL_MS } from '@server/modules/auth/auth-service';
import { users, tokens } from '@server/db/schema/organizations';
import { eq } from 'drizzle-orm';

let t: TestApp;
beforeEach(async () => { t = await createTestApp(); });

describe('sign-in', () => {
  it('signs in a demo admin with the right password and answers the user with role and organisation', async () => {
    const res = await t.client().post('/api/auth/login').send({ email: DEMO.admin, password: 'luxtrail-demo' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: DEMO.admin, role: 'admin', organizationName: 'Fernmoor Civic Trust' });
    expect(res.headers['set-cookie']?.[0]).toMatch(/luxtrail\.sid=.*HttpOnly.*SameSite=Lax/i);
  });

  it('refuses a wrong password and an unknown e-mail with the same 401 answer', async () => {
    const wrong = await t.client().post('/api/auth/login').send({ email: DEMO.admin, password: 'not-the-password' });
    const unknown = await t.client().post('/api/auth/login').send({ email: 'nobody@luxtrail.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('unauthenticated');
  });

  it('rejects a malformed body with 400 and the error shape naming the field', async () => {
    const res = await t.client().post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(res.body.error.message).toMatch(/email/);
    expect(Array.isArray(res.body.error.details)).toBe(true);
  });

  it('locks an account after five failed attempts even with the right password afterwards', async () => {
    const c = t.client();
    for (let i = 0; i < 5; i++) expect((await c.post('/api/auth/login').send({ email: DEMO.surveyor, password: 'wrong-wrong' })).status).toBe(401);
    const res = await c.post('/api/auth/login').send({ email: DEMO.surveyor, password: 'luxtrail-demo' });
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe('too_many_requests');
    // Another account from the same address is still allowed (per-account limit).
    expect((await c.post('/api/auth/login').send({ email: DEMO.admin, password: 'luxtrail-demo' })).status).toBe(200);
  });

  it('limits sign-in attempts per address across accounts', async () => {
    const c = t.client();
    let last = 0;
    for (let i = 0; i < 31; i++) last = (await c.post('/api/auth/login').send({ email: `user${i}@nowhere.test`, password: 'x' })).status;
    expect(last).toBe(429);
  });

  it('issues a new session id on every sign-in, so an earlier (planted) id stops working', async () => {
    const c = t.client();
    const first = await c.post('/api/auth/login').send({ email: DEMO.admin, password: 'luxtrail-demo' });
    const cookieA = first.headers['set-cookie']![0].split(';')[0];
    const second = await c.post('/api/auth/login').send({ email: DEMO.admin, password: 'luxtrail-demo' });
    const cookieB = second.headers['set-cookie']![0].split(';')[0];
    expect(cookieB).not.toBe(cookieA);
    expect((await t.client().agent.get('/api/auth/me').set('Cookie', cookieA)).status).toBe(401);
    expect((await t.client().agent.get('/api/auth/me').set('Cookie', cookieB)).status).toBe(200);
  });

  it('destroys the session on sign-out, so a replayed cookie is refused', async () => {
    const c = t.client();
    const login = await c.post('/api/auth/login').send({ email: DEMO.admin, password: 'luxtrail-demo' });
    const cookie = login.headers['set-cookie']![0].split(';')[0];
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/me')).status).toBe(401);
    expect((await t.client().agent.get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('expires a session after its idle lifetime', async () => {
    const c = await t.signIn(DEMO.admin);
    expect((await c.get('/api/auth/me')).status).toBe(200);
    t.clock.advance(SESSION_TTL_MS + 1000);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('refuses a state-changing request from another origin or without one (CSRF)', async () => {
    const c = await t.signIn(DEMO.admin);
    const foreign = await c.agent.post('/api/invitations').set('Origin', 'https://evil.example').send({ email: 'x@y.test', name: 'X', role: 'surveyor' });
    const none = await c.agent.post('/api/invitations').send({ email: 'x@y.test', name: 'X', role: 'surveyor' });
    expect(foreign.status).toBe(403);
    expect(foreign.body.error.code).toBe('cross_origin_refused');
    expect(none.status).toBe(403);
    const own = await c.agent.post('/api/invitations').set('Origin', ORIGIN).send({ email: 'x@y.test', name: 'X', role: 'surveyor' });
    expect(own.status).toBe(201);
  });
});

describe('invitations and resets through the fake outbox', () => {
  it('invites a user, who accepts from the e-mailed link once, then signs in', async () => {
    const admin = await t.signIn(DEMO.admin);
    const inv = await admin.post('/api/invitations').send({ email: 'New.Person@Luxtrail.test', name: 'Nell Brackwater', role: 'surveyor' });
    expect(inv.status).toBe(201);
    expect(inv.body).toMatchObject({ email: 'new.person@luxtrail.test', status: 'invited', role: 'surveyor' });
    const mail = t.lastMail()!;
    expect(mail.to).toBe('new.person@luxtrail.test');
    const token = tokenFromMail(mail.text);
    // Only the token's hash is stored.
    expect(t.db.select().from(tokens).all().some((r) => r.tokenHash === token)).toBe(false);

    const visitor = t.client();
    expect((await visitor.get(`/api/auth/tokens?token=${token}`)).body).toMatchObject({ email: 'new.person@luxtrail.test', purpose: 'invite' });
    const accept = await visitor.post('/api/auth/accept-invite').send({ token, password: 'a-long-password', confirmPassword: 'a-long-password' });
    expect(accept.status).toBe(200);
    expect((await visitor.get('/api/auth/me')).body.user.email).toBe('new.person@luxtrail.test');
    const reuse = await t.client().post('/api/auth/accept-invite').send({ token, password: 'another-password', confirmPassword: 'another-password' });
    expect(reuse.status).toBe(410);
    expect((await t.client().post('/api/auth/login').send({ email: 'new.person@luxtrail.test', password: 'a-long-password' })).status).toBe(200);
  });

  it('refuses an expired invitation link', async () => {
    const admin = await t.signIn(DEMO.admin);
    await admin.post('/api/invitations').send({ email: 'late@luxtrail.test', name: 'Late Comer', role: 'calibration' });
    const token = tokenFromMail(t.lastMail()!.text);
    t.clock.advance(INVITE_TTL_MS + 1);
    const res = await t.client().post('/api/auth/accept-invite').send({ token, password: 'a-long-password', confirmPassword: 'a-long-password' });
    expect(res.status).toBe(410);
    expect(t.db.select().from(users).where(eq(users.email, 'late@luxtrail.test')).get()!.status).toBe('invited');
  });

  it('refuses a second invitation to an existing e-mail with 409', async () => {
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.post('/api/invitations').send({ email: DEMO.surveyor, name: 'Dup', role: 'surveyor' });
    expect(res.status).toBe(409);
  });

  it('resets a forgotten password by e-mail, and answers the same for an unknown address', async () => {
    const before = t.db.select().from(tokens).all().length;
    const unknown = await t.client().post('/api/auth/forgot-password').send({ email: 'ghost@luxtrail.test' });
    expect(unknown.status).toBe(202);
    expect(t.db.select().from(tokens).all().length).toBe(before);

    const res = await t.client().post('/api/auth/forgot-password').send({ email: DEMO.surveyor });
    expect(res.status).toBe(202);
    expect(res.body).toEqual(unknown.body);
    const token = tokenFromMail(t.lastMail()!.text);
    const reset = await t.client().post('/api/auth/reset-password').send({ token, password: 'fresh-password-1', confirmPassword: 'fresh-password-1' });
    expect(reset.status).toBe(200);
    expect((await t.client().post('/api/auth/login').send({ email: DEMO.surveyor, password: 'luxtrail-demo' })).status).toBe(401);
    expect((await t.client().post('/api/auth/login').send({ email: DEMO.surveyor, password: 'fresh-password-1' })).status).toBe(200);
  });

  it('rejects mismatched passwords on reset with 400 naming confirmPassword', async () => {
    await t.client().post('/api/auth/forgot-password').send({ email: DEMO.surveyor });
    const token = tokenFromMail(t.lastMail()!.text);
    const res = await t.client().post('/api/auth/reset-password').send({ token, password: 'fresh-password-1', confirmPassword: 'fresh-password-2' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('confirmPassword');
  });
});

describe('API conventions', () => {
  it('answers health, the OpenAPI document, and an unknown route in the error shape', async () => {
    expect((await t.client().get('/api/health')).body.ok).toBe(true);
    const doc = await t.client().get('/api/openapi.json');
    expect(doc.body.openapi).toBe('3.0.3');
    expect(doc.body.paths['/auth/login'].post).toBeTruthy();
    const missing = await t.client().get('/api/nothing-here');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
  });
});
