import { max, mean, min } from 'simple-statistics';
import { zoneStats, requiredGrid, gridRuleText, type GridRounding } from '@shared/core/zone-stats';
import { GridError, labelKey, measurementGrid } from '@shared/spatial/measurement-grid';
import { decideZone, type AcceptanceRule } from '@shared/core/decision';
import { combineBudget, COVERAGE_K, meanUncertainty } from '@shared/core/uncertainty';
import { createOutdoorReference, pairDaylight, type OutdoorReference } from '@shared/core/daylight';
import type { BudgetPart, LuxBound, Reading, ReadingFlag } from '@shared/core/types';
import { createZoneAssigner, type ZoneKind } from '@shared/spatial/zone-assignment';
import type { TargetConfidence } from '@shared/schemas/targets';
import type { ZoneCompliance, ZoneVerdict } from '@shared/schemas/compliance';
import { decodeBudget } from '../readings/stored-budget';
import { designValue } from '@shared/core/illuminance-scale';
import { installationText, limitFor, type Installation } from '@shared/core/maintained';
import {
  BACKGROUND_BAND_M, BACKGROUND_RELATION_SOURCE, backgroundEmFor, CYLINDRICAL_METHOD, cylindricalFromVertical, modellingRatio, MODELLING_RANGE, SURFACE_U0_MIN,
  SURROUNDING_BAND_M, SURROUNDING_RELATION_SOURCE, SURROUNDING_U0_MIN, surroundingEmFor, type ReadingPlane,
} from '@shared/core/planes';
import { polygonAreaM2, polygonCentre, type PlanPoint } from '@shared/spatial/polygon';
import { bandArea, deriveTaskBands, pointInBand, pointInPolygon } from '@shared/spatial/task-bands';
import { INFO_ONLY_NOTE } from '@shared/schemas/targets';
import type { CheckKind, ZoneCheck } from '@shared/schemas/compliance';
import { labelOfUseType } from '@shared/schemas/zones';

/**
 * Daylight swamps an electric-lighting target when an outdoor zone reads this many times its Em:
 * the figure then describes the sky, not the luminaires (our own threshold, not from a standard).
 */
export const DAYLIGHT_SWAMP_RATIO = 10;

/** What applies to outdoor areas while Luxtrail has no outdoor grid rule (EN 12464-2 states its own grids). */
export const OUTDOOR_GRID_NOTE = 'The indoor grid rule (EN 12464-1) is not applied to outdoor areas; Luxtrail has no outdoor grid rule yet, so check the point spacing against EN 12464-2 or the local code.';

/** Fewer valid points than this give no uniformity worth judging: the zone is not assessed (project's own choice). */
export const MIN_ASSESSABLE_POINTS = 3;

export type JudgeReading = {
  id: number;
  point: string;
  xM: number | null;
  yM: number | null;
  /** The plan the log named for this reading; null when it could not be placed. */
  planId: number | null;
  role: 'task' | 'reference';
  timeMs: number;
  probeId: number;
  lux: number | null;
  /** Expanded uncertainty (k = 2), lux. */
  uLux: number | null;
  luxBound: LuxBound;
  flag: ReadingFlag;
  budget: unknown;
  coefficientSetId: number | null;
  /** Where the sensor faced (readings before planes were kept are horizontal). */
  plane?: ReadingPlane;
  azimuthDeg?: number | null;
  /** A hand exclusion from the zone's statistics, with its reason; null or absent: included. */
  excludedReason?: string | null;
  /** The planned point this reading was placed on by hand, if any. */
  plannedPointId?: number | null;
  /** A field reading of a lights-on/off pair says so here ("paired: ..."). */
  note?: string | null;
};

/** A planned point on a room's wall or ceiling (a grid planned on request). */
export type JudgeSurfacePoint = { id: number; label: string; plane: 'wall' | 'ceiling' };

/** The survey's planned grid of a zone: its points, and whether it was changed (with its reason) or is a centreline row. */
export type JudgePlannedGrid = {
  layout: 'full' | 'centreline';
  changed: boolean;
  reason: string | null;
  points: { id: number; label: string }[];
};

