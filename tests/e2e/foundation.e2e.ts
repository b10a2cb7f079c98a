import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import path from 'node:path';
import { startE2eApp, signInAs, navLabels, screenshotDir, type E2eApp } from './harness';

let app: E2eApp;
beforeAll(async () => { app = await startE2eApp(); });
afterAll(async () => { await app?.stop(); });

describe('foundation in a real browser', () => {
  // Five sign-ins in a row: a generous limit for a busy machine.
  it('shows each demo role the navigation its capabilities allow', { timeout: 240_000 }, async () => {
    const expectations: Record<string, { has: string[]; lacks: string[] }> = {
      'admin@luxtrail.test': { has: ['Overview', 'Users', 'Outbox'], lacks: [] },
      'surveyor@luxtrail.test': { has: ['Overview'], lacks: ['Users', 'Outbox'] },
      'calibration@luxtrail.test': { has: ['Overview'], lacks: ['Users', 'Outbox'] },
      'facilities@luxtrail.test': { has: ['Overview'], lacks: ['Users', 'Outbox'] },
      'facilities@elsewhere.test': { has: ['Overview'], lacks: ['Users', 'Outbox'] },
    };
    for (const [email, { has, lacks }] of Object.entries(expectations)) {
      const page = await app.newPage();
      await signInAs(page, email);
      const labels = await navLabels(page);
      for (const l of has) expect(labels, email).toContain(l);
      for (const l of lacks) expect(labels, email).not.toContain(l);
      await page.context().close();
    }
  });

  it('refuses a surveyor who opens the users page by URL', async () => {
    const page = await app.newPage();
    await signInAs(page, 'surveyor@luxtrail.test');
    await page.goto('/users');
    await page.getByRole('alert').getByText('This page is not open to your role').waitFor();
    expect(await page.getByRole('alert').getByText('This page is not open to your role').isVisible()).toBe(true);
    expect(await page.getByRole('form', { name: 'Invite a user' }).count()).toBe(0);
  });

  it('invites a user, who accepts from the outbox link and lands signed in', async () => {
    const admin = await app.newPage();
    await signInAs(admin, 'admin@luxtrail.test');
    await admin.goto('/users');
    const form = admin.getByRole('form', { name: 'Invite a user' });
    await form.getByLabel('Name').fill('Ffion Larchmere');
    await form.getByLabel('E-mail').fill('ffion@luxtrail.test');
    await form.getByLabel('Role').selectOption('surveyor');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByRole('status').getByText('Invitation sent to ffion@luxtrail.test').waitFor();
    await admin.screenshot({ path: path.join(screenshotDir(), 'users.png'), fullPage: true });

    await admin.goto('/outbox');
    await admin.getByRole('button', { name: /invited you to Luxtrail/ }).first().waitFor();
    const link = await admin.getByRole('link', { name: /accept-invite/ }).first().getAttribute('href');
    expect(link).toMatch(/\/accept-invite\?token=/);

    const invitee = await app.newPage({ width: 390, height: 844 });
    await invitee.goto(link!);
    await invitee.getByText('ffion@luxtrail.test').waitFor();
    await invitee.getByLabel('Password', { exact: true }).fill('ffion-walks-the-grid');
    await invitee.getByLabel('Repeat the password').fill('ffion-walks-the-grid');
    await invitee.getByRole('button', { name: 'Set password and sign in' }).click();
    await invitee.getByRole('heading', { name: 'Hello, Ffion' }).waitFor();
    await invitee.screenshot({ path: path.join(screenshotDir(), 'home-phone.png') });
  });
});

describe('facility managers limited to sites', () => {
  it('invites a facility manager limited to the library, and the users table says so', async () => {
    const admin = await app.newPage();
    await signInAs(admin, 'admin@luxtrail.test');
    await admin.goto('/users');
    const form = admin.getByRole('form', { name: 'Invite a user' });
    await form.getByLabel('Name').fill('Rowan Ashdown');
    await form.getByLabel('E-mail').fill('rowan@luxtrail.test');
    await form.getByLabel('Role').selectOption('facility_manager');
    await form.getByLabel('Fernmoor Community Library').check();
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByRole('status').getByText('Invitation sent to rowan@luxtrail.test').waitFor();
    const row = admin.getByRole('row', { name: /Rowan Ashdown/ });
    await row.getByText('Sites: Fernmoor Community Library').waitFor();
  });
});
