import { DecodeError } from './errors';

/** Straight-line ordinary least-squares fit y = intercept + slope x, with its full covariance. */
export interface LineFit {
  withIntercept: boolean;
  n: number;
  slope: number;
  /** 0 for a fit through the origin. */
  intercept: number;
  uSlope: number;
  uIntercept: number;
  /** cov(intercept, slope); 0 through the origin. */
  covariance: number;
  /** r(intercept, slope); null through the origin. */
  correlation: number | null;
  /** s = sqrt(RSS / dof). */
  residualSd: number;
  rss: number;
  dof: number;
  /** With intercept: 1 - RSS / sum (y - ybar)^2. Through the origin: uncentred 1 - RSS / sum y^2 (as NIST StRD certifies). */
  rSquared: number;
  /** max |y_i - yhat_i| / |yhat_i| over points with yhat_i != 0 (0 if none). */
  maxRelResidual: number;
  residuals: number[];
}

/** Mean with one correction pass (two-pass, for accuracy). */
function mean(a: readonly number[]): number {
  let s = 0;
  for (const v of a) s += v;
  const m = s / a.length;
  let c = 0;
  for (const v of a) c += v - m;
  return m + c / a.length;
}

/**
 * OLS on centred data (two-pass sums). With intercept: b = Sxy / Sxx, a = ybar - b xbar,
 * s^2 = RSS / (n - 2), var b = s^2 / Sxx, var a = s^2 (1/n + xbar^2 / Sxx), cov(a, b) = -xbar s^2 / Sxx.
 * Through the origin: b = sum xy / sum x^2, s^2 = RSS / (n - 1), var b = s^2 / sum x^2.
 * (Standard OLS, e.g. GUM H.3 and NIST StRD linear regression.) Needs dof >= 1 and x not all equal.
 */
export function fitLine(x: readonly number[], y: readonly number[], options: { intercept?: boolean } = {}): LineFit {
  const withIntercept = options.intercept ?? true;
  const n = x.length;
  if (y.length !== n) throw new DecodeError('bad_input', `x has ${n} values, y has ${y.length}.`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new DecodeError('bad_input', `Point ${i + 1} is not a finite number.`);
  }
  const dof = n - (withIntercept ? 2 : 1);
  if (dof < 1) throw new DecodeError('insufficient_data', `A line${withIntercept ? '' : ' through the origin'} needs at least ${n - dof + 1} points; got ${n}.`);
  let slope: number;
  let intercept = 0;
  let sxx: number;
  let syy = 0;
  let xm = 0;
  if (withIntercept) {
    xm = mean(x);
    const ym = mean(y);
    sxx = 0;
    let sxy = 0;
    for (let i = 0; i < n; i++) {
      const dx = x[i] - xm;
      const dy = y[i] - ym;
      sxx += dx * dx;
      sxy += dx * dy;
      syy += dy * dy;
    }
    if (!(sxx > 0)) throw new DecodeError('insufficient_data', 'All x values are equal: no slope can be fitted.');
    slope = sxy / sxx;
    intercept = ym - slope * xm;
  } else {
    sxx = 0;
    let sxy = 0;
    for (let i = 0; i < n; i++) {
      sxx += x[i] * x[i];
      sxy += x[i] * y[i];
      syy += y[i] * y[i];
    }
    if (!(sxx > 0)) throw new DecodeError('insufficient_data', 'All x values are zero: no slope can be fitted.');
    slope = sxy / sxx;
  }
  const residuals = new Array<number>(n);
  let rss = 0;
  let maxRel = 0;
  for (let i = 0; i < n; i++) {
    // Centred form of the prediction: same value, less cancellation.
    const yhat = withIntercept ? intercept + slope * x[i] : slope * x[i];
    const r = y[i] - yhat;
    residuals[i] = r;
    rss += r * r;
    if (yhat !== 0) maxRel = Math.max(maxRel, Math.abs(r / yhat));
  }
  const s2 = rss / dof;
  const varSlope = s2 / sxx;
  const varIntercept = withIntercept ? s2 * (1 / n + (xm * xm) / sxx) : 0;
  const covariance = withIntercept ? (-xm * s2) / sxx : 0;
  const uSlope = Math.sqrt(varSlope);
  const uIntercept = Math.sqrt(varIntercept);
  const correlation = withIntercept ? (uSlope > 0 && uIntercept > 0 ? covariance / (uSlope * uIntercept) : 0) : null;
  return {
    withIntercept,
    n,
    slope,
    intercept,
    uSlope,
    uIntercept,
    covariance,
    correlation,
    residualSd: Math.sqrt(s2),
    rss,
    dof,
    rSquared: syy > 0 ? 1 - rss / syy : 1,
    maxRelResidual: maxRel,
    residuals,
  };
}

/** y(x) = a + b x with u^2 = u_a^2 + x^2 u_b^2 + 2 x cov(a, b) (GUM H.3, eq. H.16 form). */
export function predictLine(fit: LineFit, x: number): { value: number; u: number } {
  const u2 = fit.uIntercept ** 2 + x * x * fit.uSlope ** 2 + 2 * x * fit.covariance;
  return { value: fit.intercept + fit.slope * x, u: Math.sqrt(Math.max(0, u2)) };
}
