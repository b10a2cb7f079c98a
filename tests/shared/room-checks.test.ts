import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { gridAdequacy, gridSpacing, iesPointMethodAverage, requiredGrid, zoneStats, type ZoneStats } from '@shared/core/zone-stats';
import { decideZone, judgeLowerLimit } from '@shared/core/decision';
import { createOutdoorReference, daylightFactor, MAX_REFERENCE_GAP_MS, outdoorAt, pairDaylight } from '@shared/core/daylight';
import { combineBudget, meanUncertainty } from '@shared/core/uncertainty';
import type { LuxBound, Reading } from '@shared/core/types';

function reading(lux: number | null, luxBound: LuxBound = 'exact', cal = 0.02, quant = 0.01): Reading {
  const budget = [
    { name: 'calibration' as const, uRel: cal },
    { name: 'quantisation' as const, uRel: quant },
  ];
  const uRel = combineBudget(budget);
  const flag = lux === null ? 'fault' : luxBound === 'lower' ? 'over_range' : luxBound === 'upper' ? 'under_range' : 'ok';
  return { probe: 'P', point: 'x', timeMs: 0, lux, luxBound, flag, flags: [flag], gainCode: 0, samples: 1, chosenSample: 0, rejected: [], uRel, uLux: 2 * uRel * (lux ?? 0), budget, coefficientSetId: 'A' };
}

describe('zone statistics (EN 12464-1: U0 = Emin / Eavg)', () => {
  it('exact points, cross-checked with simple-statistics', () => {
    const lux = [480, 520, 610, 455, 700, 390];
    const z = zoneStats([...lux.map((l) => reading(l)), reading(null)]);
    expect(z.eavg).toBeCloseTo(ss.mean(lux), 12);
    expect(z.emin).toBe(ss.min(lux));
    expect(z.emax).toBe(ss.max(lux));
    expect(z.u0).toBeCloseTo(ss.min(lux) / ss.mean(lux), 12);
    expect(z.minOverMax).toBeCloseTo(390 / 700, 12);
    expect(z.validPoints).toBe(6);
    expect(z.faultPoints).toBe(1);
    expect(z.bounded).toEqual({ eavg: null, emin: null, emax: null, u0: null, minOverMax: null });
  });

  it('300,000 points (a long walk in one zone) give Emin and Emax without overflowing the call stack', () => {
    // Spreading this many values into Math.min/Math.max throws RangeError in V8 (#13); simple-statistics loops.
    const lux = Array.from({ length: 300_000 }, (_, i) => 300 + ((i * 7919) % 1000) / 10);
    const z = zoneStats(lux.map((l) => reading(l)));
    let lo = Infinity;
    let hi = -Infinity;
    for (const l of lux) { if (l < lo) lo = l; if (l > hi) hi = l; }
    expect([z.emin, z.emax]).toEqual([lo, hi]);
    expect(z.eavg).toBeCloseTo(ss.mean(lux), 9);
  });

  it('over-range points never enter as values: Eavg and Emax become lower bounds', () => {
    const z = zoneStats([reading(500), reading(600), reading(65000, 'lower')]);
    expect(z.bounded.eavg).toBe('lower');
    expect(z.bounded.emax).toBe('lower');
    expect(z.bounded.emin).toBeNull(); // the minimum is an exact point below the bound
    expect(z.bounded.u0).toBe('upper'); // exact Emin over an Eavg that can only be higher
    expect(z.reasons.join(' ')).toMatch(/over range/);
  });

  it('under-range points: Eavg and Emin become upper bounds; mixed directions: indeterminate', () => {
    const z = zoneStats([reading(500), reading(2, 'upper')]);
    expect([z.bounded.eavg, z.bounded.emin, z.emin]).toEqual(['upper', 'upper', 2]);
    const m = zoneStats([reading(500), reading(2, 'upper'), reading(65000, 'lower')]);
    expect(m.eavg).toBeNull();
    expect(m.bounded.eavg).toBe('indeterminate');
  });

  it('property: uniformity stays within 0..1', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 1e5, noNaN: true }), { minLength: 1, maxLength: 40 }), (lux) => {
        const z = zoneStats(lux.map((l) => reading(l)));
        if (z.u0 !== null) expect(z.u0 >= 0 && z.u0 <= 1).toBe(true);
        if (z.minOverMax !== null) expect(z.minOverMax >= 0 && z.minOverMax <= 1).toBe(true);
      }),
    );
  });
});

