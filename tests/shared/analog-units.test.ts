import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { classifyLoopCurrent, classifyVoltage, decodeAnalog, luxToCurrent, luxToVoltage, VOLTAGE_TOLERANCE_V } from '@shared/core/analog';
import { footcandlesToLux, LUX_PER_FOOTCANDLE, luxToFootcandles } from '@shared/core/units';
import type { AnalogProbe } from '@shared/core/types';

describe('units', () => {
  it('1 fc = 10.7639104167 lx (1 / 0.3048^2, exact by definition of the foot)', () => {
    expect(LUX_PER_FOOTCANDLE).toBeCloseTo(10.7639104167, 10); // DOMAIN.md 6
    expect(footcandlesToLux(30)).toBeCloseTo(322.917312501, 8); // OSHA 30 fc offices, converted by hand
    expect(luxToFootcandles(footcandlesToLux(5))).toBeCloseTo(5, 12);
  });
});

const loop: AnalogProbe = { kind: 'current_4_20', rangeLowLux: 0, rangeHighLux: 2000, scale: 'linear', accuracyPercent: 0.5 };
const logLoop: AnalogProbe = { kind: 'current_4_20', rangeLowLux: 1, rangeHighLux: 100000, scale: 'log10', accuracyPercent: 0.5 };
const volt: AnalogProbe = { kind: 'voltage_0_10', rangeLowLux: 0, rangeHighLux: 1000, scale: 'linear', accuracyPercent: 1 };
const at = (p: AnalogProbe, signal: number) => decodeAnalog(p, { probe: 'T', point: 'X', timeMs: 0, signal });

describe('NAMUR NE 43 (secondary sources; 3.6-3.8 and 20.5-21 mA are faults by this project\'s choice)', () => {
  it('boundaries at 3.6, 3.8, 4, 20, 20.5, 21 mA', () => {
    expect(classifyLoopCurrent(3.6)).toBe('fault'); // <= 3.6 mA: failure (NE 43)
    expect(classifyLoopCurrent(3.7)).toBe('fault'); // 3.6..3.8: disputed, fault here
    expect(classifyLoopCurrent(3.8)).toBe('under_range'); // 3.8 still carries a measurement (NE 43)
    expect(classifyLoopCurrent(3.99)).toBe('under_range');
    expect(classifyLoopCurrent(4)).toBe('measurement');
    expect(classifyLoopCurrent(20)).toBe('measurement');
    expect(classifyLoopCurrent(20.01)).toBe('over_range');
    expect(classifyLoopCurrent(20.5)).toBe('over_range'); // 20.5 still carries a measurement (NE 43)
    expect(classifyLoopCurrent(20.6)).toBe('fault'); // 20.5..21: disputed, fault here
    expect(classifyLoopCurrent(21)).toBe('fault'); // >= 21 mA: failure (NE 43)
    expect(classifyLoopCurrent(NaN)).toBe('fault');
  });

  it('decoded readings: value, clamped bounds, fault without value', () => {
    expect(at(loop, 12).lux).toBe(1000); // midpoint of 0..2000 lx: (12 - 4) / 16 * 2000
    const under = at(loop, 3.9);
    expect([under.flag, under.lux, under.luxBound]).toEqual(['under_range', 0, 'upper']);
    const over = at(loop, 20.3);
    expect([over.flag, over.lux, over.luxBound]).toEqual(['over_range', 2000, 'lower']);
    const f = at(loop, 2);
    expect([f.flag, f.lux]).toEqual(['fault', null]);
    expect(at(loop, 12).budget.map((b) => b.name)).toEqual(['transmitter']);
  });

  it('log10 scale: log10(E) is linear in the current', () => {
    expect(at(logLoop, 4).lux).toBeCloseTo(1, 9);
    expect(at(logLoop, 12).lux).toBeCloseTo(Math.sqrt(100000), 6); // half the span = half the decades
    expect(at(logLoop, 20).lux).toBeCloseTo(100000, 4);
  });
});

describe('0-10 V rule (project\'s own choice: +/-0.2 V tolerance band, beyond is a fault)', () => {
  it('boundaries', () => {
    expect(VOLTAGE_TOLERANCE_V).toBe(0.2);
    expect(classifyVoltage(-0.21)).toBe('fault');
    expect(classifyVoltage(-0.2)).toBe('under_range');
    expect(classifyVoltage(0)).toBe('measurement');
    expect(classifyVoltage(10)).toBe('measurement');
    expect(classifyVoltage(10.2)).toBe('over_range');
    expect(classifyVoltage(10.21)).toBe('fault');
    expect(at(volt, 2.5).lux).toBe(250); // 0 + 2.5 / 10 * 1000
  });
});

describe('properties: scaling inverts', () => {
  it('4-20 mA and 0-10 V, linear and log10', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (f) => {
        const eLin = f * 2000;
        expect(at(loop, luxToCurrent(loop, eLin)).lux).toBeCloseTo(eLin, 8);
        const eLog = 10 ** (5 * f);
        expect(at(logLoop, luxToCurrent(logLoop, eLog)).lux! / eLog).toBeCloseTo(1, 10);
        const eV = f * 1000;
        expect(at(volt, luxToVoltage(volt, eV)).lux).toBeCloseTo(eV, 8);
      }),
    );
  });
  it('signal -> lux -> signal', () => {
    fc.assert(
      fc.property(fc.double({ min: 4, max: 20, noNaN: true }), (mA) => {
        expect(luxToCurrent(loop, at(loop, mA).lux!)).toBeCloseTo(mA, 10);
        expect(luxToCurrent(logLoop, at(logLoop, mA).lux!)).toBeCloseTo(mA, 10);
      }),
    );
  });
  it('log10 range low must be above 0 lx', () => {
    expect(() => luxToCurrent({ ...logLoop, rangeLowLux: 0 }, 5)).toThrow(/above 0/);
  });
});
