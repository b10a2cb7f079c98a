import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { Request, Response } from 'express';
import { z } from 'zod';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { forgotPasswordBodySchema, loginBodySchema, meResponseSchema, sessionResponseSchema, tokenInfoResponseSchema, tokenPasswordBodySchema } from '@shared/schemas/auth';
import type { SessionUser } from '@shared/schemas/auth';
import { tooManyRequests } from '../../http/errors';
import { authenticate, describeToken, redeemToken, requestPasswordReset } from './auth-service';

const WINDOW_MS = 15 * 60_000;

/** Regenerates the session on sign-in, so a planted session id is worthless (fixation). */
function startSession(req: Request, user: SessionUser): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.session.userId = user.id;
      req.session.save((e) => (e ? reject(e) : resolve()));
    });
  });
}

function endSession(req: Request, res: Response): Promise<void> {
  return new Promise((resolve) => req.session.destroy(() => { res.clearCookie('luxtrail.sid'); resolve(); }));
}

export function registerAuthRoutes(api: Api, deps: Deps) {
  const limitHandler = (_req: Request, _res: Response, next: (e: unknown) => void) => next(tooManyRequests('Too many sign-in attempts; wait 15 minutes and try again'));
  // Per address: every attempt counts. Per account: failed attempts count.
  const perAddress = rateLimit({ windowMs: WINDOW_MS, limit: deps.config.signInLimits.perAddress, standardHeaders: 'draft-7', legacyHeaders: false, keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''), handler: limitHandler });
  const perAccount = rateLimit({
    windowMs: WINDOW_MS, limit: deps.config.signInLimits.perAccount, skipSuccessfulRequests: true, standardHeaders: 'draft-7', legacyHeaders: false,
    keyGenerator: (req) => `account:${String(req.body?.email ?? '').trim().toLowerCase()}`, handler: limitHandler,
  });
  const userResponse = meResponseSchema;

  api.route({ method: 'post', path: '/auth/login', access: 'public', tag: 'auth', summary: 'Sign in with e-mail and password', body: loginBodySchema, response: userResponse, before: [perAddress, perAccount] },
    async ({ body, req }) => {
      const user = await authenticate(deps, body.email, body.password);
      await startSession(req, user);
      return { user };
    });

  api.route({ method: 'post', path: '/auth/logout', access: 'public', tag: 'auth', summary: 'Sign out and destroy the session' },
    async ({ req, res }) => { await endSession(req, res); });

  api.route({ method: 'get', path: '/auth/me', access: 'signed_in', tag: 'auth', summary: 'The signed-in user', response: userResponse },
    ({ user }) => ({ user }));

  api.route({ method: 'get', path: '/auth/session', access: 'public', tag: 'auth', summary: 'Who is signed in: the user, or null (200 either way)', response: sessionResponseSchema },
    ({ user }) => ({ user: (user as SessionUser | null) ?? null }));

  const tokenQuery = z.object({ token: z.string().min(20).max(200) });
  api.route({ method: 'get', path: '/auth/tokens', access: 'public', tag: 'auth', summary: 'Who an invitation or reset link is for', query: tokenQuery, response: tokenInfoResponseSchema },
    ({ query }) => describeToken(deps, query.token));

  api.route({ method: 'post', path: '/auth/accept-invite', access: 'public', tag: 'auth', summary: 'Accept an invitation by setting a password', body: tokenPasswordBodySchema, response: userResponse },
    async ({ body, req }) => {
      const user = await redeemToken(deps, body.token, body.password, body.name);
      await startSession(req, user);
      return { user };
    });

  api.route({ method: 'post', path: '/auth/forgot-password', access: 'public', tag: 'auth', summary: 'E-mail a password reset link (answers the same whether or not the account exists)', body: forgotPasswordBodySchema, status: 202, response: z.object({ ok: z.literal(true) }), before: [perAddress] },
    async ({ body }) => { await requestPasswordReset(deps, body.email); return { ok: true as const }; });

  api.route({ method: 'post', path: '/auth/reset-password', access: 'public', tag: 'auth', summary: 'Set a new password from a reset link', body: tokenPasswordBodySchema, response: userResponse },
    async ({ body, req }) => {
      const user = await redeemToken(deps, body.token, body.password);
      await startSession(req, user);
      return { user };
    });
}