describe('mean uncertainty: random parts shrink with sqrt(n), calibration does not (GUM; DOMAIN.md 4)', () => {
  it('n equal readings', () => {
    const n = 16;
    const m = meanUncertainty(Array.from({ length: n }, () => reading(1000, 'exact', 0.02, 0.04)))!;
    const cal = m.budget.find((b) => b.name === 'calibration')!.uRel;
    const q = m.budget.find((b) => b.name === 'quantisation')!.uRel;
    expect(cal).toBeCloseTo(0.02, 12);
    expect(q).toBeCloseTo(0.04 / Math.sqrt(n), 12);
    expect(m.uLux).toBeCloseTo(2 * 1000 * Math.hypot(0.02, 0.01), 9); // k = 2
  });
});

describe('EN 12464-1:2011 grid (formula via DOMAIN.md)', () => {
  it('spacing p = 0.2, 1, 5 m at d = 1, 10, 100 m; capped at 10 m', () => {
    expect(gridSpacing(1)).toBeCloseTo(0.2, 12);
    expect(gridSpacing(10)).toBeCloseTo(1, 12);
    expect(gridSpacing(100)).toBeCloseTo(5, 12);
    expect(gridSpacing(1000)).toBe(10); // 25 m uncapped
  });
  it('points per side n = ceil(d / p); shorter side governs when sides differ by 2x or more', () => {
    expect(requiredGrid(10, 10)).toMatchObject({ spacingM: expect.closeTo(1, 12), pointsLong: 10, pointsShort: 10, total: 100 });
    const corridor = requiredGrid(20, 2); // factor 10: d = 2 m, p = 0.2 * 5^log10(2) = 0.3241 m
    expect(corridor.dM).toBe(2);
    expect(corridor.spacingM).toBeCloseTo(0.2 * 5 ** Math.log10(2), 12);
    expect(corridor.pointsShort).toBe(Math.ceil(2 / corridor.spacingM));
    expect(corridor.pointsLong).toBe(Math.ceil(20 / corridor.spacingM));
    expect(gridAdequacy(99, 10, 10).adequate).toBe(false);
    expect(gridAdequacy(100, 10, 10).adequate).toBe(true);
  });
  it('IES point method (from memory, IES Lighting Handbook): equal readings average to themselves', () => {
    expect(iesPointMethodAverage({ R: 500, Q: 500, T: 500, P: 500, N: 4, M: 3 })).toBeCloseTo(500, 12);
    // N = M = 1: only the corner reading P counts
    expect(iesPointMethodAverage({ R: 900, Q: 800, T: 700, P: 400, N: 1, M: 1 })).toBe(400);
    expect(iesPointMethodAverage({ R: 600, Q: 400, T: 300, P: 200, N: 2, M: 2 })).toBe((600 + 400 + 300 + 200) / 4);
  });
});

function stats(eavg: number, uEavg: number, over: Partial<ZoneStats> = {}): ZoneStats {
  return {
    validPoints: 9, exactPoints: 9, overRangePoints: 0, underRangePoints: 0, faultPoints: 0,
    eavg, emin: eavg * 0.7, emax: eavg * 1.2, u0: 0.7, minOverMax: 0.58, uEavg, uU0: 0.05,
    bounded: { eavg: null, emin: null, emax: null, u0: null, minOverMax: null }, reasons: [], ...over,
  };
}