export type JudgeTarget = {
  id: number;
  name: string;
  /** The required maintained value (EN 12464-1:2021), lux. */
  emLux: number;
  u0Min: number | null;
  emModifiedLux?: number | null;
  ezLux?: number | null;
  emWallLux?: number | null;
  emCeilingLux?: number | null;
  ra?: number | null;
  rugl?: number | null;
  dfTargetPercent: number | null;
  source: string;
  confidence: TargetConfidence;
};

export type JudgeZone = {
  id: number;
  name: string;
  kind: ZoneKind;
  useType: string;
  planId: number;
  planName: string;
  planeHeightM: number;
  wallBandM: number;
  polygon: PlanPoint[];
  target: JudgeTarget | null;
  /** The value the design chose and the context modifiers behind it (null / empty: the required value). */
  chosenEmLux?: number | null;
  contextModifiers?: string[];
};

/** A zone's verdict plus what a frozen sign-off keeps to show the same points later. */
export type JudgedZone = ZoneCompliance & {
  polygon: PlanPoint[]; readingIds: number[]; wallBandReadingIds: number[];
  /** Readings on walls, ceilings and vertical planes in the zone (absent in sign-offs frozen before planes were kept). */
  otherPlaneReadingIds?: number[];
  /** Daylight factor (%) of each included reading that paired with the outdoor reference, by reading id (absent in sign-offs frozen before it was kept). */
  pointDf?: Record<string, number>;
};

export type JudgeResult = { zones: JudgedZone[]; unassignedPoints: number; hasDaylightReference: boolean; warnings: string[] };

/** Parsed stored budgets, decoded: readings sharing one budget object decode it once. */
const decodedBudgets = new WeakMap<object, { budget: BudgetPart[]; uRel: number }>();

/**
 * A stored reading as the core's Reading. With no stored budget, the expanded uncertainty is
 * taken whole as a calibration (systematic) part, so a mean never shrinks it: the cautious choice.
 */
export function toCoreReading(r: JudgeReading): Reading {
  let budget: BudgetPart[];
  let uRel: number;
  const stored = typeof r.budget === 'object' && r.budget !== null ? decodedBudgets.get(r.budget) : undefined;
  if (stored) ({ budget, uRel } = stored);
  else {
    budget = decodeBudget(r.budget);
    uRel = combineBudget(budget);
    // Readings loaded together share their stored budget (loadCurrentReadings): decoded once, read-only from here.
    if (typeof r.budget === 'object' && r.budget !== null) decodedBudgets.set(r.budget, { budget, uRel });
  }
  if (budget.length === 0 && r.uLux !== null && r.lux !== null && r.lux > 0) {
    budget = [{ name: 'calibration', uRel: r.uLux / COVERAGE_K / r.lux }];
    uRel = combineBudget(budget);
  }
  return {
    probe: String(r.probeId), point: r.point, timeMs: r.timeMs, lux: r.lux, luxBound: r.luxBound, flag: r.flag, flags: [r.flag],
    gainCode: null, samples: 1, chosenSample: null, rejected: [], uRel, uLux: r.uLux ?? 0, budget,
    coefficientSetId: r.coefficientSetId === null ? null : String(r.coefficientSetId),
  };
}

/** Width and height of the zone's extent: the grid rule is stated for rectangles, so other outlines use their bounding box. */
export function zoneExtent(polygon: readonly PlanPoint[]): { a: number; b: number; rectangular: boolean } {
  const xs = polygon.map((p) => p[0]);
  const ys = polygon.map((p) => p[1]);
  const [x0, x1, y0, y1] = [min(xs), max(xs), min(ys), max(ys)];
  const rectangular = polygon.length === 4 && polygon.every((p) => (p[0] === x0 || p[0] === x1) && (p[1] === y0 || p[1] === y1));
  return { a: x1 - x0, b: y1 - y0, rectangular };
}

/**
 * The points a zone's grid asks for: the EN 12464-1 grid generated from its outline under the
 * survey's rounding (shared/spatial/measurement-grid: the bounding box less the band, points kept
 * inside the outline), or the survey's planned grid when it is a centreline row or a changed grid
 * with a written reason. Says which in the reasons.
 */
