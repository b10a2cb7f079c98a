import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Deps } from '../../deps';
import type { Db } from '../../db/client';
import { plans, zones } from '../../db/schema/plans';
import { readings, surveys } from '../../db/schema/surveys';
import { plannedPoints, readingPlacements, surveyGrids, type GeneratedPoint } from '../../db/schema/grids';
import type { SessionUser } from '@shared/schemas/auth';
import { WORKED_ON_STATUSES } from '@shared/survey-abilities';
import type {
  CreatePlannedPointBody, GenerateGridBody, MovePlannedPointBody, PlannedPoint, PlannedPointsResponse, SurveyGrid,
} from '@shared/schemas/planned-points';
import {
  ceilingGrid, ceilingLabel, gridCountsByRounding, gridDiffersFromGenerated, gridLabel, GridError, isNarrowZone, labelKey, measurementGrid,
  wallGrids, wallLabel, zoneCode, GRID_ROUNDINGS, GRID_SURFACES, GRID_ROUNDING_TEXT, GRID_LAYOUT_TEXT, GRID_SURFACE_TEXT, SURFACE_PLANE,
  type GridLayout, type GridRounding, type GridSurface, type GridZone, type PlannedPlane,
} from '@shared/spatial/measurement-grid';
import { createZoneAssigner } from '@shared/spatial/zone-assignment';
import { conflict, notFound, unprocessable } from '../../http/errors';
import { recordAudit } from '../audit/audit-service';
import { currentReadingConditions, getSurveyRow, type SurveyRow } from '../surveys/surveys-service';
import { planExtent } from '../plans/plans-service';
import { computeTask, runComputeBySize } from '../../compute/compute-pool';
import { keptReadingTotal } from '../surveys/reading-counts';

type ZoneRow = typeof zones.$inferSelect;
type PlanRow = typeof plans.$inferSelect;
type GridRow = typeof surveyGrids.$inferSelect;
type PointRow = typeof plannedPoints.$inferSelect;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Planned points, placements and exclusions change only while the survey is a draft or returned (409 otherwise). */
export function assertSurveyEditable(survey: Pick<SurveyRow, 'status' | 'name'>, what: string): void {
  if (!WORKED_ON_STATUSES.includes(survey.status)) {
    throw conflict(`Survey "${survey.name}" is ${survey.status.replace('_', ' ')}: ${what} can change only while it is a draft or returned for changes`);
  }
}

/** A zone on a plan of the survey's site; another site's or organisation's zone answers 404. */
function zoneOfSurvey(db: Db, survey: SurveyRow, zoneId: number): { zone: ZoneRow; plan: PlanRow } {
  const row = db.select({ zone: zones, plan: plans }).from(zones).innerJoin(plans, eq(plans.id, zones.planId)).where(eq(zones.id, zoneId)).get();
  if (!row || row.plan.siteId !== survey.siteId) throw notFound('Zone');
  return row;
}

function planOfSurvey(db: Db, survey: SurveyRow, planId: number): PlanRow {
  const plan = db.select().from(plans).where(eq(plans.id, planId)).get();
  if (!plan || plan.siteId !== survey.siteId) throw notFound('Plan');
  return plan;
}

function requireScale(plan: PlanRow) {
  const extent = planExtent(plan);
  if (!extent) throw conflict(`Plan "${plan.name}" has no scale yet: set its scale before planning points in metres`);
  return extent;
}

const fmt = (v: number) => (Math.round(v * 100) / 100).toString();

function insidePlan(plan: PlanRow, x: number, y: number, what: string) {
  const extent = requireScale(plan);
  if (x < 0 || y < 0 || x > extent.widthM || y > extent.heightM) {
    throw unprocessable(`${what} at (${fmt(x)}, ${fmt(y)}) m lies outside plan "${plan.name}" (0 to ${fmt(extent.widthM)} m across, 0 to ${fmt(extent.heightM)} m up)`);
  }
}

function insideZone(zone: ZoneRow, x: number, y: number, what: string) {
  const assign = createZoneAssigner([{ id: zone.id, kind: zone.kind, wallBandM: zone.wallBandM, polygon: zone.polygon }]);
  if (assign([x, y]).zoneId === null) throw unprocessable(`${what} at (${fmt(x)}, ${fmt(y)}) m lies outside zone "${zone.name}"`);
}

const isChanged = (grid: Pick<GridRow, 'generated'>, points: Pick<PointRow, 'label' | 'xM' | 'yM'>[]) => gridDiffersFromGenerated(grid.generated, points);

