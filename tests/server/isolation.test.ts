import { describe, it, expect, beforeAll } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, type TestApp } from './helpers';
import { users } from '@server/db/schema/organizations';

let t: TestApp;
beforeAll(async () => { t = await createTestApp(); });

describe('organisation isolation of the foundation routes', () => {
  it('answers 404 when an admin patches a user of another organisation by guessing the id', async () => {
    const victim = t.db.select().from(users).where(eq(users.email, DEMO.otherFacilityManager)).get()!;
    const admin = await t.signIn(DEMO.admin);
    const res = await admin.patch(`/api/users/${victim.id}`).send({ name: 'Taken Over' });
    expect(res.status).toBe(404);
    expect(t.db.select().from(users).where(eq(users.id, victim.id)).get()!.name).toBe(victim.name);
  });

  it('lists only the caller organisation\'s users', async () => {
    const other = await t.signIn(DEMO.otherAdmin);
    const res = await other.get('/api/users');
    expect(res.status).toBe(200);
    expect(res.body.items.map((u: { email: string }) => u.email).sort()).toEqual([DEMO.otherAdmin, DEMO.otherFacilityManager].sort());
  });

  it('keeps one organisation\'s outbox mail and attachments from another\'s admin', async () => {
    const admin = await t.signIn(DEMO.admin);
    await admin.post('/api/invitations').send({ email: 'iso-check@luxtrail.test', name: 'Iso Check', role: 'surveyor' });
    t.deps.mailer.send({ to: 'x@luxtrail.test', subject: 'private report', text: 'attached', organizationId: 1, attachments: [{ filename: 'r.pdf', contentType: 'application/pdf', content: Buffer.from('%PDF-1.4') }] });
    const mine = await admin.get('/api/outbox');
    const attachmentId = mine.body.items.find((m: { subject: string }) => m.subject === 'private report').attachments[0].id;

    const other = await t.signIn(DEMO.otherAdmin);
    const theirs = await other.get('/api/outbox');
    expect(theirs.body.items.some((m: { to: string }) => m.to === 'iso-check@luxtrail.test')).toBe(false);
    expect((await other.get(`/api/outbox/attachments/${attachmentId}`)).status).toBe(404);
    expect((await admin.get(`/api/outbox/attachments/${attachmentId}`)).status).toBe(200);
  });

  it('refuses to let a site list from another organisation limit a facility manager', async () => {
    const admin = await t.signIn(DEMO.admin);
    const otherAdmin = await t.signIn(DEMO.otherAdmin);
    const otherSites = await otherAdmin.get('/api/sites');
    const foreignSiteId = otherSites.body.items[0]?.id ?? 999_999;
    const res = await admin.post('/api/invitations').send({ email: 'fm-limited@luxtrail.test', name: 'Limited', role: 'facility_manager', siteIds: [foreignSiteId] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Unknown site/);
    expect(t.db.select().from(users).where(eq(users.email, 'fm-limited@luxtrail.test')).get()).toBeUndefined();
  });

  it('stops a disabled user at once, even with a live session', async () => {
    const admin = await t.signIn(DEMO.admin);
    const surveyor = await t.signIn(DEMO.surveyor);
    const id = t.db.select().from(users).where(eq(users.email, DEMO.surveyor)).get()!.id;
    expect((await surveyor.get('/api/auth/me')).status).toBe(200);
    expect((await admin.patch(`/api/users/${id}`).send({ status: 'disabled' })).status).toBe(200);
    expect((await surveyor.get('/api/auth/me')).status).toBe(401);
  });

  it('refuses to let an admin remove their own admin role', async () => {
    const admin = await t.signIn(DEMO.admin);
    const id = t.db.select().from(users).where(eq(users.email, DEMO.admin)).get()!.id;
    const res = await admin.patch(`/api/users/${id}`).send({ role: 'surveyor' });
    expect(res.status).toBe(409);
  });
});