function requiredPointsOf(z: JudgeZone, rounding: GridRounding, measured: number, planned: JudgePlannedGrid | undefined, reasons: string[]) {
  let ruleCount: number;
  try {
    ruleCount = measurementGrid({ kind: z.kind, wallBandM: z.wallBandM, polygon: z.polygon }, { rounding }).points.length;
  } catch (e) {
    if (!(e instanceof GridError)) throw e;
    const extent = zoneExtent(z.polygon);
    ruleCount = requiredGrid(extent.a, extent.b, 0, rounding).total;
    reasons.push(`${e.message}; the grid is taken without the band.`);
  }
  if (planned && planned.layout === 'centreline') {
    reasons.push(`Planned as a centreline row of ${planned.points.length} point(s) (narrow zone; the full grid would ask for ${ruleCount}).`);
    return { required: planned.points.length, adequate: measured >= planned.points.length, basis: 'planned' as const };
  }
  if (planned && planned.changed) {
    if (planned.reason) {
      reasons.push(`Changed grid: ${planned.points.length} planned point(s) instead of the ${ruleCount} the rule gives. Reason: ${planned.reason}`);
      return { required: planned.points.length, adequate: measured >= planned.points.length, basis: 'planned' as const };
    }
    reasons.push(`Changed grid without a written reason: judged against the ${ruleCount} point(s) the rule gives.`);
  }
  return { required: ruleCount, adequate: measured >= ruleCount, basis: 'rule' as const };
}

function shortfallRatio(z: ZoneCompliance): number {
  return z.eavg !== null && z.targetLux ? z.eavg / z.targetLux : 1;
}

/** Worst first: falls short (largest relative shortfall first), inconclusive, not assessed, meets; then by name. */
export function worstFirst<T extends ZoneCompliance>(zones: T[]): T[] {
  const order: Record<ZoneVerdict, number> = { falls_short: 0, inconclusive: 1, not_assessed: 2, meets: 3 };
  return [...zones].sort((x, y) => order[x.verdict] - order[y.verdict] || shortfallRatio(x) - shortfallRatio(y) || x.name.localeCompare(y.name));
}

/**
 * Judges every zone of a survey: assigns task readings to zones (shared/spatial: smallest zone
 * when nested, wall band marked), then statistics, grid adequacy, verdict and daylight factor,
 * each from the measurement core. Reference readings (role = reference) are the outdoor daylight reference.
 */
