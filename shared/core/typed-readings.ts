// Readings typed from a meter that does not log: the value(s) shown on its display, and the
// meter's accuracy from its certificate or its class.
import { DecodeError } from './errors';
import { COVERAGE_K, combineBudget, expanded, rectangular } from './uncertainty';
import type { BudgetPart } from './types';

export const METER_CLASSES = ['L', 'A', 'B', 'C'] as const;
export type MeterClass = (typeof METER_CLASSES)[number];

/**
 * Total error limits of illuminance meter classes L, A, B, C: 3, 5, 10, 20 % (DIN 5032-7:1985, as
 * found in a secondary source; the 2017 edition replaced classes with a computed overall figure).
 */
export const METER_CLASS_LIMIT: Readonly<Record<MeterClass, number>> = { L: 0.03, A: 0.05, B: 0.1, C: 0.2 };

/** How sure a hand-held meter is: its certificate's relative uncertainty (k = 1), or its class. */
export type ManualMeterAccuracy = { kind: 'certificate'; uRel: number } | { kind: 'class'; meterClass: MeterClass };

export interface ManualMeter {
  accuracy: ManualMeterAccuracy;
  /** The display's range; a value outside it is refused (null: no limit given). */
  rangeLowLux: number | null;
  rangeHighLux: number | null;
}

/**
 * The meter's part of the budget, relative, k = 1. A class limit a is a bound with no known
 * distribution inside it: rectangular, u = a / sqrt(3) (GUM 4.3.7). A certificate's value is
 * already a standard uncertainty.
 */
export function manualMeterPart(accuracy: ManualMeterAccuracy): BudgetPart {
  if (accuracy.kind === 'class') return { name: 'meter_class', uRel: rectangular(METER_CLASS_LIMIT[accuracy.meterClass]) };
  if (!Number.isFinite(accuracy.uRel) || accuracy.uRel < 0) throw new DecodeError('bad_input', `The certificate's relative uncertainty must be a number of at least 0 (got ${accuracy.uRel})`);
  return { name: 'calibration', uRel: accuracy.uRel };
}

export interface TypedReading {
  /** Arithmetic mean of the values, lux. */
  lux: number;
  n: number;
  /** Experimental standard deviation of the values s (GUM 4.2.2), lux; null for one value. */
  spreadLux: number | null;
  budget: BudgetPart[];
  /** Combined relative standard uncertainty (k = 1). */
  uRel: number;
  /** Expanded uncertainty (k = 2), lux. */
  uLux: number;
}

/** Why a typed value is refused, or null when it is usable. */
export function typedValueProblem(value: number, meter: Pick<ManualMeter, 'rangeLowLux' | 'rangeHighLux'>): string | null {
  if (typeof value !== 'number' || !Number.isFinite(value)) return 'is not a number';
  if (value < 0) return 'is negative: illuminance cannot be below 0 lx';
  if (meter.rangeLowLux !== null && value < meter.rangeLowLux) return `is below the meter's range (from ${meter.rangeLowLux} lx)`;
  if (meter.rangeHighLux !== null && value > meter.rangeHighLux) return `is beyond the meter's range (up to ${meter.rangeHighLux} lx)`;
  return null;
}

/**
 * One point's reading from one or more typed values (lux): their mean, with the meter's part and,
 * for two or more values, the spread as the standard uncertainty of the mean s / sqrt(n)
 * (GUM 4.2.3, a Type A evaluation). Throws DecodeError naming the first bad value.
 */
export function typedReading(valuesLux: readonly number[], meter: ManualMeter): TypedReading {
  if (valuesLux.length === 0) throw new DecodeError('insufficient_data', 'Type at least one value');
  valuesLux.forEach((v, i) => {
    const problem = typedValueProblem(v, meter);
    if (problem) throw new DecodeError('bad_input', `Value ${i + 1} (${String(v)}) ${problem}`, { index: i, value: v });
  });
  const n = valuesLux.length;
  const mean = valuesLux.reduce((a, b) => a + b, 0) / n;
  const budget: BudgetPart[] = [manualMeterPart(meter.accuracy)];
  let spread: number | null = null;
  if (n >= 2) {
    let ss = 0;
    for (const v of valuesLux) ss += (v - mean) ** 2;
    spread = Math.sqrt(ss / (n - 1));
    budget.push({ name: 'repeatability', uRel: mean > 0 ? spread / Math.sqrt(n) / mean : 0 });
  }
  const uRel = combineBudget(budget);
  return { lux: mean, n, spreadLux: spread, budget, uRel, uLux: expanded(uRel * mean, COVERAGE_K) };
}
