import { max, min } from 'simple-statistics';
import type { Reading } from './types';
import { COVERAGE_K, meanUncertainty } from './uncertainty';

/** How a statistic relates to the truth: null exact; 'lower'/'upper' a bound; 'indeterminate' no usable figure. */
export type StatBound = null | 'lower' | 'upper' | 'indeterminate';

export interface ZoneStats {
  /** Points with a value or a bound (faults excluded). */
  validPoints: number;
  exactPoints: number;
  overRangePoints: number;
  underRangePoints: number;
  faultPoints: number;
  /** Values are null when no figure can be given (no points, or bounds in both directions). */
  eavg: number | null;
  emin: number | null;
  emax: number | null;
  /** U0 = Emin / Eavg (EN 12464-1). */
  u0: number | null;
  /** Emin / Emax. */
  minOverMax: number | null;
  /** Expanded uncertainty (k = 2) of Eavg, lux (uncertainty.meanUncertainty). */
  uEavg: number | null;
  /** Expanded uncertainty (k = 2) of U0: conservative, U0 * k * sqrt(u_rel(Emin)^2 + u_rel(Eavg)^2), ignoring their positive correlation. */
  uU0: number | null;
  bounded: { eavg: StatBound; emin: StatBound; emax: StatBound; u0: StatBound; minOverMax: StatBound };
  reasons: string[];
}

function ratioBound(num: StatBound, den: StatBound): StatBound {
  if (num === 'indeterminate' || den === 'indeterminate') return 'indeterminate';
  // num/den grows with num and shrinks with den.
  const up = num === 'upper' || den === 'lower';
  const low = num === 'lower' || den === 'upper';
  if (up && low) return 'indeterminate';
  return up ? 'upper' : low ? 'lower' : null;
}

/**
 * Zone statistics (EN 12464-1: Eavg, Emin, U0 = Emin/Eavg; plus Emax and Emin/Emax). Faults are excluded.
 * An over-range point (true >= bound) or under-range point (true <= bound) enters only as its bound,
 * and the statistic is then marked as a bound in the direction it is still valid, or indeterminate.
 */
export function zoneStats(readings: readonly Reading[]): ZoneStats {
  const vals: number[] = [];
  const lows: number[] = []; // over range: lower bounds
  const ups: number[] = []; // under range: upper bounds
  let faults = 0;
  let minReading: Reading | null = null;
  const used: Reading[] = [];
  for (const r of readings) {
    if (r.lux === null) {
      faults++;
      continue;
    }
    used.push(r);
    if (r.luxBound === 'lower') lows.push(r.lux);
    else if (r.luxBound === 'upper') ups.push(r.lux);
    else vals.push(r.lux);
    if (minReading === null || r.lux < (minReading.lux as number)) minReading = r;
  }
  const reasons: string[] = [];
  if (faults > 0) reasons.push(`${faults} point(s) excluded as faults.`);
  const n = used.length;
  const empty: ZoneStats = {
    validPoints: 0, exactPoints: 0, overRangePoints: 0, underRangePoints: 0, faultPoints: faults,
    eavg: null, emin: null, emax: null, u0: null, minOverMax: null, uEavg: null, uU0: null,
    bounded: { eavg: 'indeterminate', emin: 'indeterminate', emax: 'indeterminate', u0: 'indeterminate', minOverMax: 'indeterminate' },
    reasons: [...reasons, 'No point with a value.'],
  };
  if (n === 0) return empty;
  if (lows.length > 0) reasons.push(`${lows.length} point(s) over range enter only as lower bounds.`);
  if (ups.length > 0) reasons.push(`${ups.length} point(s) under range enter only as upper bounds.`);

  const all = [...vals, ...lows, ...ups];
  const sum = all.reduce((a, b) => a + b, 0);
  const eavgBound: StatBound = lows.length > 0 && ups.length > 0 ? 'indeterminate' : lows.length > 0 ? 'lower' : ups.length > 0 ? 'upper' : null;
  const eavg = eavgBound === 'indeterminate' ? null : sum / n;

  const minV = vals.length ? min(vals) : Infinity;
  const maxV = vals.length ? max(vals) : -Infinity;
  let emin: number;
  let eminBound: StatBound;
  if (ups.length > 0) {
    // Emin <= every value and every under-range bound.
    emin = Math.min(minV, min(ups));
    eminBound = 'upper';
  } else if (lows.length > 0 && min(lows) < minV) {
    // Some over-range point might be the minimum: Emin >= min of everything.
    emin = min(lows);
    eminBound = 'lower';
  } else {
    emin = minV;
    eminBound = null;
  }
  let emax: number;
  let emaxBound: StatBound;
  if (lows.length > 0) {
    emax = Math.max(maxV, max(lows));
    emaxBound = 'lower';
  } else if (ups.length > 0 && max(ups) > maxV) {
    emax = max(ups);
    emaxBound = 'upper';
  } else {
    emax = maxV;
    emaxBound = null;
  }
  const u0Bound = ratioBound(eminBound, eavgBound);
  const momBound = ratioBound(eminBound, emaxBound);
  const u0 = u0Bound === 'indeterminate' || eavg === null ? null : eavg > 0 ? Math.min(1, Math.max(0, emin / eavg)) : null;
  const minOverMax = momBound === 'indeterminate' ? null : emax > 0 ? Math.min(1, Math.max(0, emin / emax)) : null;
  if (eavg !== null && eavg <= 0) reasons.push('Average is 0 lx: no uniformity.');

  const mu = meanUncertainty(used);
  const uEavg = eavg === null || mu === null ? null : mu.uLux;
  let uU0: number | null = null;
  if (u0 !== null && mu !== null && minReading !== null) {
    uU0 = u0 * COVERAGE_K * Math.sqrt(minReading.uRel ** 2 + mu.uRel ** 2);
  }
  return {
    validPoints: n,
    exactPoints: vals.length,
    overRangePoints: lows.length,
    underRangePoints: ups.length,
    faultPoints: faults,
    eavg,
    emin,
    emax,
    u0,
    minOverMax,
    uEavg,
    uU0,
    bounded: { eavg: eavgBound, emin: eminBound, emax: emaxBound, u0: u0Bound, minOverMax: momBound },
    reasons,
  };
}