export function judgeZones(input: {
  zones: JudgeZone[];
  readings: JudgeReading[];
  rule: AcceptanceRule;
  /** Survey conditions: daylight excluded means no daylight factor is computed. */
  daylightExcluded: boolean;
  /** New installation (limits Em / MF) or in service (Em); in service when absent. */
  installation?: Installation;
  /** The rounding of grid points per side the survey is judged with (default: the 2011 text). */
  gridRounding?: GridRounding;
  /** The survey's planned grids by zone id. */
  plannedGrids?: ReadonlyMap<number, JudgePlannedGrid>;
  /** The survey's planned wall and ceiling points by zone id. */
  plannedSurfacePoints?: ReadonlyMap<number, readonly JudgeSurfacePoint[]>;
}): JudgeResult {
  const installation: Installation = input.installation ?? { state: 'in_service' };
  const rounding = input.gridRounding ?? 'next_higher';
  const ruleText = gridRuleText(rounding);
  const warnings: string[] = [];
  const assign = createZoneAssigner(input.zones.map((z) => ({ id: z.id, kind: z.kind, wallBandM: z.wallBandM, polygon: z.polygon })));
  const inZone = new Map<number, { included: JudgeReading[]; wallBand: JudgeReading[]; excluded: JudgeReading[] }>(input.zones.map((z) => [z.id, { included: [], wallBand: [], excluded: [] }]));
  // Readings on walls, ceilings and vertical planes belong to the zone they stand in; the wall band concerns the working plane only.
  const onOtherPlanes = new Map<number, JudgeReading[]>(input.zones.map((z) => [z.id, []]));
  let unassigned = 0;
  const task = input.readings.filter((r) => r.role === 'task');
  for (const r of task) {
    if (r.xM === null || r.yM === null) { unassigned++; continue; }
    const a = assign([r.xM, r.yM]);
    if (a.zoneId === null) { unassigned++; continue; }
    if ((r.plane ?? 'horizontal') !== 'horizontal') { onOtherPlanes.get(a.zoneId)!.push(r); continue; }
    const bucket = inZone.get(a.zoneId)!;
    (r.excludedReason ? bucket.excluded : a.inWallBand ? bucket.wallBand : bucket.included).push(r);
  }
  const noPosition = task.filter((r) => r.xM === null || r.yM === null).length;
  if (noPosition > 0) warnings.push(`${noPosition} reading(s) have no position (x_m, y_m) and belong to no zone.`);

  const referenceReadings = input.readings.filter((r) => r.role === 'reference' && r.lux !== null && r.luxBound === 'exact');
  const hasDaylightReference = referenceReadings.length > 0;
  let reference: OutdoorReference | null = null;
  if (hasDaylightReference && !input.daylightExcluded) reference = createOutdoorReference(referenceReadings.map((r) => ({ timeMs: r.timeMs, lux: r.lux as number })));
  if (hasDaylightReference && input.daylightExcluded) warnings.push('Daylight was excluded during this survey: no daylight factor is given.');
  // An over-range outdoor reading is a lower bound on Eo (direct sun beyond the probe's range):
  // the daylight factor is defined for an overcast sky, so such moments are left unpaired, and said so.
  const brightReference = input.readings.filter((r) => r.role === 'reference' && r.lux !== null && r.luxBound === 'lower').length;
  if (brightReference > 0 && !input.daylightExcluded) {
    warnings.push(`${brightReference} outdoor reference reading(s) were over range (sky brighter than the probe's range, likely direct sun): they are left out of the daylight pairing, since the daylight factor is defined for an overcast sky.`);
  }

  // A planned point is visited when a task reading names it (labels are unique within a survey) or was placed on it by hand.
  // Only the planned points' labels are looked up: a set of every reading's label would hold 500,000 strings on a large survey.
  const plannedLabels = new Set<string>();
  for (const g of input.plannedGrids?.values() ?? []) for (const p of g.points) plannedLabels.add(labelKey(p.label));
  for (const list of input.plannedSurfacePoints?.values() ?? []) for (const p of list) plannedLabels.add(labelKey(p.label));
  const visited = new Set<string>();
  const visitedIds = new Set<number>();
  for (const r of task) {
    if (plannedLabels.size > 0) {
      const key = labelKey(r.point);
      if (plannedLabels.has(key)) visited.add(key);
    }
    if (r.plannedPointId) visitedIds.add(r.plannedPointId);
  }
  /** "n of m planned … have no reading: labels" for the planned points no reading visited (at most 30 named), or null. */
  const unreadPlannedText = (points: readonly { id: number; label: string }[], what: string): string | null => {
    const missing = points.filter((p) => !visited.has(labelKey(p.label)) && !visitedIds.has(p.id));
    if (missing.length === 0) return null;
    return `${missing.length} of ${points.length} ${what} have no reading: ${missing.slice(0, 30).map((p) => p.label).join(', ')}${missing.length > 30 ? ` and ${missing.length - 30} more` : ''}.`;
  };

  const zones = input.zones.map((z): JudgedZone => {
    const { included, wallBand, excluded } = inZone.get(z.id)!;
    const core = included.map(toCoreReading);
    const stats = zoneStats(core);
    const outdoor = z.kind === 'outdoor';
    const reasons: string[] = [];
    // The indoor grid rule is not applied outdoors: no points are asked for, and the note says what applies.
    if (outdoor) reasons.push(OUTDOOR_GRID_NOTE);
    const grid = outdoor ? { required: 0, adequate: true, basis: 'rule' as const } : requiredPointsOf(z, rounding, stats.validPoints, input.plannedGrids?.get(z.id), reasons);
    if (wallBand.length > 0) reasons.push(`${wallBand.length} point(s) in the ${z.wallBandM} m wall band left out.`);
    for (const r of excluded) reasons.push(`Reading ${r.point} at ${new Date(r.timeMs).toISOString()} excluded from the statistics: ${r.excludedReason}.`);
    const unreadPlanned = unreadPlannedText(input.plannedGrids?.get(z.id)?.points ?? [], 'planned point(s)');
    if (unreadPlanned) reasons.push(unreadPlanned);
    const lapsed = included.filter((r) => r.flag === 'calibration_lapsed').length;
    if (lapsed > 0) reasons.push(`${lapsed} point(s) were taken with a probe whose calibration had lapsed.`);
    if (z.target?.confidence === 'memory') reasons.push('The target value is from memory and unchecked against the standard: confirm it before relying on the verdict.');

    const design = z.target ? designValue({ requiredLux: z.target.emLux, modifiedLux: z.target.emModifiedLux ?? null, chosenLux: z.chosenEmLux ?? null, modifiers: z.contextModifiers ?? [] }) : null;
    const limit = design ? limitFor(design.emLux, installation) : null;
    // Which value was judged and why, and which case (new or in service): said right after the verdict's own reasons.
    const designReasons = design ? [design.explanation, installationText(design.emLux, installation)] : [];
    let verdict: ZoneVerdict;
    if (!z.target) {
      verdict = 'not_assessed';
      reasons.unshift(`No target in the library for “${labelOfUseType(z.useType)}”.`);
    } else if (stats.validPoints < MIN_ASSESSABLE_POINTS) {
      verdict = 'not_assessed';
      reasons.unshift(stats.validPoints === 0
        ? 'No valid reading in this zone (outside its wall band).'
        : `Only ${stats.validPoints} valid point(s) outside the wall band; at least ${MIN_ASSESSABLE_POINTS} are needed to judge a zone.`, ...designReasons);
    } else {
      const v = decideZone(stats, { emLux: limit as number, ...(z.target.u0Min !== null ? { u0Min: z.target.u0Min } : {}) }, input.rule, { gridAdequate: grid.adequate });
      verdict = v.verdict;
      reasons.splice(0, 0, ...v.reasons, ...designReasons);
    }
    if (!grid.adequate && stats.validPoints > 0) reasons.push(`${stats.validPoints} of ${grid.required} points the grid asks for (${grid.basis === 'rule' ? ruleText : 'the justified planned grid'}).`);
    for (const r of stats.reasons) reasons.push(r);
    // First among the reasons: the verdict above describes the sky, not the luminaires.
    if (outdoor && z.target && stats.eavg !== null && stats.eavg >= DAYLIGHT_SWAMP_RATIO * z.target.emLux) {
      reasons.unshift(`Measured in daylight: the average is at least ${DAYLIGHT_SWAMP_RATIO} times the ${z.target.emLux} lx target, so it shows the sky, not the electric lighting. Measure again after dark to judge the lighting.`);
    }

    let dfAvg: number | undefined;
    let dfWarning: string | undefined;
    const pointDf: Record<string, number> = {};
    if (reference && z.kind !== 'outdoor') {
      const pairs = pairDaylight(included, reference);
      pairs.forEach((p, i) => { if (p.ok && p.bound === 'exact') pointDf[included[i].id] = p.dfPercent; });
      const factors = Object.values(pointDf);
      if (factors.length > 0) dfAvg = mean(factors);
      const refused = pairs.filter((p) => !p.ok).length;
      if (refused > 0) reasons.push(`${refused} point(s) could not be paired with the outdoor reference.`);
      const fast = pairs.filter((p) => p.ok && p.warning !== null);
      if (fast.length > 0) dfWarning = `The outdoor level changed too fast around ${fast.length} of ${pairs.length} point(s): the daylight factor is unreliable.`;
      if (dfAvg !== undefined) reasons.push('Daylight factors assume the electric lighting was off while these points were measured; Luxtrail cannot tell from the log, and with the lighting on they read too high.');
      if (dfAvg !== undefined && z.target?.dfTargetPercent) reasons.push(`Average daylight factor ${dfAvg.toFixed(1)} % against ${z.target.dfTargetPercent} % (informative, not part of the verdict).`);
    }

    const checks: ZoneCheck[] = [];
    let modelling: ZoneCompliance['modelling'];
    if (z.target) {
      const other = onOtherPlanes.get(z.id)!;
      const t = z.target;
      const surface = (plane: 'wall' | 'ceiling', lux: number | null | undefined) => {
        const rs = other.filter((r) => r.plane === plane);
        if (lux == null && rs.length === 0) return;
        checks.push(judgeCheck({
          kind: plane, readings: rs.map(toCoreReading), targetLux: lux ?? null, u0Min: SURFACE_U0_MIN, minPoints: MIN_ASSESSABLE_POINTS,
          source: `${t.source}; U0 ≥ ${SURFACE_U0_MIN} for walls and ceilings (EN 12464-1:2021, secondary)`, confidence: t.confidence, installation, rule: input.rule,
          none: `No ${plane} readings in this zone (log rows with plane = ${plane}).`,
        }));
        const unread = unreadPlannedText((input.plannedSurfacePoints?.get(z.id) ?? []).filter((p) => p.plane === plane), `planned ${plane} point(s)`);
        if (unread) checks.at(-1)!.reasons.push(unread);
      };
      // Walls and ceilings belong to rooms: a task area or an outdoor zone gets these checks only from readings taken in it.
      const room = z.kind === 'room';
      surface('wall', room || other.some((r) => r.plane === 'wall') ? t.emWallLux : undefined);
      surface('ceiling', room || other.some((r) => r.plane === 'ceiling') ? t.emCeilingLux : undefined);
      const vertical = other.filter((r) => r.plane === 'vertical');
      if ((room && t.ezLux != null) || vertical.length > 0) {
        const cyl = cylindricalPoints(vertical);
        const c = judgeCheck({
          kind: 'cylindrical', readings: cyl.points, targetLux: t.ezLux ?? null, u0Min: null, minPoints: 1,
          source: `${t.source}; ${CYLINDRICAL_METHOD}`, confidence: t.confidence, installation, rule: input.rule,
          none: 'No cylindrical point in this zone (four log rows with plane = vertical and azimuth_deg 90° apart at one point).',
        });
        c.reasons.push(...cyl.reasons);
        checks.push(c);
        if (c.eavg !== null && c.bounds.eavg === null && stats.eavg !== null && stats.bounded.eavg === null) {
          const ratio = modellingRatio(c.eavg, stats.eavg);
          if (ratio !== null) {
            modelling = { ratio, ezLux: c.eavg, ehLux: stats.eavg, withinRecommendation: ratio >= MODELLING_RANGE.min && ratio <= MODELLING_RANGE.max, source: MODELLING_RANGE.source };
            reasons.push(`Modelling Ez / Eh = ${ratio.toFixed(2)} (${MODELLING_RANGE.min.toFixed(2)} to ${MODELLING_RANGE.max.toFixed(2)} recommended in 2011; informative).`);
          }
        }
      }
      if (z.kind === 'task_area' && design) {
        const room = containingRoom(z, input.zones);
        const roomReadings = room ? inZone.get(room.id)!.included : [];
        checks.push(...judgeTaskAreas({ task: z, room, roomReadings, taskEmLux: design.emLux, installation, rule: input.rule }));
      }
    }

    return {
      zoneId: z.id, name: z.name, kind: z.kind, useType: z.useType, planId: z.planId, planName: z.planName, planeHeightM: z.planeHeightM,
      targetId: z.target?.id ?? null, targetName: z.target?.name ?? null, targetSource: z.target?.source ?? null, targetConfidence: z.target?.confidence ?? null,
      targetLux: design?.emLux ?? null, targetU0: z.target?.u0Min ?? null,
      ...(z.target ? {
        requiredLux: z.target.emLux, modifiedLux: z.target.emModifiedLux ?? null, limitLux: limit,
        design: { basis: design!.basis, steps: design!.steps, explanation: design!.explanation, modifiers: z.contextModifiers ?? [] },
        info: { ra: z.target.ra ?? null, rugl: z.target.rugl ?? null, note: INFO_ONLY_NOTE },
      } : {}),
      points: stats.validPoints, requiredPoints: grid.required, gridAdequate: grid.adequate, gridRuleApplies: !outdoor, wallBandPoints: wallBand.length,
      ...(excluded.length > 0 ? { excludedPoints: excluded.length } : {}),
      eavg: stats.eavg, emin: stats.validPoints ? stats.emin : null, emax: stats.validPoints ? stats.emax : null, u0: stats.u0, uEavg: stats.uEavg,
      bounds: { eavg: stats.bounded.eavg, emin: stats.bounded.emin, u0: stats.bounded.u0 },
      ...(dfAvg !== undefined ? { dfAvg } : {}),
      ...(z.target?.dfTargetPercent ? { dfTargetPercent: z.target.dfTargetPercent } : {}),
      ...(dfWarning ? { dfWarning } : {}),
      verdict, reasons,
      ...(checks.length > 0 ? { checks } : {}),
      ...(modelling ? { modelling } : {}),
      polygon: z.polygon, readingIds: included.map((r) => r.id), wallBandReadingIds: wallBand.map((r) => r.id),
      ...(onOtherPlanes.get(z.id)!.length > 0 ? { otherPlaneReadingIds: onOtherPlanes.get(z.id)!.map((r) => r.id) } : {}),
      ...(Object.keys(pointDf).length > 0 ? { pointDf } : {}),
    };
  });
  if (unassigned > 0) warnings.push(`${unassigned} task reading(s) lie in no zone and are not judged.`);
  const swamped = zones.filter((z) => z.reasons[0]?.startsWith('Measured in daylight')).map((z) => z.name);
  if (swamped.length > 0) warnings.push(`Daylight swamps the electric-lighting target in ${swamped.join(', ')}: those figures show the sky, not the lighting.`);
  return { zones: worstFirst(zones), unassignedPoints: unassigned, hasDaylightReference, warnings };
}

