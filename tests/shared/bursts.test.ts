import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assembleBursts, createBurstAssembler, DEFAULT_BURST_WINDOW_SECONDS } from '@shared/core/bursts';
import { DecodeError } from '@shared/core/errors';
import type { CountSample } from '@shared/core/types';
import { LPC0, makeSet, probe, setA } from './fixtures';

const probes = { P1: { probe, sets: [setA] }, P2: { probe, sets: [setA] } };
const s = (over: Partial<CountSample>): CountSample => ({ probe: 'P1', point: 'A1', timeMs: 0, gainCode: 0, counts: 1000, ...over });
const darkOf = (g: number) => 40 + g * 5; // fixtures.makeSet
const lpcOf = (g: number) => LPC0 / probe.gains[g].nominalGain;

describe('auto-ranging bursts', () => {
  it('chooses the highest gain that is neither saturated nor low-signal, and says why the others were not', () => {
    const r = assembleBursts([s({ gainCode: 3, counts: 65535 }), s({ gainCode: 2, counts: 30000, timeMs: 500 }), s({ gainCode: 1, counts: 3800, timeMs: 900 }), s({ gainCode: 0, counts: 100, timeMs: 1200 })], { probes });
    expect(r).toHaveLength(1);
    expect(r[0].chosenSample).toBe(1);
    expect(r[0].gainCode).toBe(2);
    expect(r[0].timeMs).toBe(500);
    expect(r[0].lux).toBeCloseTo((30000 - darkOf(2)) * lpcOf(2), 9);
    expect(r[0].rejected).toEqual([
      { index: 0, reason: 'saturated' },
      { index: 2, reason: 'lower_gain' },
      { index: 3, reason: 'low_signal' },
    ]);
    expect(r[0].flag).toBe('ok');
    expect(r[0].samples).toBe(4);
  });

  it(`window boundary: exactly ${DEFAULT_BURST_WINDOW_SECONDS} s after the first sample still belongs to the burst`, () => {
    const r = assembleBursts([s({ timeMs: 0 }), s({ timeMs: 6000 }), s({ timeMs: 10000 }), s({ timeMs: 10001 })], { probes });
    expect(r.map((x) => x.samples)).toEqual([3, 1]);
  });

  it('window is measured from the FIRST sample, not the previous one', () => {
    const r = assembleBursts([s({ timeMs: 0 }), s({ timeMs: 9000 }), s({ timeMs: 18000 })], { probes });
    expect(r.map((x) => x.samples)).toEqual([2, 1]);
  });

  it('a point label change closes a burst, even within the window', () => {
    const a = createBurstAssembler({ probes });
    expect(a.push(s({ point: 'A1', timeMs: 0 }))).toBeNull();
    const closed = a.push(s({ point: 'A2', timeMs: 100 }));
    expect(closed?.point).toBe('A1');
    const rest = a.flush();
    expect(rest.map((x) => x.point)).toEqual(['A2']);
  });

  it('interleaved probes keep one open burst each', () => {
    const r = assembleBursts(
      [
        s({ probe: 'P1', point: 'A1', gainCode: 3, counts: 65535, timeMs: 0 }),
        s({ probe: 'P2', point: 'OUT', gainCode: 0, counts: 20040, timeMs: 100 }),
        s({ probe: 'P1', point: 'A1', gainCode: 2, counts: 10045 + 5, timeMs: 200 }),
        s({ probe: 'P2', point: 'OUT', gainCode: 0, counts: 20040, timeMs: 5100 }),
        s({ probe: 'P1', point: 'A2', gainCode: 2, counts: 5050, timeMs: 300 }),
      ],
      { probes },
    );
    expect(r.map((x) => `${x.probe}:${x.point}:${x.samples}`)).toEqual(['P1:A1:2', 'P2:OUT:2', 'P1:A2:1']);
    expect(r[0].gainCode).toBe(2);
  });

  it('all saturated: over range, lower bound = saturation lux at the lowest gain sampled', () => {
    const [r] = assembleBursts([s({ gainCode: 2, counts: 65535 }), s({ gainCode: 1, counts: 65100, timeMs: 10 }), s({ gainCode: 0, counts: 65000, timeMs: 20 })], { probes });
    expect(r.flag).toBe('over_range');
    expect(r.luxBound).toBe('lower');
    expect(r.lux).toBeCloseTo((probe.saturationCounts - darkOf(0)) * LPC0, 9);
    expect(r.chosenSample).toBeNull();
    expect(r.gainCode).toBe(0);
    expect(r.rejected.every((x) => x.reason === 'saturated')).toBe(true);
  });

  it('all low signal: under range, upper bound = detection limit (floorCounts) at the highest gain sampled', () => {
    const [r] = assembleBursts([s({ gainCode: 1, counts: 50 }), s({ gainCode: 3, counts: darkOf(3) + 10, timeMs: 10 })], { probes });
    expect(r.flag).toBe('under_range');
    expect(r.luxBound).toBe('upper');
    expect(r.lux).toBeCloseTo(probe.floorCounts * lpcOf(3), 12);
    expect(r.gainCode).toBe(3);
  });

  it('each sample uses the set in force at its time; lapsed calibration is flagged', () => {
    const b = makeSet('B', 1000, { dueDate: 2000, gains: setA.gains.map((g) => ({ ...g, luxPerCount: g.luxPerCount * 2 })) });
    const [r1, r2] = assembleBursts([s({ point: 'A', timeMs: 999, counts: 1040 }), s({ point: 'B', timeMs: 2001, counts: 1040 })], { probes: { P1: { probe, sets: [setA, b] } } });
    expect(r1.coefficientSetId).toBe('A');
    expect(r1.lux).toBe(2000);
    expect(r2.coefficientSetId).toBe('B');
    expect(r2.lux).toBe(4000);
    expect(r2.flag).toBe('calibration_lapsed');
  });

  it('invalid samples go to onError with their index and are skipped', () => {
    const errs: [string, number][] = [];
    const r = assembleBursts([s({ counts: 1.5 }), s({ gainCode: 7 }), s({ probe: 'X' }), s({ intMs: 0 }), s({ timeMs: -10 }), s({ counts: 2040 })], {
      probes: { P1: { probe, sets: [makeSet('late', 0)] } },
      onError: (e, _s, i) => errs.push([e.code, i]),
    });
    expect(errs).toEqual([['counts_not_integer', 0], ['unknown_gain', 1], ['unknown_probe', 2], ['bad_integration_time', 3], ['no_coefficient_set', 4]]);
    expect(r).toHaveLength(1);
    expect(r[0].samples).toBe(1);
  });

  it('without onError an invalid sample throws a DecodeError', () => {
    const a = createBurstAssembler({ probes });
    expect(() => a.push(s({ counts: 70000 }))).toThrow(DecodeError);
  });

  it('property: a chosen sample is never saturated or low-signal, and is the highest usable gain', () => {
    const sample = fc.record({ gainCode: fc.integer({ min: 0, max: 3 }), counts: fc.oneof(fc.integer({ min: 0, max: 65535 }), fc.constantFrom(0, 239, 240, 64999, 65000, 65535)) });
    fc.assert(
      fc.property(fc.array(sample, { minLength: 1, maxLength: 6 }), (burst) => {
        const [r] = assembleBursts(burst.map((b, i) => s({ ...b, timeMs: i })), { probes });
        const usable = burst.map((b) => b.counts < probe.saturationCounts && b.counts - darkOf(b.gainCode) >= probe.floorCounts);
        if (r.chosenSample === null) {
          expect(usable.some(Boolean)).toBe(false);
          expect(r.luxBound).not.toBe('exact');
        } else {
          expect(usable[r.chosenSample]).toBe(true);
          const best = Math.max(...burst.filter((_, i) => usable[i]).map((b) => b.gainCode));
          expect(burst[r.chosenSample].gainCode).toBe(best);
          expect(r.luxBound).toBe('exact');
        }
      }),
    );
  });
});
