import nodemailer from 'nodemailer';
import { asc, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { outboxAttachments, outboxMessages, type PendingAttachment } from '../db/schema/organizations';
import type { Clock } from '../lib/clock';
import type { JobQueue, JobTx } from '../lib/job-queue';

export type MailAttachment = { filename: string; contentType: string; content: Buffer };
export type MailMessage = {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: MailAttachment[];
  /** Attachments built when the message is delivered (a report PDF), by a builder a module registered. */
  pendingAttachments?: PendingAttachment[];
  organizationId?: number | null;
};

/** One message as it leaves Luxtrail. */
export type OutgoingMail = { from: string; to: string; subject: string; text: string; html?: string; attachments: MailAttachment[] };

/** Where delivered mail goes: SMTP, nowhere but the Outbox page, or (in tests) a transport that fails. */
export type MailTransport = { name: string; send(mail: OutgoingMail): Promise<void> };

export type AttachmentBuilder = (params: Record<string, unknown>) => Promise<MailAttachment>;

export type Mailer = {
  /** Queues a message in the caller's transaction (so it commits with its cause); returns its id. */
  queue(tx: JobTx, message: MailMessage): number;
  /** Queues a message in a transaction of its own, for callers with nothing else to commit. */
  send(message: MailMessage): number;
  /** Registers how attachments of a kind are built at delivery. */
  attachmentBuilder(kind: string, build: AttachmentBuilder): void;
  readonly transportName: string;
};

export const MAIL_FROM = 'Luxtrail <no-reply@luxtrail.test>';
export const DELIVER_MAIL_JOB = 'mail.deliver';
/** Errors kept on a message are cut to this many characters. */
const ERROR_CHARS = 500;

/** No SMTP_URL: delivery only marks the message sent; admins read it on the Outbox page. */
export const outboxOnlyTransport: MailTransport = { name: 'outbox', send: async () => {} };

export function smtpTransport(url: string): MailTransport {
  const transporter = nodemailer.createTransport(url);
  return {
    name: 'smtp',
    async send(mail) {
      await transporter.sendMail({ ...mail, attachments: mail.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })) });
    },
  };
}

export function transportFor(smtpUrl: string | null): MailTransport {
  return smtpUrl ? smtpTransport(smtpUrl) : outboxOnlyTransport;
}

/**
 * Every e-mail is a row of `outbox_messages` written with the change that causes it plus a
 * `mail.deliver` job; the job runner hands it to the transport, retrying with back-off
 * (server/lib/job-queue.ts). A failing SMTP server therefore never undoes or fails the change,
 * and a crash after the commit delivers after the restart. Delivery is at least once: a crash
 * between the SMTP server's acceptance and the row's update sends the message again.
 */
export function createMailer(opts: { db: Db; clock: Clock; jobs: JobQueue; transport: MailTransport }): Mailer {
  const { db, clock, jobs, transport } = opts;
  const builders = new Map<string, AttachmentBuilder>();

  const mailer: Mailer = {
    transportName: transport.name,
    queue(tx, message) {
      const msg = tx.insert(outboxMessages).values({
        organizationId: message.organizationId ?? null,
        to: Array.isArray(message.to) ? message.to.join(', ') : message.to,
        subject: message.subject,
        text: message.text,
        html: message.html ?? null,
        createdAt: clock.now(),
        status: 'queued',
        pendingAttachments: message.pendingAttachments?.length ? message.pendingAttachments : null,
      }).returning({ id: outboxMessages.id }).get();
      for (const a of message.attachments ?? []) {
        tx.insert(outboxAttachments).values({ messageId: msg.id, filename: a.filename, contentType: a.contentType, content: a.content, size: a.content.length }).run();
      }
      jobs.send(tx, DELIVER_MAIL_JOB, { messageId: msg.id });
      return msg.id;
    },
    send(message) {
      return db.transaction((tx) => mailer.queue(tx, message));
    },
    attachmentBuilder(kind, build) {
      builders.set(kind, build);
    },
  };

  jobs.work(DELIVER_MAIL_JOB, async (data, ctx) => {
    const { messageId } = data as { messageId: number };
    const msg = db.select().from(outboxMessages).where(eq(outboxMessages.id, messageId)).get();
    if (!msg || msg.status === 'sent') return;
    try {
      for (const pending of msg.pendingAttachments ?? []) {
        const build = builders.get(pending.kind);
        if (!build) throw new Error(`No builder for a "${pending.kind}" attachment`);
        const a = await build(pending.params);
        // Keep what was built, so a retry after an SMTP failure sends the same bytes.
        db.transaction((tx) => {
          tx.insert(outboxAttachments).values({ messageId, filename: a.filename, contentType: a.contentType, content: a.content, size: a.content.length }).run();
          const rest = (tx.select({ p: outboxMessages.pendingAttachments }).from(outboxMessages).where(eq(outboxMessages.id, messageId)).get()?.p ?? []).slice(1);
          tx.update(outboxMessages).set({ pendingAttachments: rest.length ? rest : null }).where(eq(outboxMessages.id, messageId)).run();
        });
      }
      const attachments = db.select().from(outboxAttachments).where(eq(outboxAttachments.messageId, messageId)).orderBy(asc(outboxAttachments.id)).all();
      await transport.send({
        from: MAIL_FROM, to: msg.to, subject: msg.subject, text: msg.text, html: msg.html ?? undefined,
        attachments: attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
      });
      db.update(outboxMessages).set({ status: 'sent', sentAt: clock.now(), attempts: ctx.attempt, lastError: null, nextAttemptAt: null }).where(eq(outboxMessages.id, messageId)).run();
    } catch (err) {
      const message = (err instanceof Error ? err.message : String(err)).slice(0, ERROR_CHARS);
      db.update(outboxMessages).set({ status: ctx.retryAt === null ? 'failed' : 'queued', attempts: ctx.attempt, lastError: message, nextAttemptAt: ctx.retryAt })
        .where(eq(outboxMessages.id, messageId)).run();
      throw err;
    }
  });

  return mailer;
}
