import { and, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { Deps } from '../../deps';
import { surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import type { SessionUser } from '@shared/schemas/auth';
import type { CreateSiteBody, Site } from '@shared/schemas/sites';
import { createSiteBodySchema } from '@shared/schemas/sites';
import { notFound } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { siteScope } from '../users/users-service';

type SiteRow = typeof sites.$inferSelect;

function present(row: SiteRow, surveyCount: number): Site {
  return { id: row.id, name: row.name, address: row.address, timeZone: row.timeZone, surveyCount, createdAt: new Date(row.createdAt).toISOString() };
}

/** Conditions limiting sites to the caller's organisation and, for a facility manager limited to sites, to those. */
export function siteConditions(db: Deps['db'], user: SessionUser): SQL[] {
  const where: SQL[] = [eq(sites.organizationId, user.organizationId)];
  const scope = siteScope(db, user);
  if (scope) where.push(inArray(sites.id, scope));
  return where;
}

export function listSites(db: Deps['db'], user: SessionUser): Site[] {
  // One grouped query. (A correlated subquery here once counted 0: its columns rendered unqualified, so "id" meant the survey's.)
  const rows = db.select({ site: sites, surveyCount: sql<number>`count(${surveys.id})` })
    .from(sites).leftJoin(surveys, eq(surveys.siteId, sites.id)).where(and(...siteConditions(db, user)))
    .groupBy(sites.id).orderBy(sites.name).all();
  return rows.map((r) => present(r.site, r.surveyCount));
}

/** One site the caller may see; another organisation's (or an out-of-scope) site is a 404. */
export function getSiteRow(db: Deps['db'], user: SessionUser, siteId: number): SiteRow {
  const row = db.select().from(sites).where(and(eq(sites.id, siteId), ...siteConditions(db, user))).get();
  if (!row) throw notFound('Site');
  return row;
}

export function getSite(db: Deps['db'], user: SessionUser, siteId: number): Site {
  const row = getSiteRow(db, user, siteId);
  const n = db.select({ n: sql<number>`count(*)` }).from(surveys).where(eq(surveys.siteId, row.id)).get()!.n;
  return present(row, n);
}

export function createSite(deps: Deps, actor: Pick<SessionUser, 'id' | 'organizationId'>, input: CreateSiteBody): Site {
  const body = createSiteBodySchema.parse(input);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const created = tx.insert(sites).values({ organizationId: actor.organizationId, name: body.name, address: body.address ?? null, timeZone: body.timeZone, createdAt: now }).returning().get();
    recordAudit(tx, { organizationId: actor.organizationId, actorId: actor.id, entityType: 'site', entityId: created.id, action: 'created', after: body, at: now });
    return created;
  });
  return present(row, 0);
}