/** Grid rule of EN 12464-1:2011, 4.4 and Annex (formula as given in DOMAIN.md): n = ceil(d / p). */
export const GRID_RULE = 'EN 12464-1:2011 (p = 0.2 × 5^log10(d), p ≤ 10 m, n = ceil(d / p))';

/** The 2021 reading (secondary): points per side rounded to the nearest integer. */
export const GRID_RULE_NEAREST = 'EN 12464-1:2021 as reported (secondary) (p = 0.2 × 5^log10(d), p ≤ 10 m, n = round(d / p))';

export function gridRuleText(rounding: GridRounding): string {
  return rounding === 'nearest' ? GRID_RULE_NEAREST : GRID_RULE;
}

/** Largest grid spacing p = 0.2 * 5^log10(d) m, capped at 10 m (EN 12464-1:2011). */
export function gridSpacing(dM: number): number {
  if (!(dM > 0)) return 0;
  return Math.min(10, 0.2 * 5 ** Math.log10(dM));
}

/**
 * How EN 12464-1's points per side are rounded. 'next_higher': the 2011 text, "the next higher
 * integer" of d / p (DOMAIN.md, section 5). 'nearest': the 2021 edition as reported by secondary
 * sources (not checked against the text: secondary, from memory).
 */
export const GRID_ROUNDINGS = ['next_higher', 'nearest'] as const;
export type GridRounding = (typeof GRID_ROUNDINGS)[number];

/** Points along a side of length L at spacing p: ceil(L / p) or round(L / p), at least 1, with a 1e-9 guard against float noise. */
export function pointsPerSide(lengthM: number, spacingM: number, rounding: GridRounding = 'next_higher'): number {
  if (!(lengthM > 0) || !(spacingM > 0)) return 0;
  const ratio = lengthM / spacingM;
  return Math.max(1, rounding === 'nearest' ? Math.round(ratio + 1e-9) : Math.ceil(ratio - 1e-9));
}

export interface GridRequirement {
  rule: string;
  /** The side d the spacing was derived from. */
  dM: number;
  spacingM: number;
  pointsLong: number;
  pointsShort: number;
  total: number;
}

/**
 * Required grid for a rectangular zone: d = the longer side, or the shorter side if the sides
 * differ by a factor of 2 or more (EN 12464-1:2011). wallBandM (e.g. 0.5 m) is removed from each edge first.
 */
export function requiredGrid(sideAM: number, sideBM: number, wallBandM = 0, rounding: GridRounding = 'next_higher'): GridRequirement {
  const a = Math.max(0, Math.max(sideAM, sideBM) - 2 * wallBandM);
  const b = Math.max(0, Math.min(sideAM, sideBM) - 2 * wallBandM);
  const d = b > 0 && a / b >= 2 ? b : a;
  const p = gridSpacing(d);
  const pointsLong = pointsPerSide(a, p, rounding);
  const pointsShort = pointsPerSide(b, p, rounding);
  return { rule: rounding === 'nearest' ? GRID_RULE_NEAREST : GRID_RULE, dM: d, spacingM: p, pointsLong, pointsShort, total: pointsLong * pointsShort };
}

/** Flags a zone measured with fewer points than the grid rule requires. */
export function gridAdequacy(measuredPoints: number, sideAM: number, sideBM: number, wallBandM = 0): { adequate: boolean; required: number; measured: number; rule: string } {
  const g = requiredGrid(sideAM, sideBM, wallBandM);
  return { adequate: measuredPoints >= g.total, required: g.total, measured: measuredPoints, rule: g.rule };
}

/**
 * IES point method for regular luminaire layouts (from memory, IES Lighting Handbook, measurement chapter):
 * Eavg = (R (N-1)(M-1) + Q (N-1) + T (M-1) + P) / (N M); R inner bays, Q sides, T ends, P corners,
 * N luminaires per row, M rows.
 */
export function iesPointMethodAverage(i: { R: number; Q: number; T: number; P: number; N: number; M: number }): number {
  return (i.R * (i.N - 1) * (i.M - 1) + i.Q * (i.N - 1) + i.T * (i.M - 1) + i.P) / (i.N * i.M);
}
