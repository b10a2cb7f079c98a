import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { fitLine, predictLine } from '@shared/core/least-squares';
import nist from '../fixtures/reference/nist-strd-linear.json';
import gum from '../fixtures/reference/gum-h3-linear-calibration.json';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('fitLine against NIST StRD linear regression (certified values)', () => {
  it('Norris, y = B0 + B1 x', () => {
    const d = nist.datasets.Norris;
    const f = fitLine(d.x, d.y);
    const c = d.certified;
    expect(rel(f.intercept, c.B0)).toBeLessThanOrEqual(1e-9); // NIST StRD Norris B0
    expect(rel(f.slope, c.B1)).toBeLessThanOrEqual(1e-9); // NIST StRD Norris B1
    expect(rel(f.uIntercept, c.B0_sd)).toBeLessThanOrEqual(1e-8); // NIST StRD Norris sd(B0)
    expect(rel(f.uSlope, c.B1_sd)).toBeLessThanOrEqual(1e-8); // NIST StRD Norris sd(B1)
    expect(rel(f.residualSd, c.residual_sd)).toBeLessThanOrEqual(1e-8); // NIST StRD Norris residual SD
    expect(rel(f.rss, c.residual_ss)).toBeLessThanOrEqual(1e-8); // NIST StRD Norris residual SS
    expect(rel(f.rSquared, c.r_squared)).toBeLessThanOrEqual(1e-9); // NIST StRD Norris R^2
    expect(f.dof).toBe(34); // n - 2 for 36 points
  });

  for (const name of ['NoInt1', 'NoInt2'] as const) {
    it(`${name}, y = B1 x (through the origin)`, () => {
      const d = nist.datasets[name];
      const f = fitLine(d.x, d.y, { intercept: false });
      const c = d.certified;
      expect(rel(f.slope, c.B1)).toBeLessThanOrEqual(1e-9); // NIST StRD certified B1
      expect(rel(f.uSlope, c.B1_sd)).toBeLessThanOrEqual(1e-8); // NIST StRD certified sd(B1)
      expect(rel(f.rss, c.residual_ss)).toBeLessThanOrEqual(1e-8); // NIST StRD certified residual SS
      expect(f.intercept).toBe(0);
      expect(f.correlation).toBeNull();
    });
  }
});

describe('fitLine against GUM (JCGM 100:2008) H.3, thermometer calibration', () => {
  const x = gum.t_k.map((t) => t - gum.t0);
  const f = fitLine(x, gum.b_k);
  const e = gum.expected;
  // The GUM prints rounded figures: compare to half a unit of the last printed digit.
  it('slope, intercept, their uncertainties, correlation and s', () => {
    expect(Math.abs(f.intercept - e.y1)).toBeLessThanOrEqual(0.00005); // GUM H.3: y1 = -0.1712 degC
    expect(Math.abs(f.uIntercept - e.u_y1)).toBeLessThanOrEqual(0.00005); // GUM H.3: u(y1) = 0.0029 degC
    expect(Math.abs(f.slope - e.y2)).toBeLessThanOrEqual(0.000005); // GUM H.3: y2 = 0.00218
    expect(Math.abs(f.uSlope - e.u_y2)).toBeLessThanOrEqual(0.000005); // GUM H.3: u(y2) = 0.00067
    expect(Math.abs((f.correlation as number) - e.r_y1_y2)).toBeLessThanOrEqual(0.0005); // GUM H.3: r = -0.930
    expect(Math.abs(f.residualSd - e.s)).toBeLessThanOrEqual(0.00005); // GUM H.3: s = 0.0035 degC
  });
  it('predicted correction at 30 degC with its uncertainty (covariance term included)', () => {
    const p = predictLine(f, 30 - gum.t0);
    expect(Math.abs(p.value - e.b_at_30)).toBeLessThanOrEqual(0.00005); // GUM H.3: b(30) = -0.1494 degC
    expect(Math.abs(p.u - e.u_b_at_30)).toBeLessThanOrEqual(0.00005); // GUM H.3: u = 0.0041 degC
    // Without the covariance term the figure would be larger: the term matters here.
    const noCov = Math.sqrt(f.uIntercept ** 2 + 100 * f.uSlope ** 2);
    expect(noCov - p.u).toBeGreaterThan(0.0005);
  });
});

describe('cross-check with simple-statistics on random data', () => {
  it('mean, min and linear regression agree', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: -1e3, max: 1e3, noNaN: true })), { minLength: 3, maxLength: 60 }),
        (pts) => {
          const x = pts.map((p) => p[0]);
          const y = pts.map((p) => p[1]);
          const xm = ss.mean(x);
          if (x.every((v) => Math.abs(v - xm) < 1e-3)) return; // degenerate x: no slope
          const f = fitLine(x, y);
          const r = ss.linearRegression(pts);
          const scale = 1 + Math.abs(r.m);
          expect(Math.abs(f.slope - r.m) / scale).toBeLessThan(1e-6);
          expect(Math.abs(f.intercept - r.b) / (1 + Math.abs(r.b) + Math.abs(r.m) * 1e3)).toBeLessThan(1e-6);
          expect(Math.min(...y)).toBe(ss.min(y));
        },
      ),
    );
  });
  it('residual SD agrees with simple-statistics sample SD of the residuals scaled to n-2', () => {
    const x = [1, 2, 3, 4, 5, 6, 7];
    const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2, 13.8];
    const f = fitLine(x, y);
    const sd = ss.sampleStandardDeviation(f.residuals); // divides by n-1, residual mean is 0
    expect(f.residualSd).toBeCloseTo(sd * Math.sqrt(6 / 5), 12);
  });
});

describe('fitLine input checks', () => {
  it('refuses too few points and equal x', () => {
    expect(() => fitLine([1, 2], [1, 2])).toThrow(/at least 3/);
    expect(() => fitLine([1], [1], { intercept: false })).toThrow(/at least 2/);
    expect(() => fitLine([2, 2, 2], [1, 2, 3])).toThrow(/equal/);
    expect(() => fitLine([1, 2, NaN], [1, 2, 3])).toThrow(/finite/);
  });
});