/** Current task readings per label key (lower-cased, trimmed), for the given keys: reads every current reading. */
function countLabels(db: Db, input: { survey: { id: number; activeDecodeId: number | null }; keys: string[] }): [string, number][] {
  return db.select({ key: sql<string>`lower(trim(${readings.point}))`, n: sql<number>`count(*)` }).from(readings)
    .where(and(...currentReadingConditions(input.survey), eq(readings.role, 'task'), inArray(sql`lower(trim(${readings.point}))`, input.keys)))
    .groupBy(sql`lower(trim(${readings.point}))`).all().map((r) => [r.key, r.n]);
}

/** Declared in server/modules.ts (planned-points): a large survey's labels are counted on a compute thread. */
export const labelCountsTask = computeTask('planned-point-label-counts', countLabels);

/** Number of current readings per planned point: by the log's label, plus readings placed on the point by hand. */
export async function readingCountsByPoint(db: Db, survey: SurveyRow, points: PointRow[]): Promise<Map<number, number>> {
  const out = new Map<number, number>(points.map((p) => [p.id, 0]));
  if (points.length === 0 || survey.activeDecodeId === null) return out;
  const byKey = new Map(points.map((p) => [p.labelKey, p.id]));
  const rows = await runComputeBySize(db, keptReadingTotal(db, survey.id), labelCountsTask, { survey: { id: survey.id, activeDecodeId: survey.activeDecodeId }, keys: [...byKey.keys()] });
  for (const [key, n] of rows) {
    const id = byKey.get(key);
    if (id !== undefined) out.set(id, (out.get(id) ?? 0) + n);
  }
  const placed = db.select({ id: readingPlacements.plannedPointId, point: readingPlacements.point }).from(readingPlacements)
    .where(and(eq(readingPlacements.surveyId, survey.id), eq(readingPlacements.state, 'placed'))).all();
  for (const p of placed) {
    // A reading whose own label already names the point is counted once.
    if (p.id !== null && out.has(p.id) && byKey.get(labelKey(p.point)) !== p.id) out.set(p.id, (out.get(p.id) ?? 0) + 1);
  }
  return out;
}

/** A surface grid as computed from the zone's outline, before its labels take the zone's code. */
type SurfaceGrid = {
  layout: GridLayout;
  spacingM: number;
  dM: number;
  /** One line per wall for wall grids (their d and spacing differ), empty otherwise. */
  notes: string[];
  points: { label: (code: string) => string; xM: number; yM: number; plane: PlannedPlane; heightM: number | null; azimuthDeg: number | null }[];
};

const m2 = (v: number) => v.toFixed(2);

/** The grid of one surface of a zone (shared/spatial/measurement-grid); throws GridError. */
function surfaceGrid(zone: GridZone, surface: GridSurface, rounding: GridRounding, layout: GridLayout, wallHeightM: number | null): SurfaceGrid {
  const plane = SURFACE_PLANE[surface];
  if (surface === 'walls') {
    const walls = wallGrids(zone, { rounding, wallHeightM: wallHeightM ?? 0 });
    const longest = walls.reduce((a, b) => (b.lengthM > a.lengthM ? b : a));
    return {
      layout: 'full', spacingM: longest.spacingM, dM: longest.dM,
      notes: walls.map((w) => `Wall ${w.wall} (${m2(w.lengthM)} m × ${m2(w.heightM)} m, facing ${Math.round(w.azimuthDeg)}°): d ${m2(w.dM)} m, p ${m2(w.spacingM)} m, ${w.columns} × ${w.rows} points${w.dropped > 0 ? `, ${w.dropped} outside the outline dropped` : ''}.`),
      points: walls.flatMap((w) => w.points.map((p) => ({ label: (code: string) => wallLabel(code, w.wall, p.row, p.col), xM: p.xM, yM: p.yM, plane, heightM: p.heightM, azimuthDeg: w.azimuthDeg }))),
    };
  }
  const grid = surface === 'ceiling' ? ceilingGrid(zone, { rounding }) : measurementGrid(zone, { rounding, layout });
  const label = surface === 'ceiling' ? ceilingLabel : gridLabel;
  return {
    layout: grid.layout, spacingM: grid.spacingM, dM: grid.dM, notes: [],
    points: grid.points.map((p) => ({ label: (code: string) => label(code, p.row, p.col), xM: p.xM, yM: p.yM, plane, heightM: null, azimuthDeg: null })),
  };
}

