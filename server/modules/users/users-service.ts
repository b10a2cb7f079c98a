import { and, eq, inArray } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { userSites, users } from '../../db/schema/organizations';
import { sites } from '../../db/schema/sites';
import type { InviteBody, UpdateUserBody, User } from '@shared/schemas/users';
import { ROLE_LABELS } from '@shared/roles';
import type { SessionUser } from '@shared/schemas/auth';
import { badRequest, conflict, notFound } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { issueToken } from '../auth/auth-service';
import { endSessionsOf } from '../../http/session-store';

export function listUsers(db: Deps['db'], organizationId: number): User[] {
  const rows = db.select().from(users).where(eq(users.organizationId, organizationId)).orderBy(users.name).all();
  const links = rows.length ? db.select().from(userSites).where(inArray(userSites.userId, rows.map((r) => r.id))).all() : [];
  return rows.map((r) => ({
    id: r.id, email: r.email, name: r.name, role: r.role, status: r.status,
    siteIds: links.filter((l) => l.userId === r.id).map((l) => l.siteId),
    createdAt: new Date(r.createdAt).toISOString(),
  }));
}

function assertSitesInOrganization(db: Deps['db'], organizationId: number, siteIds: number[]) {
  if (siteIds.length === 0) return;
  const found = db.select({ id: sites.id }).from(sites).where(and(eq(sites.organizationId, organizationId), inArray(sites.id, siteIds))).all();
  const missing = siteIds.filter((id) => !found.some((f) => f.id === id));
  if (missing.length) throw badRequest(`Unknown site ${missing.join(', ')} for this organisation`, { siteIds: missing });
}

/** Creates an invited user and queues a single-use link to set a password, in one transaction. */
export function inviteUser(deps: Deps, actor: SessionUser, body: InviteBody): User {
  const existing = deps.db.select({ id: users.id }).from(users).where(eq(users.email, body.email)).get();
  if (existing) throw conflict(`${body.email} already has a Luxtrail account`);
  const siteIds = body.role === 'facility_manager' ? (body.siteIds ?? []) : [];
  assertSitesInOrganization(deps.db, actor.organizationId, siteIds);
  const now = deps.clock.now();
  const id = deps.db.transaction((tx) => {
    const row = tx.insert(users).values({ organizationId: actor.organizationId, email: body.email, name: body.name, role: body.role, status: 'invited', createdAt: now }).returning({ id: users.id }).get();
    for (const siteId of siteIds) tx.insert(userSites).values({ userId: row.id, siteId }).run();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'user', entityId: row.id, action: 'invited', after: { email: body.email, role: body.role, siteIds }, at: now });
    queueInvitation(tx, deps, actor, { id: row.id, email: body.email, name: body.name, role: body.role });
    return row.id;
  });
  return listUsers(deps.db, actor.organizationId).find((u) => u.id === id)!;
}

/** Sends an invited user a fresh link (the earlier one stops working). */
export function sendInvitation(deps: Deps, actor: SessionUser, userId: number): void {
  const user = deps.db.select().from(users).where(and(eq(users.id, userId), eq(users.organizationId, actor.organizationId))).get();
  if (!user) throw notFound('User');
  if (user.status !== 'invited') throw conflict('This user has already accepted their invitation');
  deps.db.transaction((tx) => queueInvitation(tx, deps, actor, user));
}

function queueInvitation(tx: Parameters<Parameters<Deps['db']['transaction']>[0]>[0], deps: Deps, actor: SessionUser, user: Pick<typeof users.$inferSelect, 'id' | 'email' | 'name' | 'role'>) {
  const link = issueToken(tx, deps, user.id, 'invite');
  deps.mailer.queue(tx, {
    to: user.email,
    organizationId: actor.organizationId,
    subject: `${actor.name} invited you to Luxtrail`,
    text: `Hello ${user.name},\n\n${actor.name} invited you to ${actor.organizationName} on Luxtrail as ${ROLE_LABELS[user.role]}.\nOpen this link within 7 days to choose your password:\n\n${link}\n\nThe link works once.\n`,
  });
}

export function updateUser(deps: Deps, actor: SessionUser, userId: number, body: UpdateUserBody): User {
  const before = listUsers(deps.db, actor.organizationId).find((u) => u.id === userId);
  if (!before) throw notFound('User');
  if (userId === actor.id && (body.role && body.role !== 'admin' || body.status === 'disabled')) {
    throw conflict('You cannot remove your own administrator access; ask another admin');
  }
  if (body.siteIds) assertSitesInOrganization(deps.db, actor.organizationId, body.siteIds);
  deps.db.transaction((tx) => {
    const set = { ...(body.name ? { name: body.name } : {}), ...(body.role ? { role: body.role } : {}), ...(body.status ? { status: body.status } : {}) };
    if (Object.keys(set).length) tx.update(users).set(set).where(eq(users.id, userId)).run();
    if (body.siteIds) {
      tx.delete(userSites).where(eq(userSites.userId, userId)).run();
      for (const siteId of body.siteIds) tx.insert(userSites).values({ userId, siteId }).run();
    }
    // Disabled, or given another role: signed out everywhere, so no open page keeps the old access.
    if (body.status === 'disabled' || (body.role && body.role !== before.role)) endSessionsOf(tx, userId);
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'user', entityId: userId, action: 'updated', before, after: body, at: deps.clock.now() });
  });
  return listUsers(deps.db, actor.organizationId).find((u) => u.id === userId)!;
}

/** Sites a user may see: null means every site of the organisation. */
export function siteScope(db: Deps['db'], user: SessionUser): number[] | null {
  if (user.role !== 'facility_manager') return null;
  const rows = db.select({ siteId: userSites.siteId }).from(userSites).where(eq(userSites.userId, user.id)).all();
  return rows.length ? rows.map((r) => r.siteId) : null;
}
