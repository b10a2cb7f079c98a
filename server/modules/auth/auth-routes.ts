import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { Request, Response } from 'express';
import { z } from 'zod';
import type { Api } from '../../http/api';
import type { Deps } from '../../deps';
import { forgotPasswordBodySchema, loginBodySchema, meResponseSchema, sessionResponseSchema, tokenInfoResponseSchema, tokenPasswordBodySchema } from '@shared/schemas/auth';
import type { SessionUser } from '@shared/schemas/auth';
import { tooManyRequests } from '../../http/errors';
import { SqliteRateLimitStore } from '../../http/rate-limit-store';
import { authenticate, describeToken, redeemToken, requestPasswordReset } from './auth-service';

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

/** Fixed windows of every limit below. */
export const LIMIT_WINDOW_MS = 15 * 60_000;

export function registerAuthRoutes(api: Api, deps: Deps) {
  const limited = (message: string) => (_req: Request, _res: Response, next: (e: unknown) => void) => next(tooManyRequests(message));
  const signInLimited = limited('Too many sign-in attempts; wait 15 minutes and try again');
  const address = (req: Request) => ipKeyGenerator(req.ip ?? '');
  const account = (req: Request) => String(req.body?.email ?? '').trim().toLowerCase();
  // The counters live in SQLite, so a restart gives nobody a fresh budget.
  const limiter = (prefix: string, limit: number, keyGenerator: (req: Request) => string, handler: ReturnType<typeof limited>, skipSuccessfulRequests = false) => rateLimit({
    windowMs: LIMIT_WINDOW_MS, limit, keyGenerator, handler, skipSuccessfulRequests, standardHeaders: 'draft-7', legacyHeaders: false,
    store: new SqliteRateLimitStore(deps.db, deps.clock, prefix),
  });
  const { signInLimits, resetLimits } = deps.config;
  // Per address: every sign-in attempt counts.
  const perAddress = limiter('sign-in:address', signInLimits.perAddress, address, signInLimited);
  // Per account AND address: failed attempts count. Someone elsewhere who knows only the e-mail
  // uses up their own address's budget for the account, never the real user's.
  const perAccount = limiter('sign-in:account', signInLimits.perAccount, (req) => `${account(req)}|${address(req)}`, signInLimited, true);
  // Forgot-password has budgets of its own, so asking for links never blocks signing in (or the reverse).
  const resetLimited = limited('Too many reset requests; wait 15 minutes and try again');
  const resetPerAddress = limiter('reset:address', resetLimits.perAddress, address, resetLimited);
  const resetPerAccount = limiter('reset:account', resetLimits.perAccount, (req) => `${account(req)}|${address(req)}`, resetLimited);
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

  api.route({ method: 'post', path: '/auth/forgot-password', access: 'public', tag: 'auth', summary: 'E-mail a password reset link (answers the same whether or not the account exists)', body: forgotPasswordBodySchema, status: 202, response: z.object({ ok: z.literal(true) }), before: [resetPerAddress, resetPerAccount] },
    ({ body }) => { requestPasswordReset(deps, body.email); return { ok: true as const }; });

  api.route({ method: 'post', path: '/auth/reset-password', access: 'public', tag: 'auth', summary: 'Set a new password from a reset link', body: tokenPasswordBodySchema, response: userResponse },
    async ({ body, req }) => {
      const user = await redeemToken(deps, body.token, body.password);
      await startSession(req, user);
      return { user };
    });
}