type CheckInput = {
  kind: CheckKind;
  readings: Reading[];
  targetLux: number | null;
  u0Min: number | null;
  minPoints: number;
  source: string;
  confidence: TargetConfidence;
  installation: Installation;
  rule: AcceptanceRule;
  /** The reason when no reading applies. */
  none: string;
};

/** One check beyond the task plane: statistics, then Eavg (and U0) against the maintained value or Em / MF when new. */
export function judgeCheck(c: CheckInput): ZoneCheck {
  const stats = zoneStats(c.readings);
  const limit = c.targetLux === null ? null : limitFor(c.targetLux, c.installation);
  const reasons: string[] = [];
  let verdict: ZoneVerdict;
  if (c.targetLux === null) {
    verdict = 'not_assessed';
    reasons.push('The library entry gives no value for this check.');
  } else if (stats.validPoints === 0) {
    verdict = 'not_assessed';
    reasons.push(c.none);
  } else if (stats.validPoints < c.minPoints) {
    verdict = 'not_assessed';
    reasons.push(`Only ${stats.validPoints} valid point(s); at least ${c.minPoints} are needed.`);
  } else {
    const v = decideZone(stats, { emLux: limit as number, ...(c.u0Min !== null ? { u0Min: c.u0Min } : {}) }, c.rule);
    verdict = v.verdict;
    reasons.push(...v.reasons);
    if (c.installation.state === 'new') reasons.push(`New installation: compared with ${fmtLux(c.targetLux)} / MF ${c.installation.maintenanceFactor} = ${fmtLux(limit as number)}.`);
  }
  reasons.push(...stats.reasons);
  return {
    kind: c.kind, targetLux: c.targetLux, limitLux: limit, u0Min: c.u0Min, source: c.source, confidence: c.confidence,
    points: stats.validPoints, eavg: stats.eavg, emin: stats.validPoints ? stats.emin : null, u0: stats.u0, uEavg: stats.uEavg,
    bounds: { eavg: stats.bounded.eavg, emin: stats.bounded.emin, u0: stats.bounded.u0 }, verdict, reasons,
  };
}

