import { z } from 'zod';
import { paginationQuerySchema } from './common';

export const auditQuerySchema = paginationQuerySchema.extend({
  probeId: z.coerce.number().int().positive().optional(),
  surveyId: z.coerce.number().int().positive().optional(),
  entityType: z.string().max(40).optional(),
});

/** One entry of the append-only audit trail: who changed what, with the record before and after. */
export const auditEventSchema = z.object({
  id: z.number().int(),
  entityType: z.string(),
  entityId: z.number().int(),
  action: z.string(),
  probeId: z.number().int().nullable(),
  surveyId: z.number().int().nullable(),
  before: z.unknown(),
  after: z.unknown(),
  createdAt: z.string(),
  actorName: z.string().nullable(),
  actorEmail: z.string().nullable(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;
export const auditListResponseSchema = z.object({ items: z.array(auditEventSchema) });
export type AuditListResponse = z.infer<typeof auditListResponseSchema>;
