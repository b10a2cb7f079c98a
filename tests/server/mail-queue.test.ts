import { IMPORT_THREADS_IDLE_MS } from '@server/modules/imports/import-runner';
import { describe, it, expect, afterEach } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { createTestApp, DEMO, tokenFromMail, type TestApp } from './helpers';
import { buildSurvey, OFFICE_AND_CORRIDOR, officeAndCorridorReadings } from './support/factories';
import { outboxAttachments, outboxMessages, users } from '@server/db/schema/organizations';
import { jobs } from '@server/db/schema/jobs';
import { surveys } from '@server/db/schema/surveys';
import { smtpTransport, type MailTransport, type OutgoingMail } from '@server/mail/mailer';
import { DEFAULT_MAX_ATTEMPTS, retryDelayMs } from '@server/lib/job-queue';
import { prepareStart } from '@server/start-up';

/** A transport that fails while `mode` is 'down' (as an SMTP server that is down would) or never answers while 'hang'. */
function switchableTransport(mode: 'up' | 'down' | 'hang' = 'down') {
  const sent: OutgoingMail[] = [];
  const state = { mode };
  const transport: MailTransport = {
    name: 'test',
    async send(mail) {
      if (state.mode === 'hang') return new Promise(() => {});
      if (state.mode === 'down') throw new Error('421 mail server unavailable (injected)');
      sent.push(mail);
    },
  };
  return { transport, sent, state };
}

/** The demo seed queues mail of its own (the spring sign-off): deliver it first so each test sees only its own. */
/** Delivers the seed's mail and runs its other jobs (the demo imports' verdicts wait for the import threads to end), so the tests count only their own. */
async function flushSeedMail(t: TestApp, s: { state: { mode: 'up' | 'down' | 'hang' } }, then: 'up' | 'down' | 'hang') {
  s.state.mode = 'up';
  t.clock.advance(IMPORT_THREADS_IDLE_MS + 1_000);
  await t.deliverMail();
  s.state.mode = then;
}

const apps: TestApp[] = [];
const dirs: string[] = [];
afterEach(() => {
  for (const a of apps.splice(0)) a.db.$client.close();
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});

function fileDatabase() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'luxtrail-mail-'));
  dirs.push(dir);
  return path.join(dir, 'mail.db');
}

