import { mean } from 'simple-statistics';
import { zoneStats, gridAdequacy, GRID_RULE } from '@shared/core/zone-stats';
import { decideZone, type AcceptanceRule } from '@shared/core/decision';
import { combineBudget, COVERAGE_K } from '@shared/core/uncertainty';
import { createOutdoorReference, pairDaylight, type OutdoorReference } from '@shared/core/daylight';
import type { BudgetPart, LuxBound, Reading, ReadingFlag } from '@shared/core/types';
import { createZoneAssigner, type ZoneKind } from '@shared/spatial/zone-assignment';
import type { PlanPoint } from '@shared/spatial/polygon';
import type { TargetConfidence } from '@shared/schemas/targets';
import type { ZoneCompliance, ZoneVerdict } from '@shared/schemas/compliance';
import { decodeBudget } from '../readings/stored-budget.mjs';

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
};

export type JudgeTarget = {
  id: number;
  name: string;
  emLux: number;
  u0Min: number | null;
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
};

/** A zone's verdict plus what a frozen sign-off keeps to show the same points later. */
export type JudgedZone = ZoneCompliance & {
  polygon: PlanPoint[]; readingIds: number[]; wallBandReadingIds: number[];
  /** Daylight factor (%) of each included reading that paired with the outdoor reference, by reading id (absent in sign-offs frozen before it was kept). */
  pointDf?: Record<string, number>;
};

export type JudgeResult = { zones: JudgedZone[]; unassignedPoints: number; hasDaylightReference: boolean; warnings: string[] };

/**
 * A stored reading as the core's Reading. With no stored budget, the expanded uncertainty is
 * taken whole as a calibration (systematic) part, so a mean never shrinks it: the cautious choice.
 */
export function toCoreReading(r: JudgeReading): Reading {
  let budget: BudgetPart[] = decodeBudget(r.budget);
  if (budget.length === 0 && r.uLux !== null && r.lux !== null && r.lux > 0) budget = [{ name: 'calibration', uRel: r.uLux / COVERAGE_K / r.lux }];
  return {
    probe: String(r.probeId), point: r.point, timeMs: r.timeMs, lux: r.lux, luxBound: r.luxBound, flag: r.flag, flags: [r.flag],
    gainCode: null, samples: 1, chosenSample: null, rejected: [], uRel: combineBudget(budget), uLux: r.uLux ?? 0, budget,
    coefficientSetId: r.coefficientSetId === null ? null : String(r.coefficientSetId),
  };
}

