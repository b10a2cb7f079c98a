import { max } from 'simple-statistics';
import fs from 'node:fs';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { imageSizeFromFile } from 'image-size/fromFile';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { logImports, readings, surveys } from '../../db/schema/surveys';
import { sites } from '../../db/schema/sites';
import { storedFiles } from '../../db/schema/organizations';
import type { SessionUser } from '@shared/schemas/auth';
import { MIN_SCALE_SPAN_PX, PLAN_IMAGE_MAX_SIDE_PX, type CreatePlanFields, type Plan, type UpdatePlanBody } from '@shared/schemas/plans';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { keepUploadedFile, sniffFile, storedPath } from '../../lib/file-store';
import { recordAudit } from '../audit/audit-service';
import { siteScope } from '../users/users-service';
import { apiFiles } from '@shared/paths';

type PlanRow = typeof plans.$inferSelect;

/** The site if it belongs to the caller's organisation and, for a facility manager, to their sites; else 404. */
export function findVisibleSite(db: Db, user: SessionUser, siteId: number) {
  const site = db.select().from(sites).where(and(eq(sites.id, siteId), eq(sites.organizationId, user.organizationId))).get();
  const scope = siteScope(db, user);
  if (!site || (scope && !scope.includes(site.id))) throw notFound('Site');
  return site;
}

/** The plan row if the caller may see it (organisation and site scope); else 404. */
export function findVisiblePlan(db: Db, user: SessionUser, planId: number): PlanRow {
  const row = db.select({ plan: plans, orgId: sites.organizationId }).from(plans).innerJoin(sites, eq(sites.id, plans.siteId)).where(eq(plans.id, planId)).get();
  const scope = siteScope(db, user);
  if (!row || row.orgId !== user.organizationId || (scope && !scope.includes(row.plan.siteId))) throw notFound('Plan');
  return row.plan;
}

export function planExtent(plan: Pick<PlanRow, 'widthPx' | 'heightPx' | 'metresPerPixel'>) {
  return plan.metresPerPixel ? { widthM: plan.widthPx * plan.metresPerPixel, heightM: plan.heightPx * plan.metresPerPixel } : null;
}

function presentPlans(db: Db, rows: PlanRow[]): Plan[] {
  if (rows.length === 0) return [];
  const files = db.select({ id: storedFiles.id, sha256: storedFiles.sha256, contentType: storedFiles.contentType }).from(storedFiles).where(inArray(storedFiles.id, rows.map((r) => r.fileId))).all();
  const counts = db.select({ planId: zones.planId, n: sql<number>`count(*)` }).from(zones).where(inArray(zones.planId, rows.map((r) => r.id))).groupBy(zones.planId).all();
  return rows.map((r) => {
    const file = files.find((f) => f.id === r.fileId)!;
    const extent = planExtent(r);
    return {
      id: r.id, siteId: r.siteId, name: r.name, widthPx: r.widthPx, heightPx: r.heightPx, metresPerPixel: r.metresPerPixel,
      widthM: extent?.widthM ?? null, heightM: extent?.heightM ?? null,
      // The content hash in the address: a replaced image is a new URL, so no cache shows the old one.
      imageUrl: apiFiles.planImage(r.id, file.sha256), imageSha256: file.sha256, contentType: file.contentType,
      zoneCount: counts.find((c) => c.planId === r.id)?.n ?? 0,
      createdAt: new Date(r.createdAt).toISOString(),
    };
  });
}

export function listPlans(db: Db, user: SessionUser, siteId: number): Plan[] {
  findVisibleSite(db, user, siteId);
  return presentPlans(db, db.select().from(plans).where(eq(plans.siteId, siteId)).orderBy(asc(plans.id)).all());
}

export function getPlan(db: Db, user: SessionUser, planId: number): Plan {
  return presentPlans(db, [findVisiblePlan(db, user, planId)])[0];
}

/** Image size as the browser shows it: EXIF orientations 5-8 turn the picture a quarter. */
async function displayedImageSize(filePath: string): Promise<{ widthPx: number; heightPx: number }> {
  let size;
  try {
    size = await imageSizeFromFile(filePath);
  } catch {
    throw unprocessable('The plan image could not be read: the file may be damaged');
  }
  if (!size.width || !size.height) throw unprocessable('The plan image has no readable width and height');
  const turned = size.orientation !== undefined && size.orientation >= 5;
  return turned ? { widthPx: size.height, heightPx: size.width } : { widthPx: size.width, heightPx: size.height };
}

