import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { organizations, tokens, users } from '../../db/schema/organizations';
import type { SessionUser, TokenInfo } from '@shared/schemas/auth';
import { HttpError, unauthenticated } from '../../http/errors';
import { endSessionsOf } from '../../http/session-store';
import { dummyPasswordHash, hashPassword, hashToken, newToken, verifyPassword } from './passwords';
import { absoluteUrl, paths } from '@shared/paths';

export const INVITE_TTL_MS = 7 * 24 * 3600_000;
export const RESET_TTL_MS = 60 * 60_000;

export function loadSessionUser(db: Deps['db'], userId: number): SessionUser | null {
  const row = db.select({ id: users.id, email: users.email, name: users.name, role: users.role, status: users.status, organizationId: users.organizationId, organizationName: organizations.name })
    .from(users).innerJoin(organizations, eq(organizations.id, users.organizationId)).where(eq(users.id, userId)).get();
  if (!row || row.status !== 'active') return null;
  const { status: _status, ...user } = row;
  return user;
}

/** Checks e-mail and password; the same answer for an unknown e-mail and a wrong password. */
export async function authenticate(deps: Deps, email: string, password: string): Promise<SessionUser> {
  const row = deps.db.select().from(users).where(eq(users.email, email)).get();
  const ok = row?.passwordHash ? await verifyPassword(row.passwordHash, password) : (await verifyPassword(await dummyPasswordHash(), password), false);
  if (!row || !ok || row.status !== 'active') throw unauthenticated('The e-mail or password is not right');
  return loadSessionUser(deps.db, row.id)!;
}

type Tx = Pick<Deps['db'], 'insert' | 'update'>;

/** Issues a single-use token for a user inside the caller's transaction and returns the link to send. */
export function issueToken(tx: Tx, deps: Deps, userId: number, purpose: 'invite' | 'reset'): string {
  const { token, tokenHash } = newToken();
  const now = deps.clock.now();
  // A new link replaces any earlier unused one of the same purpose.
  tx.update(tokens).set({ usedAt: now }).where(and(eq(tokens.userId, userId), eq(tokens.purpose, purpose), isNull(tokens.usedAt))).run();
  tx.insert(tokens).values({ userId, purpose, tokenHash, expiresAt: now + (purpose === 'invite' ? INVITE_TTL_MS : RESET_TTL_MS), createdAt: now }).run();
  return absoluteUrl(deps.config.publicUrl, (purpose === 'invite' ? paths.acceptInvite : paths.resetPassword).to(token));
}

function findLiveToken(deps: Deps, token: string) {
  const row = deps.db.select({ id: tokens.id, userId: tokens.userId, purpose: tokens.purpose, email: users.email, name: users.name, organizationName: organizations.name })
    .from(tokens).innerJoin(users, eq(users.id, tokens.userId)).innerJoin(organizations, eq(organizations.id, users.organizationId))
    .where(and(eq(tokens.tokenHash, hashToken(token)), isNull(tokens.usedAt), gt(tokens.expiresAt, deps.clock.now()))).get();
  if (!row) throw new HttpError(410, 'token_invalid', 'This link has expired or was already used; ask for a new one');
  return row;
}

export function describeToken(deps: Deps, token: string): TokenInfo {
  const row = findLiveToken(deps, token);
  return { email: row.email, name: row.name, organizationName: row.organizationName, purpose: row.purpose };
}

/**
 * Sets the password from an invitation or reset link, marks the token used and activates the user.
 * A reset also ends every session of the account (whoever holds them); the caller then starts one.
 */
export async function redeemToken(deps: Deps, token: string, password: string, name?: string): Promise<SessionUser> {
  const row = findLiveToken(deps, token);
  const passwordHash = await hashPassword(password);
  deps.db.transaction((tx) => {
    // Re-check inside the transaction so two concurrent redemptions cannot both succeed.
    const claimed = tx.update(tokens).set({ usedAt: deps.clock.now() }).where(and(eq(tokens.id, row.id), isNull(tokens.usedAt))).run();
    if (claimed.changes !== 1) throw new HttpError(410, 'token_invalid', 'This link was already used');
    tx.update(users).set({ passwordHash, ...(row.purpose === 'invite' ? { status: 'active' as const } : {}), ...(name ? { name } : {}) }).where(eq(users.id, row.userId)).run();
    endSessionsOf(tx, row.userId);
  });
  const user = loadSessionUser(deps.db, row.userId);
  if (!user) throw unauthenticated('This account is disabled');
  return user;
}

/** Queues a reset link if the e-mail belongs to an active account; says nothing either way. */
export function requestPasswordReset(deps: Deps, email: string): void {
  const row = deps.db.select().from(users).where(eq(users.email, email)).get();
  if (!row || row.status !== 'active') return;
  deps.db.transaction((tx) => {
    const link = issueToken(tx, deps, row.id, 'reset');
    deps.mailer.queue(tx, {
      to: row.email,
      organizationId: row.organizationId,
      subject: 'Reset your Luxtrail password',
      text: `Hello ${row.name},\n\nSomeone asked to reset the password of your Luxtrail account. If it was you, open this link within an hour:\n\n${link}\n\nIf it was not you, ignore this message; your password stays as it is.\n`,
    });
  });
}
