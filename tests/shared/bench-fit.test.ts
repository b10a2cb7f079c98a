import { describe, expect, it } from 'vitest';
import { fitBench, GAIN_RATIO_TOLERANCE, type BenchRow } from '@shared/core/bench-fit';
import { fitLine } from '@shared/core/least-squares';
import gum from '../fixtures/reference/gum-h3-linear-calibration.json';

const gains = [
  { code: 0, nominalGain: 1 },
  { code: 1, nominalGain: 8 },
  { code: 2, nominalGain: 64 },
];
// Synthetic bench run: counts = dark + E * t / tRef / lpc, with a known small wobble (invented test data).
function rows(code: number, lpc: number, dark: number, intMs = 100): BenchRow[] {
  const wobble = [3, -2, 1, -4, 2]; // counts, so the fit has a non-zero residual
  const top = 60000 * lpc; // reference levels up to about 60000 net counts at this gain
  return [0.01, 0.03, 0.1, 0.3, 0.9].map((f, i) => {
    const referenceLux = f * top;
    return { gain: code, referenceLux, intMs, counts: Math.round(dark + (referenceLux * intMs) / 100 / lpc + wobble[i]) };
  });
}

describe('fitBench', () => {
  const run = [...rows(0, 2, 40), ...rows(1, 0.25, 45, 50), ...rows(2, 2 / 64 * 1.05, 50)];
  const res = fitBench(run, { tRefMs: 100, referenceURel: 0.01, gains });

  it('recovers luxPerCount and dark per code, normalised to tRef', () => {
    const [g0, g1] = res.gains;
    expect(g0.luxPerCount).toBeCloseTo(2, 2);
    expect(g1.luxPerCount / 0.25).toBeCloseTo(1, 3); // 50 ms rows, normalised to 100 ms
    expect(Math.abs(g0.darkCounts - 40)).toBeLessThan(1);
    expect(g0.uDarkCounts).toBeGreaterThan(0);
  });

  it('uncertainties follow the fit covariance: u(lpc) = u(b) / b^2', () => {
    const g = res.gains[0];
    const f = fitLine(g.fit.residuals.map((_, i) => run[i].referenceLux), run.slice(0, 5).map((r) => r.counts));
    expect(g.uLuxPerCount).toBeCloseTo(f.uSlope / f.slope ** 2, 12);
    expect(g.uDarkCounts).toBeCloseTo(f.uIntercept, 12);
    expect(g.suggestedURel).toBeGreaterThanOrEqual(0.01); // never below the reference meter's own uncertainty
  });

  it(`flags a neighbour ratio off nominal by more than ${GAIN_RATIO_TOLERANCE * 100} % (project tolerance)`, () => {
    expect(res.gains[1].ratio?.mismatch).toBe(false);
    expect(res.gains[2].ratio?.mismatch).toBe(true); // code 2 is 5 % weak by construction
    expect(res.gains[2].ratio?.deviation).toBeCloseTo(1 / 1.05 - 1, 2);
    expect(res.issues).toHaveLength(1);
    expect(res.draft.map((d) => d.code)).toEqual([0, 1, 2]);
  });

  it('GUM H.3 data through the same fit path: intercept and slope as printed', () => {
    // A bench row maps x = referenceLux * intMs / tRef; use intMs = tRef to pass GUM's x straight through.
    const r = fitBench(gum.t_k.map((t, i) => ({ gain: 0, referenceLux: t - gum.t0, counts: gum.b_k[i] * 1e6, intMs: 100 })), { tRefMs: 100, referenceURel: 0 });
    // counts must rise with "lux": GUM's slope is positive. Scaled by 1e6 to look like counts.
    expect(r.gains[0].darkCounts / 1e6).toBeCloseTo(-0.1712, 4); // GUM H.3 y1
    expect(r.gains[0].responsivity / 1e6).toBeCloseTo(0.00218, 5); // GUM H.3 y2
  });

  it('rejects bad rows and too few points', () => {
    expect(() => fitBench([{ gain: 0, referenceLux: 1, counts: 1, intMs: 0 }], { tRefMs: 100, referenceURel: 0 })).toThrow(/integration time/);
    expect(() => fitBench(rows(0, 2, 40).slice(0, 2), { tRefMs: 100, referenceURel: 0 })).toThrow(/Gain 0/);
  });
});