function presentGrid(grid: GridRow, zone: ZoneRow, points: PointRow[]): SurveyGrid {
  const shape = { kind: zone.kind, wallBandM: zone.wallBandM, polygon: zone.polygon };
  let counts = { next_higher: 0, nearest: 0 };
  const notes: string[] = [GRID_SURFACE_TEXT[grid.surface], GRID_ROUNDING_TEXT[grid.rounding]];
  if (grid.surface === 'working_plane') notes.push(GRID_LAYOUT_TEXT[grid.layout]);
  try {
    if (grid.surface === 'working_plane') counts = gridCountsByRounding(shape);
    else {
      for (const r of GRID_ROUNDINGS) {
        const g = surfaceGrid(shape, grid.surface, r, 'full', grid.wallHeightM);
        counts[r] = g.points.length;
        if (r === grid.rounding) notes.push(...g.notes);
      }
    }
  } catch (e) {
    if (!(e instanceof GridError)) throw e;
    notes.push(e.message);
  }
  const changed = isChanged(grid, points);
  if (counts.next_higher !== counts.nearest) notes.push(`The two readings of the rounding differ here: ${counts.next_higher} points (next higher) against ${counts.nearest} (nearest).`);
  if (changed && !grid.reason) notes.push('Changed grid without a written reason.');
  return {
    id: grid.id, zoneId: zone.id, zoneName: zone.name, planId: grid.planId, code: grid.code, surface: grid.surface, wallHeightM: grid.wallHeightM,
    rounding: grid.rounding, layout: grid.layout,
    spacingM: grid.spacingM, dM: grid.dM, generatedCount: grid.generated.length, pointCount: points.length,
    countsByRounding: counts, roundingsDiffer: counts.next_higher !== counts.nearest, changed, reason: grid.reason,
    narrow: isNarrowZone(zone.polygon), notes,
  };
}

/** Every grid and planned point of a survey (optionally one plan's), with reading counts. */
export function listPlannedPoints(db: Db, user: SessionUser, surveyId: number, planId?: number): Promise<PlannedPointsResponse> {
  const survey = getSurveyRow(db, user, surveyId);
  if (planId !== undefined) planOfSurvey(db, survey, planId);
  return plannedPointsOf(db, survey, planId);
}

export async function plannedPointsOf(db: Db, survey: SurveyRow, planId?: number): Promise<PlannedPointsResponse> {
  const gridRows = db.select({ grid: surveyGrids, zone: zones }).from(surveyGrids).innerJoin(zones, eq(zones.id, surveyGrids.zoneId))
    .where(and(eq(surveyGrids.surveyId, survey.id), ...(planId !== undefined ? [eq(surveyGrids.planId, planId)] : []))).orderBy(asc(surveyGrids.code)).all()
    .sort((a, b) => a.grid.code.localeCompare(b.grid.code) || GRID_SURFACES.indexOf(a.grid.surface) - GRID_SURFACES.indexOf(b.grid.surface));
  const points = db.select().from(plannedPoints)
    .where(and(eq(plannedPoints.surveyId, survey.id), ...(planId !== undefined ? [eq(plannedPoints.planId, planId)] : []))).orderBy(asc(plannedPoints.id)).all();
  const counts = await readingCountsByPoint(db, survey, points);
  const byGrid = new Map<number, PointRow[]>();
  for (const p of points) byGrid.set(p.gridId, [...(byGrid.get(p.gridId) ?? []), p]);
  return {
    surveyId: survey.id, rounding: survey.gridRounding, roundingText: GRID_ROUNDING_TEXT[survey.gridRounding],
    grids: gridRows.map((g) => presentGrid(g.grid, g.zone, byGrid.get(g.grid.id) ?? [])),
    items: points.map((p) => presentPoint(p, counts.get(p.id) ?? 0)),
  };
}

function presentPoint(p: PointRow, readingCount: number): PlannedPoint {
  return {
    id: p.id, gridId: p.gridId, planId: p.planId, zoneId: p.zoneId, label: p.label, xM: p.xM, yM: p.yM,
    plane: p.plane, heightM: p.heightM, azimuthDeg: p.azimuthDeg, origin: p.origin, readingCount,
  };
}

