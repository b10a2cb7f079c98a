import { DecodeError } from './errors';
import { fitLine, type LineFit } from './least-squares';
import type { GainCoefficients, GainStep } from './types';
import { rectangular } from './uncertainty';

/** Largest accepted deviation of a measured neighbour responsivity ratio from the nominal gain ratio (project's own choice). */
export const GAIN_RATIO_TOLERANCE = 0.02;

/** One parsed bench row: the probe's counts at a reference illuminance. */
export interface BenchRow {
  gain: number;
  referenceLux: number;
  counts: number;
  intMs: number;
  /** Probe temperature, degC; absent: no correction. */
  tempC?: number;
}

export interface BenchFitOptions {
  /** Integration time the coefficients are stated at (counts are normalised to it). */
  tRefMs: number;
  /** Relative standard uncertainty of the reference meter (k = 1), from its certificate divided by its k. */
  referenceURel: number;
  /** Temperature coefficient and calibration temperature for normalising rows with tempC (default 0 and 25). */
  alphaPerK?: number;
  tCalC?: number;
  /** Nominal gains, for the neighbour-ratio check; without them no check. */
  gains?: GainStep[];
}

export interface GainRatioCheck {
  neighbourCode: number;
  /** responsivity(code) / responsivity(neighbour). */
  measured: number;
  nominal: number;
  /** measured / nominal - 1. */
  deviation: number;
  mismatch: boolean;
}

export interface GainFit {
  code: number;
  n: number;
  /** Counts per lux at tRef (the slope). */
  responsivity: number;
  luxPerCount: number;
  uLuxPerCount: number;
  darkCounts: number;
  uDarkCounts: number;
  /** r(dark, slope) from the fit. */
  correlation: number | null;
  residualSdCounts: number;
  /** Largest relative residual (linearity figure). */
  linearity: number;
  /** Check against the next lower nominal gain; null for the lowest or without nominal gains. */
  ratio: GainRatioCheck | null;
  /** sqrt((u(luxPerCount)/luxPerCount)^2 + referenceURel^2 + (linearity/sqrt 3)^2), k = 1. */
  suggestedURel: number;
  fit: LineFit;
}

export interface BenchFitResult {
  gains: GainFit[];
  /** Human-readable problems: ratio mismatches, codes without nominal gain. */
  issues: string[];
  /** Draft coefficients per code (for a new coefficient set; staff approve it). */
  draft: GainCoefficients[];
}

/**
 * Per gain code: fit counts C_i = dark + b x_i with x_i = E_ref,i (t_i / tRef) (1 + alpha (T_i - Tcal)),
 * the inverse of the decoding model. luxPerCount = 1/b, u(luxPerCount) = u(b)/b^2 (first-order);
 * darkCounts = intercept with its u from the fit's covariance.
 */
export function fitBench(rows: readonly BenchRow[], options: BenchFitOptions): BenchFitResult {
  if (!(options.tRefMs > 0)) throw new DecodeError('bad_integration_time', 'tRefMs must be positive.');
  const alpha = options.alphaPerK ?? 0;
  const tCal = options.tCalC ?? 25;
  const byCode = new Map<number, BenchRow[]>();
  for (const r of rows) {
    if (!(r.intMs > 0)) throw new DecodeError('bad_integration_time', `Gain ${r.gain}: integration time ${r.intMs} ms is not positive.`);
    const list = byCode.get(r.gain) ?? [];
    list.push(r);
    byCode.set(r.gain, list);
  }
  const issues: string[] = [];
  const fits: GainFit[] = [];
  for (const [code, list] of byCode) {
    const x = list.map((r) => r.referenceLux * (r.intMs / options.tRefMs) * (r.tempC === undefined ? 1 : 1 + alpha * (r.tempC - tCal)));
    const y = list.map((r) => r.counts);
    let fit: LineFit;
    try {
      fit = fitLine(x, y);
    } catch (e) {
      if (e instanceof DecodeError) throw new DecodeError(e.code, `Gain ${code}: ${e.message}`, { gain: code });
      throw e;
    }
    if (!(fit.slope > 0)) throw new DecodeError('bad_input', `Gain ${code}: counts do not rise with illuminance.`, { gain: code });
    const lpc = 1 / fit.slope;
    const uLpc = fit.uSlope / fit.slope ** 2;
    const linearity = fit.maxRelResidual;
    fits.push({
      code,
      n: list.length,
      responsivity: fit.slope,
      luxPerCount: lpc,
      uLuxPerCount: uLpc,
      darkCounts: fit.intercept,
      uDarkCounts: fit.uIntercept,
      correlation: fit.correlation,
      residualSdCounts: fit.residualSd,
      linearity,
      ratio: null,
      suggestedURel: Math.sqrt((uLpc / lpc) ** 2 + options.referenceURel ** 2 + rectangular(linearity) ** 2),
      fit,
    });
  }
  if (options.gains) {
    const nominal = new Map(options.gains.map((g) => [g.code, g.nominalGain]));
    for (const f of fits) if (!nominal.has(f.code)) issues.push(`Gain code ${f.code} has no nominal gain; its ratio was not checked.`);
    const known = fits.filter((f) => nominal.has(f.code)).sort((a, b) => nominal.get(a.code)! - nominal.get(b.code)!);
    for (let i = 1; i < known.length; i++) {
      const f = known[i];
      const lower = known[i - 1];
      const measured = f.responsivity / lower.responsivity;
      const nom = nominal.get(f.code)! / nominal.get(lower.code)!;
      const deviation = measured / nom - 1;
      const mismatch = Math.abs(deviation) > GAIN_RATIO_TOLERANCE;
      f.ratio = { neighbourCode: lower.code, measured, nominal: nom, deviation, mismatch };
      if (mismatch) {
        issues.push(`Gain code ${f.code} vs ${lower.code}: responsivity ratio ${measured.toFixed(4)} differs from nominal ${nom.toFixed(4)} by ${(deviation * 100).toFixed(2)} % (limit ${GAIN_RATIO_TOLERANCE * 100} %).`);
      }
    }
  }
  fits.sort((a, b) => a.code - b.code);
  return {
    gains: fits,
    issues,
    draft: fits.map((f) => ({ code: f.code, darkCounts: f.darkCounts, luxPerCount: f.luxPerCount, uRel: f.suggestedURel, uDarkCounts: f.uDarkCounts })),
  };
}