describe('mail delivery when the mail server fails between the commit and the send', () => {
  it('a sign-off whose mail cannot be delivered still answers 200, and the report is delivered on the next run after a restart', async () => {
    const databaseUrl = fileDatabase();
    const down = switchableTransport();
    const first = await createTestApp({ databaseUrl }, { transport: down.transport });
    apps.push(first);
    await flushSeedMail(first, down, 'down');
    down.sent.length = 0;
    const { surveyId } = buildSurvey(first, { ownerEmail: DEMO.surveyor, zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const fm = await first.signIn(DEMO.facility_manager);
    const res = await fm.post(`/api/surveys/${surveyId}/sign-off`).send({ comment: 'Approved' });
    expect(res.status).toBe(200);
    expect(first.db.select().from(surveys).where(eq(surveys.id, surveyId)).get()!.status).toBe('signed_off');

    const mail = first.lastMail()!;
    expect(mail).toMatchObject({ status: 'queued', attempts: 0 });
    expect(await first.deliverMail()).toBe(1);
    const failed = first.db.select().from(outboxMessages).where(eq(outboxMessages.id, mail.id)).get()!;
    expect(failed).toMatchObject({ status: 'queued', attempts: 1, lastError: '421 mail server unavailable (injected)', nextAttemptAt: first.clock.now() + retryDelayMs(1) });
    // The report was built before the send failed and is kept, so the retry sends the same bytes.
    const built = first.db.select().from(outboxAttachments).where(eq(outboxAttachments.messageId, mail.id)).all();
    expect(built).toHaveLength(1);
    expect(down.sent).toHaveLength(0);
    // The restarted process's clock carries on from here.
    const stoppedAt = first.clock.now();
    first.db.$client.close();
    apps.splice(0);

    // A new process on the same database, with the mail server back.
    const up = switchableTransport('up');
    const second = await createTestApp({ databaseUrl }, { seed: false, transport: up.transport });
    apps.push(second);
    second.clock.set(stoppedAt);
    await prepareStart(second.deps);
    expect(await second.deliverMail()).toBe(0); // not before its back-off
    second.clock.advance(retryDelayMs(1));
    expect(await second.deliverMail()).toBe(1);
    expect(up.sent).toHaveLength(1);
    expect(up.sent[0].to).toContain(DEMO.surveyor);
    expect(up.sent[0].subject).toMatch(/signed off/);
    expect(up.sent[0].attachments[0].content.equals(built[0].content)).toBe(true);
    expect(second.db.select().from(outboxMessages).where(eq(outboxMessages.id, mail.id)).get()).toMatchObject({ status: 'sent', attempts: 2, lastError: null, nextAttemptAt: null });
  });

  it('a process that dies while sending (the job left running), when restarted, sends the mail', async () => {
    const databaseUrl = fileDatabase();
    const hanging = switchableTransport();
    const first = await createTestApp({ databaseUrl }, { transport: hanging.transport });
    apps.push(first);
    await flushSeedMail(first, hanging, 'hang');
    const res = await (await first.signIn(DEMO.admin)).post('/api/invitations').send({ email: 'new.surveyor@luxtrail.test', name: 'Tamsin Reedbed', role: 'surveyor' });
    expect(res.status).toBe(201);
    void first.deliverMail(); // claims the job and never finishes: the process is then "killed"
    await new Promise((r) => setImmediate(r));
    const mailId = first.lastMail()!.id;
    expect(first.db.select().from(jobs).all().find((j) => (j.data as { messageId: number }).messageId === mailId)?.status).toBe('running');
    // The restarted process's clock carries on from here.
    const stoppedAt = first.clock.now();
    first.db.$client.close();
    apps.splice(0);

    const up = switchableTransport('up');
    const second = await createTestApp({ databaseUrl }, { seed: false, transport: up.transport });
    apps.push(second);
    second.clock.set(stoppedAt);
    const recovered = await prepareStart(second.deps);
    expect(recovered.jobsRequeued).toBeGreaterThanOrEqual(1);
    await second.deliverMail();
    const invitation = up.sent.find((m) => m.to === 'new.surveyor@luxtrail.test')!;
    expect(invitation.subject).toMatch(/invited you/);
    expect(tokenFromMail(invitation.text).length).toBeGreaterThan(20);
  });
});

describe('retries and back-off', () => {
  it('a message the server keeps refusing, when retried, waits 30 s then doubling, and is marked failed after the last attempt', async () => {
    const down = switchableTransport();
    const t = await createTestApp({}, { transport: down.transport });
    apps.push(t);
    await flushSeedMail(t, down, 'down');
    const id = t.deps.mailer.send({ to: 'someone@luxtrail.test', subject: 'hello', text: 'body', organizationId: 1 });
    const waits: number[] = [];
    for (let attempt = 1; attempt <= DEFAULT_MAX_ATTEMPTS; attempt++) {
      expect(await t.deliverMail()).toBe(1);
      const row = t.db.select().from(outboxMessages).where(eq(outboxMessages.id, id)).get()!;
      expect(row.attempts).toBe(attempt);
      if (attempt < DEFAULT_MAX_ATTEMPTS) {
        expect(row.status).toBe('queued');
        waits.push(row.nextAttemptAt! - t.clock.now());
        t.clock.advance(row.nextAttemptAt! - t.clock.now() - 1);
        expect(await t.deliverMail()).toBe(0); // a millisecond early: nothing runs
        t.clock.advance(1);
      } else {
        expect(row).toMatchObject({ status: 'failed', nextAttemptAt: null, lastError: '421 mail server unavailable (injected)' });
      }
    }
    expect(waits).toEqual([30_000, 60_000, 120_000, 240_000, 480_000, 960_000, 1_920_000]);
    const admin = await t.signIn(DEMO.admin);
    const outbox = await admin.get('/api/outbox?status=failed');
    expect(outbox.body.items).toEqual([expect.objectContaining({ id, status: 'failed', attempts: DEFAULT_MAX_ATTEMPTS, lastError: '421 mail server unavailable (injected)' })]);
    expect(outbox.body.counts.failed).toBe(1);
  });

  it('a real SMTP transport whose server refuses the connection records the error and keeps the message queued', async () => {
    // Port 1 on loopback: nothing listens there, so the connection is refused at once.
    const t = await createTestApp({}, { transport: smtpTransport('smtp://127.0.0.1:1') });
    apps.push(t);
    t.db.update(outboxMessages).set({ status: 'sent' }).run(); // the seed's mail: not this test's
    const res = await t.client().post('/api/auth/forgot-password').send({ email: DEMO.surveyor });
    expect(res.status).toBe(202);
    await t.deliverMail();
    expect(t.lastMail()).toMatchObject({ status: 'queued', attempts: 1, lastError: expect.stringMatching(/ECONNREFUSED/) });
  });
});

describe('queued with the change, or not at all', () => {
  it('a transaction that fails after queuing a message leaves neither the message nor its job', async () => {
    const t = await createTestApp({}, { seed: false });
    apps.push(t);
    expect(() => t.db.transaction((tx) => {
      t.deps.mailer.queue(tx, { to: 'a@luxtrail.test', subject: 's', text: 't' });
      throw new Error('the change failed');
    })).toThrow('the change failed');
    expect(t.db.select().from(outboxMessages).all()).toEqual([]);
    expect(t.db.select().from(jobs).all()).toEqual([]);
  });

  it('an invitation refused for an existing address, when posted, queues no mail', async () => {
    const t = await createTestApp();
    apps.push(t);
    const before = t.db.select().from(outboxMessages).all().length;
    const res = await (await t.signIn(DEMO.admin)).post('/api/invitations').send({ email: DEMO.surveyor, name: 'Twice', role: 'surveyor' });
    expect(res.status).toBe(409);
    expect(t.db.select().from(outboxMessages).all()).toHaveLength(before);
  });

  it('submit, return, invitation and reset, with the mail server down, each answer 2xx and each message waits in the queue', async () => {
    const down = switchableTransport();
    const t = await createTestApp({}, { transport: down.transport });
    apps.push(t);
    await flushSeedMail(t, down, 'down');
    const { surveyId } = buildSurvey(t, { ownerEmail: DEMO.surveyor, status: 'draft', zones: OFFICE_AND_CORRIDOR, readings: officeAndCorridorReadings() });
    const surveyor = await t.signIn(DEMO.surveyor);
    expect((await surveyor.post(`/api/surveys/${surveyId}/submit`).send({})).status).toBe(200);
    expect((await (await t.signIn(DEMO.facility_manager)).post(`/api/surveys/${surveyId}/return`).send({ comment: 'Measure the corridor again' })).status).toBe(200);
    expect((await (await t.signIn(DEMO.admin)).post('/api/invitations').send({ email: 'ivo@luxtrail.test', name: 'Ivo Saltmarsh', role: 'calibration' })).status).toBe(201);
    expect((await t.client().post('/api/auth/forgot-password').send({ email: DEMO.calibration })).status).toBe(202);
    await t.deliverMail();
    const subjects = t.db.select().from(outboxMessages).all().filter((m) => m.status === 'queued' && m.attempts === 1).map((m) => m.subject);
    expect(subjects).toEqual(expect.arrayContaining([
      expect.stringMatching(/submitted for review/), expect.stringMatching(/returned for changes/), expect.stringMatching(/invited you/), 'Reset your Luxtrail password',
    ]));
    // The account the reset was for exists and is unchanged until the link is used.
    expect(t.db.select().from(users).where(eq(users.email, DEMO.calibration)).get()!.status).toBe('active');
  });
});
