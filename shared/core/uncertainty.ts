import type { BudgetPart, BudgetPartName, Reading } from './types';

/** Coverage factor k = 2 (about 95 % for a normal distribution; GUM JCGM 100:2008, 6.3). */
export const COVERAGE_K = 2;

/** Standard uncertainty of one-count quantisation: 1/sqrt(12) counts (GUM F.2.2.1, rectangular of width 1). */
export const QUANTISATION_U_COUNTS = 1 / Math.sqrt(12);

/** Assumed dark-offset standard uncertainty when a set gives none: 1 count (project's own choice). */
export const DEFAULT_U_DARK_COUNTS = 1;

/** No probe temperature logged: assume it lies within +/-10 K of Tcal, rectangular (common practice). */
export const ASSUMED_TEMPERATURE_BOUND_K = 10;

/** Probe temperature logged: its sensor is good to +/-1 K, rectangular (common practice). */
export const TEMPERATURE_SENSOR_BOUND_K = 1;

/** Parts treated as random between points of one survey; all others are systematic (do not average down). */
export const RANDOM_PARTS: ReadonlySet<BudgetPartName> = new Set<BudgetPartName>(['quantisation', 'repeatability']);

/** Standard uncertainty of a rectangular distribution of half-width a: a / sqrt(3) (GUM 4.3.7). */
export function rectangular(a: number): number {
  return a / Math.sqrt(3);
}

/** Combined relative standard uncertainty: u_c = sqrt(sum u_i^2), uncorrelated inputs (GUM 5.1.2, relative form). */
export function combineBudget(parts: readonly BudgetPart[]): number {
  let s = 0;
  for (const p of parts) s += p.uRel * p.uRel;
  return Math.sqrt(s);
}

/** Expanded uncertainty U = k * u_c (GUM 6.2.1). */
export function expanded(u: number, k: number = COVERAGE_K): number {
  return k * u;
}

export interface CountingBudgetInput {
  /** Calibration uRel (k = 1). */
  calibrationURel: number;
  /** Net counts C - dark (> 0 for a usable sample). */
  netCounts: number;
  uDarkCounts: number;
  alphaPerK: number;
  temperatureKnown: boolean;
}

/**
 * Budget of one counting sample (relative, k = 1): calibration; quantisation (1/sqrt(12)) / net;
 * dark offset u(dark) / net; temperature |alpha| * a / sqrt(3), a = sensor bound or the assumed bound.
 */
export function countingBudget(i: CountingBudgetInput): BudgetPart[] {
  const net = i.netCounts > 0 ? i.netCounts : 1; // bound readings near zero net: treat as one count
  const a = i.temperatureKnown ? TEMPERATURE_SENSOR_BOUND_K : ASSUMED_TEMPERATURE_BOUND_K;
  return [
    { name: 'calibration', uRel: i.calibrationURel },
    { name: 'quantisation', uRel: QUANTISATION_U_COUNTS / net },
    { name: 'dark_offset', uRel: i.uDarkCounts / net },
    { name: 'temperature', uRel: Math.abs(i.alphaPerK) * rectangular(a) },
  ];
}

export interface MeanUncertainty {
  n: number;
  meanLux: number;
  /** Combined standard uncertainty of the mean, lux (k = 1). */
  uStd: number;
  /** Expanded uncertainty of the mean, lux (k = 2). */
  uLux: number;
  /** uStd / meanLux. */
  uRel: number;
  /** Per part, relative standard uncertainty of the mean. */
  budget: BudgetPart[];
}

/**
 * Uncertainty of the mean of n readings (those with a numeric lux, bounds included as their values).
 * Random parts: u(mean)^2 = sum (u_i E_i)^2 / n^2 (shrinks with sqrt n). Systematic parts (calibration,
 * dark offset, temperature, transmitter) are taken fully correlated: u(mean) = sum (u_i E_i) / n.
 * Returns null when no reading has a value.
 */
export function meanUncertainty(readings: readonly Reading[]): MeanUncertainty | null {
  const sys = new Map<BudgetPartName, number>();
  const rnd = new Map<BudgetPartName, number>();
  let n = 0;
  let sum = 0;
  for (const r of readings) {
    if (r.lux === null) continue;
    n++;
    sum += r.lux;
    for (const p of r.budget) {
      const uAbs = p.uRel * r.lux;
      if (RANDOM_PARTS.has(p.name)) rnd.set(p.name, (rnd.get(p.name) ?? 0) + uAbs * uAbs);
      else sys.set(p.name, (sys.get(p.name) ?? 0) + uAbs);
    }
  }
  if (n === 0) return null;
  const mean = sum / n;
  const budget: BudgetPart[] = [];
  let u2 = 0;
  for (const [name, s] of sys) {
    const u = s / n;
    u2 += u * u;
    budget.push({ name, uRel: mean > 0 ? u / mean : 0 });
  }
  for (const [name, s2] of rnd) {
    const u = Math.sqrt(s2) / n;
    u2 += u * u;
    budget.push({ name, uRel: mean > 0 ? u / mean : 0 });
  }
  const uStd = Math.sqrt(u2);
  return { n, meanLux: mean, uStd, uLux: expanded(uStd), uRel: mean > 0 ? uStd / mean : 0, budget };
}
