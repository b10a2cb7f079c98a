import { z } from 'zod';
import { singleLineText } from './text';
import { ROLES } from '../roles';
import { emailSchema, passwordSchema } from './common';

/** What a one-time e-mailed token is for. Stored codes. */
export const TOKEN_PURPOSES = ['invite', 'reset'] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

export const loginBodySchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginBody = z.infer<typeof loginBodySchema>;

export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  organizationId: z.number().int(),
  organizationName: z.string(),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const meResponseSchema = z.object({ user: sessionUserSchema });
/** Who is signed in, if anyone: answered 200 either way, so a signed-out browser logs no error. */
export const sessionResponseSchema = z.object({ user: sessionUserSchema.nullable() });

export const tokenPasswordBodySchema = z
  .object({
    token: z.string().min(20).max(200),
    password: passwordSchema,
    confirmPassword: z.string(),
    name: singleLineText(z.string().trim().min(1).max(120)).optional(),
  })
  .refine((v) => v.password === v.confirmPassword, { message: 'The passwords do not match', path: ['confirmPassword'] });
export type TokenPasswordBody = z.infer<typeof tokenPasswordBodySchema>;

export const forgotPasswordBodySchema = z.object({ email: emailSchema });
export type ForgotPasswordBody = z.infer<typeof forgotPasswordBodySchema>;

export const tokenInfoResponseSchema = z.object({
  email: z.string(),
  name: z.string(),
  organizationName: z.string(),
  purpose: z.enum(TOKEN_PURPOSES),
});
export type TokenInfo = z.infer<typeof tokenInfoResponseSchema>;
