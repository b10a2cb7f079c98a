import nodemailer from 'nodemailer';
import type { Transport } from 'nodemailer';
import type Mail from 'nodemailer/lib/mailer';
import type { Db } from '../db/client';
import { outboxAttachments, outboxMessages } from '../db/schema/organizations';
import type { Clock } from '../lib/clock';

export type MailAttachment = { filename: string; contentType: string; content: Buffer };
export type MailMessage = { to: string | string[]; subject: string; text: string; html?: string; attachments?: MailAttachment[]; organizationId?: number | null };
export type Mailer = { send(message: MailMessage): Promise<void> };

const FROM = 'Luxtrail <no-reply@luxtrail.test>';

/**
 * Mail goes through nodemailer either way: to SMTP when SMTP_URL is set, otherwise through
 * a local transport that delivers into the outbox tables, which admins read on the Outbox page.
 */
export function createMailer(opts: { db: Db; clock: Clock; smtpUrl: string | null }): Mailer {
  const transporter = opts.smtpUrl ? nodemailer.createTransport(opts.smtpUrl) : nodemailer.createTransport(outboxTransport(opts.db, opts.clock));
  return {
    async send(message) {
      const to = Array.isArray(message.to) ? message.to.join(', ') : message.to;
      await transporter.sendMail({
        from: FROM,
        to,
        subject: message.subject,
        text: message.text,
        html: message.html,
        attachments: message.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: a.content })),
        headers: message.organizationId ? { 'X-Luxtrail-Organization': String(message.organizationId) } : undefined,
      });
    },
  };
}

function outboxTransport(db: Db, clock: Clock): Transport {
  return {
    name: 'luxtrail-outbox',
    version: '1',
    send(mail, callback) {
      try {
        const data = mail.data as Mail.Options;
        const orgHeader = (data.headers as Record<string, string> | undefined)?.['X-Luxtrail-Organization'];
        db.transaction((tx) => {
          const msg = tx.insert(outboxMessages).values({
            organizationId: orgHeader ? Number(orgHeader) : null,
            to: String(data.to),
            subject: String(data.subject ?? ''),
            text: String(data.text ?? ''),
            html: data.html ? String(data.html) : null,
            createdAt: clock.now(),
          }).returning({ id: outboxMessages.id }).get();
          for (const a of data.attachments ?? []) {
            const content = Buffer.isBuffer(a.content) ? a.content : Buffer.from(String(a.content ?? ''));
            tx.insert(outboxAttachments).values({ messageId: msg.id, filename: String(a.filename ?? 'attachment'), contentType: String(a.contentType ?? 'application/octet-stream'), content, size: content.length }).run();
          }
        });
        callback(null, { envelope: mail.message.getEnvelope(), messageId: mail.message.messageId() } as never);
      } catch (err) {
        callback(err as Error, undefined as never);
      }
    },
  };
}
