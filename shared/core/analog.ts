import { DecodeError } from './errors';
import type { AnalogProbe, Reading, ReadingFlag } from './types';
import { combineBudget, COVERAGE_K, rectangular } from './uncertainty';

/**
 * NAMUR NE 43 signal levels, mA (found in secondary sources): 3.8..20.5 carries a measurement,
 * 3.8..4 under range, 20..20.5 over range, <= 3.6 or >= 21 failure. Sources disagree about
 * 3.6..3.8 and 20.5..21: this project treats them as faults too.
 */
export const NE43 = { failLowMa: 3.6, measureLowMa: 3.8, rangeLowMa: 4, rangeHighMa: 20, measureHighMa: 20.5, failHighMa: 21 } as const;

/**
 * 0-10 V has no live zero and no standard failure band (IEC 60381-2 defines only the range, from memory).
 * Project's own choice, by analogy with NE 43: up to 0.2 V (2 % of span) outside 0..10 V is under/over
 * range clamped to the range ends; anything beyond is a fault. Note: 0 V cannot tell a broken wire from range low.
 */
export const VOLTAGE_TOLERANCE_V = 0.2;

export type SignalClass = 'measurement' | 'under_range' | 'over_range' | 'fault';

/** NE 43 classification of a loop current (see NE43). Boundaries: 3.8 and 20.5 carry a value; 3.6 and 21 are failures. */
export function classifyLoopCurrent(mA: number): SignalClass {
  if (!Number.isFinite(mA)) return 'fault';
  if (mA < NE43.measureLowMa || mA > NE43.measureHighMa) return 'fault';
  if (mA < NE43.rangeLowMa) return 'under_range';
  if (mA > NE43.rangeHighMa) return 'over_range';
  return 'measurement';
}

/** Project rule for 0-10 V (see VOLTAGE_TOLERANCE_V). */
export function classifyVoltage(v: number): SignalClass {
  if (!Number.isFinite(v)) return 'fault';
  if (v < -VOLTAGE_TOLERANCE_V || v > 10 + VOLTAGE_TOLERANCE_V) return 'fault';
  if (v < 0) return 'under_range';
  if (v > 10) return 'over_range';
  return 'measurement';
}

function checkProbe(p: AnalogProbe): void {
  if (!(p.rangeHighLux > p.rangeLowLux) || !Number.isFinite(p.rangeLowLux) || !Number.isFinite(p.rangeHighLux)) {
    throw new DecodeError('bad_probe', `Analog range ${p.rangeLowLux}..${p.rangeHighLux} lx is not increasing.`);
  }
  if (p.scale === 'log10' && !(p.rangeLowLux > 0)) throw new DecodeError('bad_probe', 'A log10 scale needs a range low above 0 lx.');
}

/** Fraction f of the span (0 at 4 mA / 0 V, 1 at 20 mA / 10 V). */
function signalFraction(p: AnalogProbe, signal: number): number {
  return p.kind === 'current_4_20' ? (signal - 4) / 16 : signal / 10;
}

/**
 * Lux at span fraction f: linear E = low + f (high - low) (DOMAIN.md 2);
 * log10 E = log10 low + f (log10 high - log10 low).
 */
export function luxAtFraction(p: AnalogProbe, f: number): number {
  if (p.scale === 'linear') return p.rangeLowLux + f * (p.rangeHighLux - p.rangeLowLux);
  const a = Math.log10(p.rangeLowLux);
  return 10 ** (a + f * (Math.log10(p.rangeHighLux) - a));
}

/** Inverse of luxAtFraction. */
export function fractionAtLux(p: AnalogProbe, lux: number): number {
  if (p.scale === 'linear') return (lux - p.rangeLowLux) / (p.rangeHighLux - p.rangeLowLux);
  const a = Math.log10(p.rangeLowLux);
  return (Math.log10(lux) - a) / (Math.log10(p.rangeHighLux) - a);
}

/** Lux -> loop current, mA: I = 4 + 16 f (inverse of the 4-20 mA scaling; for tests and demo data). */
export function luxToCurrent(p: AnalogProbe, lux: number): number {
  checkProbe(p);
  if (p.scale === 'log10' && !(lux > 0)) throw new DecodeError('bad_input', 'A log10 scale has no signal for 0 lx or less.');
  return 4 + 16 * fractionAtLux(p, lux);
}

/** Lux -> voltage, V: V = 10 f (inverse of the 0-10 V scaling). */
export function luxToVoltage(p: AnalogProbe, lux: number): number {
  checkProbe(p);
  if (p.scale === 'log10' && !(lux > 0)) throw new DecodeError('bad_input', 'A log10 scale has no signal for 0 lx or less.');
  return 10 * fractionAtLux(p, lux);
}

/** Lux -> the probe's own signal (mA or V). */
export function luxToSignal(p: AnalogProbe, lux: number): number {
  return p.kind === 'current_4_20' ? luxToCurrent(p, lux) : luxToVoltage(p, lux);
}

export interface AnalogSample {
  probe: string;
  point: string;
  timeMs: number;
  /** mA for current_4_20, V for voltage_0_10. */
  signal: number;
}

/**
 * Decodes one analog sample into a Reading. Fault: lux null. Under/over range: clamped to the range
 * end as an upper/lower bound. Budget: transmitter accuracy (rectangular, percent of span),
 * u(E)/E = u_f (high - low) / E linear, u_f ln(10) (log10 high - log10 low) for log10; optional calibration uRel.
 */
export function decodeAnalog(p: AnalogProbe, s: AnalogSample, calibrationURel = 0): Reading {
  checkProbe(p);
  const cls = p.kind === 'current_4_20' ? classifyLoopCurrent(s.signal) : classifyVoltage(s.signal);
  const base = { probe: s.probe, point: s.point, timeMs: s.timeMs, gainCode: null, samples: 1, rejected: [], coefficientSetId: null };
  if (cls === 'fault') {
    return { ...base, lux: null, luxBound: 'exact', flag: 'fault', flags: ['fault'], chosenSample: null, uRel: 0, uLux: 0, budget: [] };
  }
  const f = cls === 'under_range' ? 0 : cls === 'over_range' ? 1 : signalFraction(p, s.signal);
  const lux = luxAtFraction(p, f);
  const uF = rectangular(p.accuracyPercent / 100);
  const uTx = p.scale === 'linear' ? (lux > 0 ? (uF * (p.rangeHighLux - p.rangeLowLux)) / lux : 0) : uF * Math.LN10 * (Math.log10(p.rangeHighLux) - Math.log10(p.rangeLowLux));
  const budget = [
    ...(calibrationURel > 0 ? [{ name: 'calibration' as const, uRel: calibrationURel }] : []),
    { name: 'transmitter' as const, uRel: uTx },
  ];
  const uRel = combineBudget(budget);
  // At 0 lx a relative figure is undefined: uLux then carries the transmitter's absolute part alone.
  const uAbsTx = p.scale === 'linear' ? uF * (p.rangeHighLux - p.rangeLowLux) : uTx * lux;
  const uLux = lux > 0 ? COVERAGE_K * uRel * lux : COVERAGE_K * uAbsTx;
  const flag: ReadingFlag = cls === 'measurement' ? 'ok' : cls;
  return {
    ...base,
    lux,
    luxBound: cls === 'under_range' ? 'upper' : cls === 'over_range' ? 'lower' : 'exact',
    flag,
    flags: [flag],
    chosenSample: 0,
    uRel,
    uLux,
    budget,
  };
}
