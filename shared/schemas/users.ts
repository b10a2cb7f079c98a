import { z } from 'zod';
import { singleLineText } from './text';
import { ROLES } from '../roles';
import { emailSchema } from './common';

export const USER_STATUSES = ['active', 'invited', 'disabled'] as const;

export const userSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  status: z.enum(USER_STATUSES),
  siteIds: z.array(z.number().int()),
  createdAt: z.string(),
});
export type User = z.infer<typeof userSchema>;

export const userListResponseSchema = z.object({ items: z.array(userSchema) });

/** A fresh invitation link was e-mailed (202). */
export const invitationSentSchema = z.object({ ok: z.boolean() });

export const inviteBodySchema = z.object({
  email: emailSchema,
  name: singleLineText(z.string().trim().min(1, 'Enter a name').max(120)),
  role: z.enum(ROLES),
  /** Facility managers may be limited to chosen sites; empty means all sites. */
  siteIds: z.array(z.number().int().positive()).max(500).default([]),
});
export type InviteBody = z.input<typeof inviteBodySchema>;

export const updateUserBodySchema = z
  .object({
    name: singleLineText(z.string().trim().min(1).max(120)).optional(),
    role: z.enum(ROLES).optional(),
    status: z.enum(['active', 'disabled']).optional(),
    siteIds: z.array(z.number().int().positive()).max(500).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateUserBody = z.infer<typeof updateUserBodySchema>;

export const OUTBOX_STATUSES = ['queued', 'sent', 'failed'] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

export const outboxMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  createdAt: z.string(),
  /** queued: waiting for (another) attempt; sent: handed to the mail server (or kept here); failed: gave up. */
  status: z.enum(OUTBOX_STATUSES),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string().nullable(),
  sentAt: z.string().nullable(),
  attachments: z.array(z.object({ id: z.number().int(), filename: z.string(), contentType: z.string(), size: z.number().int() })),
  /** Attachments built when the message is delivered (a report PDF), not built yet. */
  pendingAttachments: z.array(z.object({ filename: z.string() })),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export const outboxQuerySchema = z.object({ status: z.enum(OUTBOX_STATUSES).optional() });
export const outboxListResponseSchema = z.object({
  items: z.array(outboxMessageSchema),
  counts: z.object({ queued: z.number().int(), sent: z.number().int(), failed: z.number().int() }),
  /** Where delivered mail goes: a mail server (SMTP_URL), or only this page. */
  delivery: z.enum(['smtp', 'outbox']),
});
export type OutboxListResponse = z.infer<typeof outboxListResponseSchema>;