/** Label keys already used in the survey, except those of the given grid (it is being replaced). */
function takenLabels(tx: Pick<Db, 'select'>, surveyId: number, exceptGridId: number | null): Map<string, string> {
  const rows = tx.select({ key: plannedPoints.labelKey, label: plannedPoints.label, gridId: plannedPoints.gridId }).from(plannedPoints).where(eq(plannedPoints.surveyId, surveyId)).all();
  return new Map(rows.filter((r) => r.gridId !== exceptGridId).map((r) => [r.key, r.label]));
}

/**
 * Generates (or regenerates) the grid of one zone or of every zone of a plan, replacing the zone's
 * earlier planned points. A rounding other than the survey's changes the survey's rule (audited).
 */
export function generateGrids(deps: Deps, user: SessionUser, surveyId: number, body: GenerateGridBody): Promise<PlannedPointsResponse> {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'its planned points');
  let targets: { zone: ZoneRow; plan: PlanRow }[];
  if (body.zoneId !== undefined) {
    targets = [zoneOfSurvey(deps.db, survey, body.zoneId)];
  } else {
    const plan = planOfSurvey(deps.db, survey, body.planId!);
    requireScale(plan);
    targets = deps.db.select().from(zones).where(eq(zones.planId, plan.id)).orderBy(asc(zones.id)).all().map((zone) => ({ zone, plan }));
    if (targets.length === 0) throw unprocessable(`Plan "${plan.name}" has no zones: draw the rooms and areas first`);
  }
  const rounding: GridRounding = body.rounding ?? survey.gridRounding;
  const layout = body.layout ?? 'full';
  const surface: GridSurface = body.surface ?? 'working_plane';
  const wallHeightM = surface === 'walls' ? body.wallHeightM ?? null : null;
  if (surface !== 'working_plane') {
    // Walls and ceilings are gridded for rooms; across a plan the other zones are left as they are.
    if (body.zoneId !== undefined && targets[0].zone.kind !== 'room') throw unprocessable(`Zone "${targets[0].zone.name}" is ${targets[0].zone.kind === 'outdoor' ? 'an outdoor area' : 'a task area'}: ${surface} grids are planned for rooms`);
    targets = targets.filter((t) => t.zone.kind === 'room');
    if (targets.length === 0) throw unprocessable(`The plan has no rooms: ${surface} grids are planned for rooms`);
  }
  // Compute every grid before writing anything, so one bad zone refuses the whole request.
  const computed = targets.map(({ zone, plan }) => {
    requireScale(plan);
    const zoneLayout = layout === 'centreline' && body.planId !== undefined && !isNarrowZone(zone.polygon) ? 'full' : layout;
    try {
      return { zone, plan, grid: surfaceGrid({ kind: zone.kind, wallBandM: zone.wallBandM, polygon: zone.polygon }, surface, rounding, zoneLayout, wallHeightM) };
    } catch (e) {
      if (e instanceof GridError) throw unprocessable(`Zone "${zone.name}": ${e.message}`);
      throw e;
    }
  });
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    if (rounding !== survey.gridRounding) {
      tx.update(surveys).set({ gridRounding: rounding }).where(eq(surveys.id, survey.id)).run();
      recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey', entityId: survey.id, surveyId: survey.id, action: 'grid_rule_changed', before: { gridRounding: survey.gridRounding }, after: { gridRounding: rounding }, at: now });
    }
    for (const { zone, plan, grid } of computed) {
      const zoneGrids = tx.select().from(surveyGrids).where(and(eq(surveyGrids.surveyId, survey.id), eq(surveyGrids.zoneId, zone.id))).all();
      const existing = zoneGrids.find((g) => g.surface === surface);
      const codes = tx.select({ code: surveyGrids.code, zoneId: surveyGrids.zoneId }).from(surveyGrids).where(eq(surveyGrids.surveyId, survey.id)).all()
        .filter((c) => c.zoneId !== zone.id).map((c) => c.code);
      // One code per zone across its surfaces, so O1-B3, O1-W2-B3 and O1-C-B3 read as one room's.
      const code = zoneGrids[0]?.code ?? zoneCode(zone.name, codes);
      const points = grid.points.map((p) => ({ ...p, label: p.label(code) }));
      const generated: GeneratedPoint[] = points.map((p) => ({ label: p.label, xM: p.xM, yM: p.yM }));
      const taken = takenLabels(tx, survey.id, existing?.id ?? null);
      const clash = generated.find((g) => taken.has(labelKey(g.label)));
      if (clash) throw conflict(`Label ${clash.label} of zone "${zone.name}" is already used by another planned point of this survey (${taken.get(labelKey(clash.label))}): rename that point first`);
      let gridId: number;
      const before = existing ? { surface, rounding: existing.rounding, layout: existing.layout, points: tx.select({ n: sql<number>`count(*)` }).from(plannedPoints).where(eq(plannedPoints.gridId, existing.id)).get()!.n, reason: existing.reason } : null;
      if (existing) {
        tx.delete(plannedPoints).where(eq(plannedPoints.gridId, existing.id)).run();
        tx.update(surveyGrids).set({ rounding, layout: grid.layout, spacingM: grid.spacingM, dM: grid.dM, wallHeightM, generated, reason: null, updatedAt: now }).where(eq(surveyGrids.id, existing.id)).run();
        gridId = existing.id;
      } else {
        gridId = tx.insert(surveyGrids).values({
          surveyId: survey.id, zoneId: zone.id, planId: plan.id, code, surface, rounding, layout: grid.layout, spacingM: grid.spacingM, dM: grid.dM, wallHeightM,
          generated, reason: null, createdBy: user.id, createdAt: now, updatedAt: now,
        }).returning({ id: surveyGrids.id }).get().id;
      }
      // Chunks keep each INSERT under SQLite's bound-parameter limit.
      for (let i = 0; i < points.length; i += 500) {
        tx.insert(plannedPoints).values(points.slice(i, i + 500).map((g) => ({
          surveyId: survey.id, gridId, planId: plan.id, zoneId: zone.id, label: g.label, labelKey: labelKey(g.label), xM: g.xM, yM: g.yM,
          plane: g.plane, heightM: g.heightM, azimuthDeg: g.azimuthDeg, origin: 'generated' as const, createdAt: now,
        }))).run();
      }
      recordAudit(tx, {
        organizationId: user.organizationId, actorId: user.id, entityType: 'survey_grid', entityId: gridId, surveyId: survey.id, action: existing ? 'regenerated' : 'generated',
        before, after: { zone: zone.name, code, surface, rounding, layout: grid.layout, dM: grid.dM, spacingM: grid.spacingM, wallHeightM, points: generated.length },
        at: now,
      });
    }
  });
  return plannedPointsOf(deps.db, { ...survey, gridRounding: rounding }, body.planId);
}