describe('decision rules (ILAC-G8:2019)', () => {
  const target = { emLux: 500 }; // EN 12464-1 office 500 lx (secondary source, DOMAIN.md 5)
  it('guarded: Eavg - U exactly Em meets; Eavg + U exactly Em is inconclusive; below falls short', () => {
    expect(decideZone(stats(550, 50), target, 'guarded').verdict).toBe('meets'); // 550 - 50 = 500 >= 500
    expect(decideZone(stats(549.5, 50), target, 'guarded').verdict).toBe('inconclusive');
    expect(decideZone(stats(450, 50), target, 'guarded').verdict).toBe('inconclusive'); // 450 + 50 = 500, not < 500
    expect(decideZone(stats(449.5, 50), target, 'guarded').verdict).toBe('falls_short');
  });
  it('simple: the same points decide on Eavg alone', () => {
    expect(decideZone(stats(500, 50), target, 'simple').verdict).toBe('meets');
    expect(decideZone(stats(550, 50), target, 'simple').verdict).toBe('meets');
    expect(decideZone(stats(450, 50), target, 'simple').verdict).toBe('falls_short');
    expect(decideZone(stats(499.99, 50), target, 'simple').verdict).toBe('falls_short');
  });
  it('the rule travels with the verdict', () => {
    const v = decideZone(stats(550, 50), target, 'guarded');
    expect(v.rule).toBe('guarded');
    expect(v.ruleText).toMatch(/ILAC-G8/);
    expect(v.reasons.length).toBeGreaterThan(0);
  });
  it('bounds: a lower bound can only prove "meets", an upper bound only "falls short"', () => {
    expect(judgeLowerLimit(600, 'lower', 50, 500)).toBe('meets');
    expect(judgeLowerLimit(400, 'lower', 50, 500)).toBe('inconclusive');
    expect(judgeLowerLimit(400, 'upper', 50, 500)).toBe('falls_short');
    expect(judgeLowerLimit(600, 'upper', 50, 500)).toBe('inconclusive');
    expect(judgeLowerLimit(null, 'indeterminate', 0, 500)).toBe('inconclusive');
  });
  it('U0 check, grid adequacy and missing uncertainty', () => {
    const t = { emLux: 500, u0Min: 0.6 }; // office U0 0.60 (secondary source)
    expect(decideZone(stats(600, 20, { u0: 0.5 }), t, 'simple').verdict).toBe('falls_short');
    expect(decideZone(stats(600, 20, { u0: 0.62, uU0: 0.05 }), t, 'guarded').verdict).toBe('inconclusive');
    expect(decideZone(stats(600, 20), t, 'guarded', { gridAdequate: false }).verdict).toBe('inconclusive');
    expect(decideZone(stats(600, 20, { uEavg: null }), target, 'guarded').verdict).toBe('inconclusive');
  });
});

describe('daylight factor DF = Ei / Eo * 100 % (CIE ILV 17-279)', () => {
  const ref = createOutdoorReference([
    { timeMs: 0, lux: 10000 },
    { timeMs: 60_000, lux: 10500 },
    { timeMs: 60_000 + MAX_REFERENCE_GAP_MS + 1, lux: 10500 },
    { timeMs: 400_000, lux: 10600 },
    { timeMs: 430_000, lux: 20000 },
  ]);
  it('interpolates linearly between reference samples', () => {
    const o = outdoorAt(ref, 30_000);
    expect(o.ok && o.lux).toBe(10250);
    expect(daylightFactor(205, 10250)).toBeCloseTo(2, 12);
    const p = pairDaylight([{ point: 'W1', timeMs: 30_000, lux: 205, luxBound: 'exact' }], ref);
    expect(p[0].ok && p[0].dfPercent).toBeCloseTo(2, 12);
  });
  it('refuses beyond the max gap and outside the reference', () => {
    expect(outdoorAt(ref, 100_000).ok).toBe(false);
    expect(outdoorAt(ref, -1).ok).toBe(false);
    expect(outdoorAt(ref, 60_000).ok).toBe(true); // exactly on a sample
  });
  it('warns when the outdoor level changed too fast', () => {
    const slow = outdoorAt(ref, 30_000);
    expect(slow.ok && slow.warning).toBeNull();
    const fast = outdoorAt(ref, 415_000);
    expect(fast.ok && fast.warning).toMatch(/per minute/);
  });
});
