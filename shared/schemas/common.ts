import { z } from 'zod';

/** The one error shape every API answer uses. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;

export const idParamsSchema = z.object({ id: z.coerce.number().int().positive() });
export type IdParams = z.infer<typeof idParamsSchema>;

export const paginationQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export const emailSchema = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' }));

/** Passwords: long enough to matter, short enough to hash quickly. */
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(200, 'Use at most 200 characters');

export const isoDateTimeSchema = z.iso.datetime({ offset: true });