/** Width and height of the zone's extent: the grid rule is stated for rectangles, so other outlines use their bounding box. */
export function zoneExtent(polygon: readonly PlanPoint[]): { a: number; b: number; rectangular: boolean } {
  const xs = polygon.map((p) => p[0]);
  const ys = polygon.map((p) => p[1]);
  const a = Math.max(...xs) - Math.min(...xs);
  const b = Math.max(...ys) - Math.min(...ys);
  const rectangular = polygon.length === 4 && polygon.every((p) => (p[0] === Math.min(...xs) || p[0] === Math.max(...xs)) && (p[1] === Math.min(...ys) || p[1] === Math.max(...ys)));
  return { a, b, rectangular };
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
}): JudgeResult {
  const warnings: string[] = [];
  const assign = createZoneAssigner(input.zones.map((z) => ({ id: z.id, kind: z.kind, wallBandM: z.wallBandM, polygon: z.polygon })));
  const inZone = new Map<number, { included: JudgeReading[]; wallBand: JudgeReading[] }>(input.zones.map((z) => [z.id, { included: [], wallBand: [] }]));
  let unassigned = 0;
  const task = input.readings.filter((r) => r.role === 'task');
  for (const r of task) {
    if (r.xM === null || r.yM === null) { unassigned++; continue; }
    const a = assign([r.xM, r.yM]);
    if (a.zoneId === null) { unassigned++; continue; }
    const bucket = inZone.get(a.zoneId)!;
    (a.inWallBand ? bucket.wallBand : bucket.included).push(r);
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

  const zones = input.zones.map((z): JudgedZone => {
    const { included, wallBand } = inZone.get(z.id)!;
    const core = included.map(toCoreReading);
    const stats = zoneStats(core);
    const extent = zoneExtent(z.polygon);
    // Task areas keep their edge points (shared/spatial never marks them), so no band is taken off their grid either.
    const band = z.kind === 'room' ? z.wallBandM : 0;
    const grid = gridAdequacy(stats.validPoints, extent.a, extent.b, band);
    const reasons: string[] = [];
    if (!extent.rectangular) reasons.push(`Grid required from the zone's bounding box (${extent.a.toFixed(1)} m x ${extent.b.toFixed(1)} m).`);
    if (wallBand.length > 0) reasons.push(`${wallBand.length} point(s) in the ${z.wallBandM} m wall band left out.`);
    const lapsed = included.filter((r) => r.flag === 'calibration_lapsed').length;
    if (lapsed > 0) reasons.push(`${lapsed} point(s) were taken with a probe whose calibration had lapsed.`);
    if (z.target?.confidence === 'memory') reasons.push('The target value is from memory and unchecked against the standard: confirm it before relying on the verdict.');

    let verdict: ZoneVerdict;
    if (!z.target) {
      verdict = 'not_assessed';
      reasons.unshift(`No target in the library for use type "${z.useType}".`);
    } else if (stats.validPoints < MIN_ASSESSABLE_POINTS) {
      verdict = 'not_assessed';
      reasons.unshift(stats.validPoints === 0
        ? 'No valid reading in this zone (outside its wall band).'
        : `Only ${stats.validPoints} valid point(s) outside the wall band; at least ${MIN_ASSESSABLE_POINTS} are needed to judge a zone.`);
    } else {
      const v = decideZone(stats, { emLux: z.target.emLux, ...(z.target.u0Min !== null ? { u0Min: z.target.u0Min } : {}) }, input.rule, { gridAdequate: grid.adequate });
      verdict = v.verdict;
      reasons.unshift(...v.reasons);
    }
    if (!grid.adequate && stats.validPoints > 0) reasons.push(`${stats.validPoints} of ${grid.required} points the grid rule asks for (${GRID_RULE}).`);
    reasons.push(...stats.reasons);

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
      if (dfAvg !== undefined && z.target?.dfTargetPercent) reasons.push(`Average daylight factor ${dfAvg.toFixed(1)} % against ${z.target.dfTargetPercent} % (informative, not part of the verdict).`);
    }

    return {
      zoneId: z.id, name: z.name, kind: z.kind, useType: z.useType, planId: z.planId, planName: z.planName, planeHeightM: z.planeHeightM,
      targetId: z.target?.id ?? null, targetName: z.target?.name ?? null, targetSource: z.target?.source ?? null, targetConfidence: z.target?.confidence ?? null,
      targetLux: z.target?.emLux ?? null, targetU0: z.target?.u0Min ?? null,
      points: stats.validPoints, requiredPoints: grid.required, gridAdequate: grid.adequate, wallBandPoints: wallBand.length,
      eavg: stats.eavg, emin: stats.validPoints ? stats.emin : null, emax: stats.validPoints ? stats.emax : null, u0: stats.u0, uEavg: stats.uEavg,
      bounds: { eavg: stats.bounded.eavg, emin: stats.bounded.emin, u0: stats.bounded.u0 },
      ...(dfAvg !== undefined ? { dfAvg } : {}),
      ...(z.target?.dfTargetPercent ? { dfTargetPercent: z.target.dfTargetPercent } : {}),
      ...(dfWarning ? { dfWarning } : {}),
      verdict, reasons,
      polygon: z.polygon, readingIds: included.map((r) => r.id), wallBandReadingIds: wallBand.map((r) => r.id),
      ...(Object.keys(pointDf).length > 0 ? { pointDf } : {}),
    };
  });
  if (unassigned > 0) warnings.push(`${unassigned} task reading(s) lie in no zone and are not judged.`);
  return { zones: worstFirst(zones), unassignedPoints: unassigned, hasDaylightReference, warnings };
}