const fmtLux = (v: number) => `${Number(v.toPrecision(6))} lx`;

/**
 * Cylindrical points from vertical readings grouped by point label: each point's Ez is the mean of its
 * four vertical readings 90° apart (shared/core/planes), carried as one reading whose budget is that
 * mean's (systematic parts whole, random parts shrunk).
 */
export function cylindricalPoints(vertical: readonly JudgeReading[]): { points: Reading[]; reasons: string[] } {
  const byPoint = new Map<string, JudgeReading[]>();
  for (const r of vertical) byPoint.set(r.point, [...(byPoint.get(r.point) ?? []), r]);
  const points: Reading[] = [];
  const reasons: string[] = [];
  for (const [label, rs] of byPoint) {
    if (rs.some((r) => r.lux === null || r.luxBound !== 'exact' || r.azimuthDeg == null)) {
      reasons.push(`Point ${label}: a vertical reading is a fault, a bound or has no azimuth, so no Ez is given there.`);
      continue;
    }
    const c = cylindricalFromVertical(rs.map((r) => ({ azimuthDeg: r.azimuthDeg as number, lux: r.lux as number })));
    if (!c.ok) { reasons.push(`Point ${label}: ${c.reason}`); continue; }
    const core = rs.map(toCoreReading);
    const mu = meanUncertainty(core)!;
    const uRel = combineBudget(mu.budget);
    points.push({ ...core[0], point: label, lux: c.ezLux, luxBound: 'exact', flag: 'ok', flags: ['ok'], budget: mu.budget, uRel, uLux: COVERAGE_K * uRel * c.ezLux });
  }
  if (points.length > 0) reasons.push(`Ez from ${points.length} point(s): ${CYLINDRICAL_METHOD}.`);
  return { points, reasons };
}