/** An uploaded plan image's type and displayed size, or 415 / 422 saying what is wrong with it. */
async function checkedPlanImage(filePath: string) {
  const contentType = await sniffFile(filePath, 'image');
  const { widthPx, heightPx } = await displayedImageSize(filePath);
  if (widthPx > PLAN_IMAGE_MAX_SIDE_PX || heightPx > PLAN_IMAGE_MAX_SIDE_PX) {
    throw unprocessable(`The plan image is ${widthPx} x ${heightPx} pixels; export it with no side over ${PLAN_IMAGE_MAX_SIDE_PX} pixels`);
  }
  return { contentType, widthPx, heightPx };
}

/** Checks the upload's content and size, keeps it by content hash, and records the plan. */
export async function createPlan(deps: Deps, user: SessionUser, siteId: number, upload: { path: string; originalname: string }, fields: CreatePlanFields): Promise<Plan> {
  try {
    findVisibleSite(deps.db, user, siteId);
    const { contentType, widthPx, heightPx } = await checkedPlanImage(upload.path);
    const file = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: upload.path, filename: upload.originalname || 'plan', contentType });
    const now = deps.clock.now();
    const row = deps.db.transaction((tx) => {
      const plan = tx.insert(plans).values({
        siteId, name: fields.name, fileId: file.id, widthPx, heightPx,
        metresPerPixel: fields.widthM ? fields.widthM / widthPx : null, createdAt: now,
      }).returning().get();
      recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'plan', entityId: plan.id, action: 'created', after: { name: plan.name, siteId, widthPx, heightPx, metresPerPixel: plan.metresPerPixel, sha256: file.sha256 }, at: now });
      return plan;
    });
    return presentPlans(deps.db, [row])[0];
  } finally {
    fs.rmSync(upload.path, { force: true });
  }
}

/**
 * Renames a plan and/or sets its scale (by width, or by two image points and their distance).
 * Zones keep their place on the image: their corners are rescaled with the plan.
 */
export function updatePlan(deps: Deps, user: SessionUser, planId: number, body: UpdatePlanBody): Plan {
  const plan = findVisiblePlan(deps.db, user, planId);
  let metresPerPixel = plan.metresPerPixel;
  if (body.widthM !== undefined) metresPerPixel = body.widthM / plan.widthPx;
  if (body.scalePoints && body.distanceM !== undefined) {
    const [[x1, y1], [x2, y2]] = body.scalePoints;
    const outside = body.scalePoints.findIndex(([x, y]) => x > plan.widthPx || y > plan.heightPx);
    if (outside >= 0) throw unprocessable(`Scale point ${outside + 1} lies outside the image (${plan.widthPx} x ${plan.heightPx} pixels)`);
    const spanPx = Math.hypot(x2 - x1, y2 - y1);
    if (spanPx < MIN_SCALE_SPAN_PX) throw unprocessable(`The two scale points are ${spanPx.toFixed(1)} pixels apart; pick points at least ${MIN_SCALE_SPAN_PX} pixels apart, ideally across the plan`);
    metresPerPixel = body.distanceM / spanPx;
  }
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(plans).set({ ...(body.name ? { name: body.name } : {}), metresPerPixel }).where(eq(plans.id, planId)).run();
    const factor = plan.metresPerPixel && metresPerPixel && metresPerPixel !== plan.metresPerPixel ? metresPerPixel / plan.metresPerPixel : null;
    if (factor) {
      for (const z of tx.select({ id: zones.id, polygon: zones.polygon }).from(zones).where(eq(zones.planId, planId)).all()) {
        tx.update(zones).set({ polygon: z.polygon.map(([x, y]) => [x * factor, y * factor] as [number, number]) }).where(eq(zones.id, z.id)).run();
      }
    }
    recordAudit(tx, {
      organizationId: user.organizationId, actorId: user.id, entityType: 'plan', entityId: planId, action: metresPerPixel !== plan.metresPerPixel ? 'scale_set' : 'updated',
      before: { name: plan.name, metresPerPixel: plan.metresPerPixel }, after: { name: body.name ?? plan.name, metresPerPixel, zonesRescaledBy: factor }, at: now,
    });
  });
  return getPlan(deps.db, user, planId);
}

/**
 * Replaces a plan's image (a cleaner scan, a revised drawing of the same floor). The plan keeps its
 * width in metres, so zones and readings keep their coordinates; its height follows the new image.
 * A zone that would reach beyond the new image answers 422 naming it, and nothing changes.
 */
