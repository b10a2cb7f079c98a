import { z } from 'zod';
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
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role: z.enum(ROLES),
  /** Facility managers may be limited to chosen sites; empty means all sites. */
  siteIds: z.array(z.number().int().positive()).max(500).default([]),
});
export type InviteBody = z.input<typeof inviteBodySchema>;

export const updateUserBodySchema = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
    role: z.enum(ROLES).optional(),
    status: z.enum(['active', 'disabled']).optional(),
    siteIds: z.array(z.number().int().positive()).max(500).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateUserBody = z.infer<typeof updateUserBodySchema>;

export const outboxMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  createdAt: z.string(),
  attachments: z.array(z.object({ id: z.number().int(), filename: z.string(), contentType: z.string(), size: z.number().int() })),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export const outboxListResponseSchema = z.object({ items: z.array(outboxMessageSchema) });
