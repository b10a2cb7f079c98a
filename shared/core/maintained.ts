import { linearRegression } from 'simple-statistics';

/**
 * Maintained and initial values. EN 12464-1 targets are maintained illuminances Em: the level the
 * installation must not fall below before maintenance. A new installation is brighter by 1 / MF,
 * with the maintenance factor MF = LLMF × LSF × LMF × RSMF (CIE 97:2005: lamp lumen maintenance,
 * lamp survival, luminaire maintenance and room surface maintenance factors).
 */
export type MaintenanceFactorParts = { llmf: number; lsf: number; lmf: number; rsmf: number };

export const MF_PART_LABELS: Record<keyof MaintenanceFactorParts, string> = {
  llmf: 'LLMF (lamp lumen maintenance)',
  lsf: 'LSF (lamp survival)',
  lmf: 'LMF (luminaire maintenance)',
  rsmf: 'RSMF (room surface maintenance)',
};

/** MF = LLMF × LSF × LMF × RSMF (CIE 97:2005). Each part is a fraction in (0, 1]. */
export function maintenanceFactor(parts: MaintenanceFactorParts): number {
  for (const [k, v] of Object.entries(parts)) {
    if (!(v > 0 && v <= 1)) throw new RangeError(`${k} must be above 0 and at most 1, got ${v}`);
  }
  return parts.llmf * parts.lsf * parts.lmf * parts.rsmf;
}

export type Installation =
  | { state: 'in_service' }
  | { state: 'new'; maintenanceFactor: number; parts?: MaintenanceFactorParts | null };

/**
 * The limit a measured value is compared with: Em for an installation in service, Em / MF for a new
 * one (its measured level must leave room for the depreciation the design allowed for).
 * Checks (secondary): 1000 lx at MF 0.8 needs 1250 lx; 500 lx at MF 0.7 needs 714.3 lx.
 */
export function limitFor(emLux: number, installation: Installation): number {
  if (installation.state === 'in_service') return emLux;
  const mf = installation.maintenanceFactor;
  if (!(mf > 0 && mf <= 1)) throw new RangeError(`The maintenance factor must be above 0 and at most 1, got ${mf}`);
  return emLux / mf;
}

/** Words for the report: which case applied. */
export function installationText(emLux: number, installation: Installation): string {
  const em = `${Number(emLux.toPrecision(6))} lx`;
  if (installation.state === 'in_service') return `Installation in service: measured values are compared with the maintained value Em = ${em}.`;
  const mf = installation.maintenanceFactor;
  const parts = installation.parts ? ` (LLMF ${installation.parts.llmf} × LSF ${installation.parts.lsf} × LMF ${installation.parts.lmf} × RSMF ${installation.parts.rsmf}, CIE 97:2005)` : '';
  return `New installation: measured values are compared with Em / MF = ${em} / ${Number(mf.toPrecision(6))}${parts} = ${Number(limitFor(emLux, installation).toPrecision(6))} lx.`;
}

/** The survey's case in words, for the verdicts page and the report. */
export function installationSummary(installation: Installation): string {
  if (installation.state === 'in_service') return 'Installation in service: each zone is judged against its maintained value Em.';
  const p = installation.parts;
  const parts = p ? ` = LLMF ${p.llmf} × LSF ${p.lsf} × LMF ${p.lmf} × RSMF ${p.rsmf} (CIE 97:2005)` : '';
  return `New installation, maintenance factor MF ${Number(installation.maintenanceFactor.toPrecision(6))}${parts}: each zone must reach Em / MF, so that it still meets Em when the installation has aged as designed.`;
}

export type TrendPoint = { timeMs: number; eavg: number };

export type MaintenanceStatus = {
  state: 'due' | 'due_soon' | 'ok' | 'unknown';
  /** Least-squares slope of Eavg, lux per year (null with fewer than two dated values). */
  slopeLuxPerYear: number | null;
  /** When the fitted line reaches the target (epoch ms), if it falls towards it. */
  reachesTargetAtMs: number | null;
  reason: string;
};

const YEAR_MS = 365.25 * 24 * 3600 * 1000;
/** How far ahead a falling trend counts as "due soon": one year, our own choice (a yearly survey cycle). */
export const MAINTENANCE_HORIZON_MS = YEAR_MS;

/**
 * Maintenance due (our rule, not a standard's): with the signed-off Eavg values of a zone over time
 * against its maintained value Em (never Em / MF: depreciation towards Em is what MF allows for),
 * - due: the latest value is below Em;
 * - due soon: with two or more values, the least-squares line through them falls and reaches Em
 *   within MAINTENANCE_HORIZON_MS after the latest survey;
 * - ok otherwise; unknown with no value.
 */
export function maintenanceStatus(points: readonly TrendPoint[], emLux: number, horizonMs = MAINTENANCE_HORIZON_MS): MaintenanceStatus {
  const pts = [...points].sort((a, b) => a.timeMs - b.timeMs);
  if (pts.length === 0) return { state: 'unknown', slopeLuxPerYear: null, reachesTargetAtMs: null, reason: 'No signed-off value yet.' };
  const last = pts[pts.length - 1];
  let slope: number | null = null;
  let reachesAt: number | null = null;
  const distinctTimes = new Set(pts.map((p) => p.timeMs)).size;
  if (distinctTimes >= 2) {
    const fit = linearRegression(pts.map((p) => [p.timeMs / YEAR_MS, p.eavg]));
    slope = fit.m;
    if (fit.m < 0) reachesAt = ((emLux - fit.b) / fit.m) * YEAR_MS;
  }
  const fmt = (v: number) => `${Number(v.toPrecision(4))} lx`;
  if (last.eavg < emLux) {
    return { state: 'due', slopeLuxPerYear: slope, reachesTargetAtMs: reachesAt, reason: `The latest signed-off Eavg ${fmt(last.eavg)} is below the maintained value ${fmt(emLux)}.` };
  }
  if (reachesAt !== null && reachesAt <= last.timeMs + horizonMs) {
    return {
      state: 'due_soon', slopeLuxPerYear: slope, reachesTargetAtMs: reachesAt,
      reason: `Eavg is falling by ${fmt(-(slope as number))} a year (least squares over ${pts.length} signed-off surveys) and reaches ${fmt(emLux)} within a year of the latest survey.`,
    };
  }
  return {
    state: 'ok', slopeLuxPerYear: slope, reachesTargetAtMs: reachesAt,
    reason: slope === null ? `One signed-off value, ${fmt(last.eavg)}, at or above ${fmt(emLux)}.` : `Eavg ${fmt(last.eavg)} at or above ${fmt(emLux)}, and the trend does not reach it within a year.`,
  };
}