/** The smallest room whose outline holds the task area's centre: the room its background is clipped to. */
export function containingRoom(task: JudgeZone, zones: readonly JudgeZone[]): JudgeZone | null {
  const centre = polygonCentre(task.polygon);
  const rooms = zones.filter((z) => z.kind === 'room' && z.planId === task.planId && pointInPolygon(centre, z.polygon));
  return rooms.sort((a, b) => polygonAreaM2(a.polygon) - polygonAreaM2(b.polygon))[0] ?? null;
}

/**
 * The immediate surrounding (a 0.5 m band) and background (a 3 m band beyond it) of a task area,
 * clipped to its room (shared/spatial/task-bands), each judged on the room's working-plane readings
 * that fall in it: surrounding against EN 12464-1's relation to the task value, background against a
 * third of the surrounding with U0 ≥ 0.10 (secondary sources).
 */
export function judgeTaskAreas(input: { task: JudgeZone; room: JudgeZone | null; roomReadings: JudgeReading[]; taskEmLux: number; installation: Installation; rule: AcceptanceRule }): ZoneCheck[] {
  const bands = deriveTaskBands(input.task.polygon, input.room?.polygon ?? null);
  const surroundingLux = surroundingEmFor(input.taskEmLux);
  const out: ZoneCheck[] = [];
  const clip = input.room ? `clipped to ${input.room.name}` : 'not clipped: the task area lies in no room';
  for (const [kind, band, targetLux, u0Min, source] of [
    ['surrounding', bands.surrounding, surroundingLux, SURROUNDING_U0_MIN, `${SURROUNDING_RELATION_SOURCE}; band ≥ ${SURROUNDING_BAND_M} m`],
    ['background', bands.background, backgroundEmFor(surroundingLux), SURFACE_U0_MIN, `${BACKGROUND_RELATION_SOURCE}; band ≥ ${BACKGROUND_BAND_M} m`],
  ] as const) {
    const rs = input.roomReadings.filter((r) => r.xM !== null && r.yM !== null && pointInBand([r.xM, r.yM], band));
    const c = judgeCheck({
      kind, readings: rs.map(toCoreReading), targetLux, u0Min, minPoints: MIN_ASSESSABLE_POINTS, source, confidence: kind === 'surrounding' ? 'memory' : 'secondary',
      installation: input.installation, rule: input.rule, none: `No working-plane reading of the room lies in this band (${clip}).`,
    });
    c.reasons.push(`Band derived from the task area by planar offsetting, ${clip}.`);
    out.push({ ...c, polygons: band, areaM2: bandArea(band) });
  }
  return out;
}