function gridOfSurvey(db: Db, survey: SurveyRow, gridId: number): GridRow {
  const g = db.select().from(surveyGrids).where(and(eq(surveyGrids.id, gridId), eq(surveyGrids.surveyId, survey.id))).get();
  if (!g) throw notFound('Grid');
  return g;
}

function pointOfSurvey(db: Db, survey: SurveyRow, pointId: number): PointRow {
  const p = db.select().from(plannedPoints).where(and(eq(plannedPoints.id, pointId), eq(plannedPoints.surveyId, survey.id))).get();
  if (!p) throw notFound('Planned point');
  return p;
}

/**
 * After an edit inside `tx`: a grid that now differs from the generated one needs a reason, either
 * already on the grid or sent with this edit (422 naming the zone otherwise, and the edit is undone).
 */
function settleReason(tx: Tx, grid: GridRow, zoneName: string, reason: string | undefined, now: number): string | null {
  const points = tx.select().from(plannedPoints).where(eq(plannedPoints.gridId, grid.id)).all();
  const changed = isChanged(grid, points);
  if (!changed) return grid.reason;
  const next = reason ?? grid.reason;
  if (!next) throw unprocessable(`The grid of zone "${zoneName}" would differ from the generated one: give a reason for the changed grid (field "reason")`, { field: 'reason', zone: zoneName });
  if (next !== grid.reason) tx.update(surveyGrids).set({ reason: next, updatedAt: now }).where(eq(surveyGrids.id, grid.id)).run();
  return next;
}

function nextAddedLabel(taken: Map<string, string>, code: string): string {
  for (let i = 1; ; i++) {
    const l = `${code}-N${i}`;
    if (!taken.has(labelKey(l))) return l;
  }
}