export async function replacePlanImage(deps: Deps, user: SessionUser, planId: number, upload: { path: string; originalname: string }): Promise<Plan> {
  try {
    const plan = findVisiblePlan(deps.db, user, planId);
    const { contentType, widthPx, heightPx } = await checkedPlanImage(upload.path);
    const widthM = plan.metresPerPixel === null ? null : plan.metresPerPixel * plan.widthPx;
    const metresPerPixel = widthM === null ? null : widthM / widthPx;
    if (metresPerPixel !== null) {
      const heightM = heightPx * metresPerPixel;
      // A millimetre of slack: corners drawn on the old image's edge stay on the new one's.
      const beyond = deps.db.select({ name: zones.name, polygon: zones.polygon }).from(zones).where(eq(zones.planId, planId)).all()
        .find((z) => z.polygon.some(([, y]) => y > heightM + 0.001));
      if (beyond) {
        const top = max(beyond.polygon.map(([, y]) => y));
        throw unprocessable(`Zone "${beyond.name}" reaches ${top.toFixed(2)} m up, but at this plan's width (${widthM!.toFixed(2)} m) the new image is only ${heightM.toFixed(2)} m high: use an image of the same drawing with the same proportions, or redraw the zone`);
      }
    }
    const file = await keepUploadedFile(deps, { organizationId: user.organizationId, userId: user.id, tmpPath: upload.path, filename: upload.originalname || 'plan', contentType });
    deps.db.transaction((tx) => {
      tx.update(plans).set({ fileId: file.id, widthPx, heightPx, metresPerPixel }).where(eq(plans.id, planId)).run();
      recordAudit(tx, {
        organizationId: user.organizationId, actorId: user.id, entityType: 'plan', entityId: planId, action: 'image_replaced',
        before: { fileId: plan.fileId, widthPx: plan.widthPx, heightPx: plan.heightPx, metresPerPixel: plan.metresPerPixel },
        after: { fileId: file.id, widthPx, heightPx, metresPerPixel, sha256: file.sha256 }, at: deps.clock.now(),
      });
    });
    return getPlan(deps.db, user, planId);
  } finally {
    fs.rmSync(upload.path, { force: true });
  }
}

/**
 * Deletes a plan uploaded by mistake. Only an unused plan goes: one with zones, with readings of
 * any survey placed on it (in any decode, so earlier decodes and sign-offs keep their plan) or
 * named as an upload's plan answers 409 saying what holds it. The image file stays in the store.
 */
export function deletePlan(deps: Deps, user: SessionUser, planId: number): void {
  const plan = findVisiblePlan(deps.db, user, planId);
  deps.db.transaction((tx) => {
    const zoneCount = tx.select({ n: sql<number>`count(*)` }).from(zones).where(eq(zones.planId, planId)).get()!.n;
    if (zoneCount > 0) throw conflict(`Plan "${plan.name}" has ${zoneCount} zone(s): delete them first, then the plan`);
    const used = tx.selectDistinct({ name: surveys.name }).from(readings).innerJoin(surveys, eq(surveys.id, readings.surveyId)).where(eq(readings.planId, planId)).orderBy(surveys.name).all();
    if (used.length > 0) throw conflict(`Plan "${plan.name}" holds readings of ${used.length} survey(s) (${used.map((u) => u.name).join(', ')}): it stays as their record`);
    const named = tx.select({ id: logImports.id }).from(logImports).where(eq(logImports.planId, planId)).get();
    if (named) throw conflict(`Plan "${plan.name}" was chosen for the rows of log import ${named.id}: it stays as that import's record`);
    tx.delete(plans).where(eq(plans.id, planId)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'plan', entityId: planId, action: 'deleted', before: { name: plan.name, siteId: plan.siteId, fileId: plan.fileId }, at: deps.clock.now() });
  });
}

/** The stored image of a plan the caller may see: path, type and hash (for the ETag). */
export function planImage(deps: Deps, user: SessionUser, planId: number) {
  const plan = findVisiblePlan(deps.db, user, planId);
  const file = deps.db.select().from(storedFiles).where(and(eq(storedFiles.id, plan.fileId), eq(storedFiles.organizationId, user.organizationId))).get();
  if (!file) throw notFound('Plan image');
  const filePath = storedPath(deps, file.sha256);
  if (!fs.existsSync(filePath)) throw notFound('Plan image file');
  return { filePath, contentType: file.contentType, sha256: file.sha256, size: file.size };
}
