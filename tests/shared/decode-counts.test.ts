import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { decodeCounts } from '@shared/core/decode-counts';
import { DecodeError } from '@shared/core/errors';
import { createCoefficientSelector, isCalibrationLapsed, selectCoefficientSet } from '@shared/core/coefficient-sets';
import { ASSUMED_TEMPERATURE_BOUND_K, QUANTISATION_U_COUNTS } from '@shared/core/uncertainty';
import { makeSet, probe, setA } from './fixtures';

const codeOf = (fn: () => unknown): string | undefined => {
  try {
    fn();
  } catch (e) {
    return e instanceof DecodeError ? e.code : 'not a DecodeError';
  }
  return undefined;
};

describe('decodeCounts: E = (C - dark) * luxPerCount * (tRef / t) / (1 + alpha (T - Tcal)) (DOMAIN.md 2)', () => {
  it('hand-worked example with integration time and temperature', () => {
    const set = makeSet('X', 0, { tRefMs: 100, alphaPerK: 0.002, tCalC: 25, gains: [{ code: 1, darkCounts: 50, luxPerCount: 0.5, uRel: 0.01 }] });
    const d = decodeCounts(probe, set, { gainCode: 1, counts: 1050, intMs: 50, tempC: 35 });
    // 1000 net * 0.5 lx * (100/50) / (1 + 0.002 * 10) = 1000 / 1.02, worked by hand
    expect(d.lux).toBeCloseTo(980.392156862745, 9);
    expect(d.status).toBe('ok');
    expect(d.temperatureCorrected).toBe(true);
  });

  it('no temperature: no correction, budget uses the assumed +/-10 K rectangular bound (common practice)', () => {
    const d = decodeCounts(probe, setA, { gainCode: 0, counts: 1040 });
    expect(d.lux).toBe(1000 * 2); // (1040 - 40) * 2 lx, t = tRef
    const temp = d.budget.find((p) => p.name === 'temperature')!;
    expect(temp.uRel).toBeCloseTo((0.002 * ASSUMED_TEMPERATURE_BOUND_K) / Math.sqrt(3), 12); // GUM 4.3.7, a / sqrt(3)
    const withT = decodeCounts(probe, setA, { gainCode: 0, counts: 1040, tempC: 25 });
    expect(withT.uRel).toBeLessThan(d.uRel);
  });

  it('quantisation part is 1/sqrt(12) count over net counts (GUM F.2.2.1)', () => {
    const d = decodeCounts(probe, setA, { gainCode: 0, counts: 1040 });
    expect(QUANTISATION_U_COUNTS).toBeCloseTo(0.288675134594813, 12); // 1/sqrt(12), by hand
    expect(d.budget.find((p) => p.name === 'quantisation')!.uRel).toBeCloseTo(0.288675134594813 / 1000, 14);
  });

  it('flags saturated and low-signal samples', () => {
    expect(decodeCounts(probe, setA, { gainCode: 0, counts: 65000 }).status).toBe('saturated'); // C >= saturationCounts
    expect(decodeCounts(probe, setA, { gainCode: 0, counts: 64999 }).status).toBe('ok');
    expect(decodeCounts(probe, setA, { gainCode: 0, counts: 40 + 199 }).status).toBe('low_signal'); // C - dark < floor
    expect(decodeCounts(probe, setA, { gainCode: 0, counts: 40 + 200 }).status).toBe('ok');
  });

  it('typed errors, never NaN', () => {
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 9, counts: 100 }))).toBe('unknown_gain');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 1.5, counts: 100 }))).toBe('unknown_gain');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 65536 }))).toBe('counts_out_of_range');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: -1 }))).toBe('counts_out_of_range');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 10.5 }))).toBe('counts_not_integer');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: NaN }))).toBe('counts_not_integer');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 100, intMs: 0 }))).toBe('bad_integration_time');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 100, intMs: -5 }))).toBe('bad_integration_time');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 100, tempC: NaN }))).toBe('bad_temperature');
    expect(codeOf(() => decodeCounts(probe, setA, { gainCode: 0, counts: 100, intMs: 100, tempC: 20 }))).toBeUndefined();
  });

  it('property: more counts never decode to less light', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 65535 }), fc.integer({ min: 0, max: 65535 }), fc.option(fc.double({ min: -20, max: 60, noNaN: true }), { nil: undefined }), (g, a, b, t) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        expect(decodeCounts(probe, setA, { gainCode: g, counts: lo, tempC: t }).lux).toBeLessThanOrEqual(decodeCounts(probe, setA, { gainCode: g, counts: hi, tempC: t }).lux);
      }),
    );
  });

  it('property: one illuminance sampled at any usable gain decodes alike within one count of quantisation', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 120000, noNaN: true }), fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 3 }), (e, g1, g2) => {
        const decode = (g: number) => {
          const c = setA.gains[g];
          const counts = Math.min(65535, Math.round(e / c.luxPerCount + c.darkCounts)); // an ideal probe, rounding to a count
          return { d: decodeCounts(probe, setA, { gainCode: g, counts }), lpc: c.luxPerCount };
        };
        const a = decode(g1);
        const b = decode(g2);
        fc.pre(a.d.status === 'ok' && b.d.status === 'ok');
        expect(Math.abs(a.d.lux - b.d.lux)).toBeLessThanOrEqual(0.5 * a.lpc + 0.5 * b.lpc + 1e-9 * e);
      }),
    );
  });
});

describe('coefficient sets', () => {
  const b = makeSet('B', 1000, { dueDate: 5000 });
  const draft = makeSet('D', 2000, { approved: false });
  const sets = [b, draft, setA];

  it('latest approved set not after the sample; exactly at effectiveFrom uses the new set', () => {
    expect(selectCoefficientSet(sets, 999)?.id).toBe('A');
    expect(selectCoefficientSet(sets, 1000)?.id).toBe('B');
    expect(selectCoefficientSet(sets, 2500)?.id).toBe('B'); // the draft is not approved
    expect(selectCoefficientSet(sets, -1)).toBeNull();
    expect(createCoefficientSelector([]).select(0)).toBeNull();
  });

  it('calibration lapses after the due date', () => {
    expect(isCalibrationLapsed(b, 5000)).toBe(false);
    expect(isCalibrationLapsed(b, 5001)).toBe(true);
    expect(isCalibrationLapsed(setA, 1e15)).toBe(false);
  });

  it('property: selector agrees with a linear scan', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 100 }), { minLength: 1, maxLength: 12 }), fc.integer({ min: -5, max: 105 }), (froms, t) => {
        const ss = froms.map((f, i) => makeSet(String(i), f));
        let expected: string | null = null;
        let best = -Infinity;
        ss.forEach((s) => {
          if (s.effectiveFrom <= t && s.effectiveFrom >= best) {
            best = s.effectiveFrom;
            expected = s.id;
          }
        });
        expect(createCoefficientSelector(ss).select(t)?.id ?? null).toBe(expected);
      }),
    );
  });
});