export function createPlannedPoint(deps: Deps, user: SessionUser, surveyId: number, body: CreatePlannedPointBody): PlannedPoint {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'its planned points');
  const { zone, plan } = zoneOfSurvey(deps.db, survey, body.zoneId);
  insidePlan(plan, body.xM, body.yM, 'The point');
  insideZone(zone, body.xM, body.yM, 'The point');
  // A point added by hand is a working-plane point; wall and ceiling grids are regenerated, not edited point by point.
  const grid = deps.db.select().from(surveyGrids).where(and(eq(surveyGrids.surveyId, survey.id), eq(surveyGrids.zoneId, zone.id), eq(surveyGrids.surface, 'working_plane'))).get();
  if (!grid) throw conflict(`Zone "${zone.name}" has no planned working-plane grid in this survey yet: generate its grid first`);
  const now = deps.clock.now();
  const row = deps.db.transaction((tx) => {
    const taken = takenLabels(tx, survey.id, null);
    const label = body.label ?? nextAddedLabel(taken, grid.code);
    if (taken.has(labelKey(label))) throw conflict(`Label ${label} is already used by planned point ${taken.get(labelKey(label))} of this survey: labels are unique within a survey (compared without case)`);
    const p = tx.insert(plannedPoints).values({ surveyId: survey.id, gridId: grid.id, planId: plan.id, zoneId: zone.id, label, labelKey: labelKey(label), xM: body.xM, yM: body.yM, origin: 'added', createdAt: now }).returning().get();
    const reason = settleReason(tx, grid, zone.name, body.reason, now);
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey_grid', entityId: grid.id, surveyId: survey.id, action: 'point_added', after: { label, xM: body.xM, yM: body.yM, reason }, at: now });
    return p;
  });
  return presentPoint(row, 0);
}

export async function movePlannedPoint(deps: Deps, user: SessionUser, surveyId: number, pointId: number, body: MovePlannedPointBody): Promise<PlannedPoint> {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'its planned points');
  const point = pointOfSurvey(deps.db, survey, pointId);
  const { zone, plan } = zoneOfSurvey(deps.db, survey, point.zoneId);
  insidePlan(plan, body.xM, body.yM, `Point ${point.label}`);
  insideZone(zone, body.xM, body.yM, `Point ${point.label}`);
  const grid = gridOfSurvey(deps.db, survey, point.gridId);
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(plannedPoints).set({ xM: body.xM, yM: body.yM }).where(eq(plannedPoints.id, point.id)).run();
    const reason = settleReason(tx, grid, zone.name, body.reason, now);
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey_grid', entityId: grid.id, surveyId: survey.id, action: 'point_moved', before: { label: point.label, xM: point.xM, yM: point.yM }, after: { label: point.label, xM: body.xM, yM: body.yM, reason }, at: now });
  });
  const counts = await readingCountsByPoint(deps.db, survey, [point]);
  return presentPoint({ ...point, xM: body.xM, yM: body.yM }, counts.get(point.id) ?? 0);
}

export function deletePlannedPoint(deps: Deps, user: SessionUser, surveyId: number, pointId: number, reason: string | undefined): void {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'its planned points');
  const point = pointOfSurvey(deps.db, survey, pointId);
  const { zone } = zoneOfSurvey(deps.db, survey, point.zoneId);
  const grid = gridOfSurvey(deps.db, survey, point.gridId);
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.delete(plannedPoints).where(eq(plannedPoints.id, point.id)).run();
    const r = settleReason(tx, grid, zone.name, reason, now);
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey_grid', entityId: grid.id, surveyId: survey.id, action: 'point_deleted', before: { label: point.label, xM: point.xM, yM: point.yM }, after: { reason: r }, at: now });
  });
}

/** Records (or replaces) the written reason for a changed grid. */
export function justifyGrid(deps: Deps, user: SessionUser, surveyId: number, gridId: number, reason: string): SurveyGrid {
  const survey = getSurveyRow(deps.db, user, surveyId);
  assertSurveyEditable(survey, 'its planned points');
  const grid = gridOfSurvey(deps.db, survey, gridId);
  const { zone } = zoneOfSurvey(deps.db, survey, grid.zoneId);
  const now = deps.clock.now();
  deps.db.transaction((tx) => {
    tx.update(surveyGrids).set({ reason, updatedAt: now }).where(eq(surveyGrids.id, grid.id)).run();
    recordAudit(tx, { organizationId: user.organizationId, actorId: user.id, entityType: 'survey_grid', entityId: grid.id, surveyId: survey.id, action: 'justified', before: { reason: grid.reason }, after: { reason }, at: now });
  });
  const points = deps.db.select().from(plannedPoints).where(eq(plannedPoints.gridId, grid.id)).all();
  return presentGrid({ ...grid, reason }, zone, points);
}
