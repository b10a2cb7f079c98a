import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { idParamsSchema } from '@shared/schemas/common';
import { outboxListResponseSchema } from '@shared/schemas/users';
import { outboxAttachments, outboxMessages } from '../../db/schema/organizations';
import { notFound } from '../../http/errors';

export function registerOutboxRoutes(api: Api, deps: Deps) {
  api.route({ method: 'get', path: '/outbox', access: 'outbox.read', tag: 'outbox', summary: 'Mail delivered to the local outbox for this organisation', response: outboxListResponseSchema },
    ({ user }) => {
      const messages = deps.db.select().from(outboxMessages).where(eq(outboxMessages.organizationId, user.organizationId)).orderBy(desc(outboxMessages.id)).limit(200).all();
      const attachments = messages.length
        ? deps.db.select({ id: outboxAttachments.id, messageId: outboxAttachments.messageId, filename: outboxAttachments.filename, contentType: outboxAttachments.contentType, size: outboxAttachments.size })
          .from(outboxAttachments).where(inArray(outboxAttachments.messageId, messages.map((m) => m.id))).all()
        : [];
      return {
        items: messages.map((m) => ({
          id: m.id, to: m.to, subject: m.subject, text: m.text, createdAt: new Date(m.createdAt).toISOString(),
          attachments: attachments.filter((a) => a.messageId === m.id).map(({ messageId: _m, ...a }) => a),
        })),
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
