import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { outboxListResponseSchema, outboxQuerySchema } from '@shared/schemas/users';
import { outboxAttachments, outboxMessages } from '../../db/schema/organizations';
import { notFound } from '../../http/errors';

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

export function registerOutboxRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/outbox', access: 'outbox.read', tag: 'outbox', summary: 'This organisation\'s e-mail, newest first (at most 200): queued, sent and failed, with attempts', query: outboxQuerySchema, response: outboxListResponseSchema },
    ({ user, query }) => {
      const mine = eq(outboxMessages.organizationId, user.organizationId);
      const messages = deps.db.select().from(outboxMessages).where(query.status ? and(mine, eq(outboxMessages.status, query.status)) : mine).orderBy(desc(outboxMessages.id)).limit(200).all();
      const attachments = messages.length
        ? deps.db.select({ id: outboxAttachments.id, messageId: outboxAttachments.messageId, filename: outboxAttachments.filename, contentType: outboxAttachments.contentType, size: outboxAttachments.size })
          .from(outboxAttachments).where(inArray(outboxAttachments.messageId, messages.map((m) => m.id))).all()
        : [];
      const counts = { queued: 0, sent: 0, failed: 0 };
      for (const c of deps.db.select({ status: outboxMessages.status, n: sql<number>`count(*)` }).from(outboxMessages).where(mine).groupBy(outboxMessages.status).all()) counts[c.status] = c.n;
      return {
        items: messages.map((m) => ({
          id: m.id, to: m.to, subject: m.subject, text: m.text, createdAt: new Date(m.createdAt).toISOString(),
          status: m.status, attempts: m.attempts, lastError: m.lastError, nextAttemptAt: iso(m.nextAttemptAt), sentAt: iso(m.sentAt),
          attachments: attachments.filter((a) => a.messageId === m.id).map(({ messageId: _m, ...a }) => a),
          pendingAttachments: (m.pendingAttachments ?? []).map((p) => ({ filename: p.filename })),
        })),
        counts,
        delivery: deps.mailer.transportName === 'smtp' ? 'smtp' as const : 'outbox' as const,
      };
    });

  api.route({ method: 'get', path: '/outbox/attachments/:id', access: 'outbox.read', tag: 'outbox', summary: 'Download an attachment', params: idParamsSchema, produces: 'application/octet-stream' },
    ({ user, params, res }) => {
      const row = deps.db.select({ filename: outboxAttachments.filename, contentType: outboxAttachments.contentType, content: outboxAttachments.content })
        .from(outboxAttachments).innerJoin(outboxMessages, eq(outboxMessages.id, outboxAttachments.messageId))
        .where(and(eq(outboxAttachments.id, params.id), eq(outboxMessages.organizationId, user.organizationId))).get();
      if (!row) throw notFound('Attachment');
      res.setHeader('Content-Type', row.contentType);
      res.setHeader('Content-Disposition', `attachment; filename="${row.filename.replace(/[^\w.-]/g, '_')}"`);
      res.send(row.content);
    });
}
