import { DecodeError } from './errors';
import type { BudgetPart, CoefficientSet, CountingProbe } from './types';
import { combineBudget, countingBudget, DEFAULT_U_DARK_COUNTS } from './uncertainty';

/** Largest gain code the lookup tables index directly. */
export const MAX_GAIN_CODE = 65535;

/**
 * Per-gain lookup tables of one (probe, coefficient set) pair, indexed by slot.
 * slotOfCode[code] is the slot, or -1 for a code the probe or the set does not know.
 */
export interface CompiledCoefficients {
  readonly probe: CountingProbe;
  readonly set: CoefficientSet;
  readonly slotOfCode: Int32Array;
  readonly codes: Int32Array;
  readonly dark: Float64Array;
  readonly luxPerCount: Float64Array;
  readonly uRel: Float64Array;
  readonly uDark: Float64Array;
  readonly nominalGain: Float64Array;
}

export type SampleStatus = 'ok' | 'saturated' | 'low_signal';

export interface DecodedSample {
  gainCode: number;
  nominalGain: number;
  /** Lux the counts mean (also for a saturated or low-signal sample; it is then not a value). */
  lux: number;
  netCounts: number;
  status: SampleStatus;
  temperatureCorrected: boolean;
  /** Combined relative standard uncertainty (k = 1). */
  uRel: number;
  budget: BudgetPart[];
  coefficientSetId: string;
}

/** Builds the lookup tables; throws DecodeError('bad_probe') for unusable coefficients. */
export function compileCoefficients(probe: CountingProbe, set: CoefficientSet): CompiledCoefficients {
  if (!(set.tRefMs > 0)) throw new DecodeError('bad_probe', `Coefficient set ${set.id} has a non-positive reference integration time.`);
  let maxCode = -1;
  for (const g of probe.gains) {
    if (!Number.isInteger(g.code) || g.code < 0 || g.code > MAX_GAIN_CODE) {
      throw new DecodeError('bad_probe', `Gain code ${g.code} is not an integer in 0..${MAX_GAIN_CODE}.`);
    }
    if (!(g.nominalGain > 0)) throw new DecodeError('bad_probe', `Gain code ${g.code} has a non-positive nominal gain.`);
    maxCode = Math.max(maxCode, g.code);
  }
  const slotOfCode = new Int32Array(maxCode + 1).fill(-1);
  const rows = probe.gains
    .map((g) => ({ g, c: set.gains.find((c) => c.code === g.code) }))
    .filter((r) => r.c !== undefined);
  const n = rows.length;
  const codes = new Int32Array(n);
  const dark = new Float64Array(n);
  const luxPerCount = new Float64Array(n);
  const uRel = new Float64Array(n);
  const uDark = new Float64Array(n);
  const nominalGain = new Float64Array(n);
  rows.forEach(({ g, c }, i) => {
    if (!(c!.luxPerCount > 0) || !Number.isFinite(c!.darkCounts)) {
      throw new DecodeError('bad_probe', `Coefficient set ${set.id}, gain code ${g.code}: luxPerCount must be > 0 and darkCounts finite.`);
    }
    slotOfCode[g.code] = i;
    codes[i] = g.code;
    dark[i] = c!.darkCounts;
    luxPerCount[i] = c!.luxPerCount;
    uRel[i] = c!.uRel;
    uDark[i] = c!.uDarkCounts ?? DEFAULT_U_DARK_COUNTS;
    nominalGain[i] = g.nominalGain;
  });
  return { probe, set, slotOfCode, codes, dark, luxPerCount, uRel, uDark, nominalGain };
}

const compiledCache = new WeakMap<CoefficientSet, WeakMap<CountingProbe, CompiledCoefficients>>();

/** compileCoefficients with a cache keyed by the (set, probe) objects. */
export function compiledFor(probe: CountingProbe, set: CoefficientSet): CompiledCoefficients {
  let byProbe = compiledCache.get(set);
  if (!byProbe) {
    byProbe = new WeakMap();
    compiledCache.set(set, byProbe);
  }
  let c = byProbe.get(probe);
  if (!c) {
    c = compileCoefficients(probe, set);
    byProbe.set(probe, c);
  }
  return c;
}

/** Slot of a gain code, or -1. */
export function slotOf(comp: CompiledCoefficients, gainCode: number): number {
  return gainCode >= 0 && gainCode < comp.slotOfCode.length && Number.isInteger(gainCode) ? comp.slotOfCode[gainCode] : -1;
}

/**
 * Validates one sample's raw fields; returns the gain slot or throws DecodeError.
 * Counts must be an integer in 0..fullScaleCounts, intMs > 0, tempC finite.
 */
export function validateSample(comp: CompiledCoefficients, gainCode: number, counts: number, intMs: number | undefined, tempC: number | undefined): number {
  const slot = slotOf(comp, gainCode);
  if (slot < 0) throw new DecodeError('unknown_gain', `Gain code ${gainCode} is not known to this probe or its coefficient set ${comp.set.id}.`, { gainCode });
  if (!Number.isInteger(counts)) throw new DecodeError('counts_not_integer', `Counts ${counts} are not a whole number.`, { counts });
  if (counts < 0 || counts > comp.probe.fullScaleCounts) {
    throw new DecodeError('counts_out_of_range', `Counts ${counts} are outside 0..${comp.probe.fullScaleCounts}.`, { counts });
  }
  if (intMs !== undefined && !(intMs > 0 && intMs < Infinity)) {
    throw new DecodeError('bad_integration_time', `Integration time ${intMs} ms is not a positive number.`, { intMs });
  }
  if (tempC !== undefined) {
    if (!Number.isFinite(tempC)) throw new DecodeError('bad_temperature', `Temperature ${tempC} is not a number.`, { tempC });
    if (!(temperatureFactor(comp.set, tempC) > 0)) {
      throw new DecodeError('bad_temperature', `Temperature ${tempC} degC gives a non-positive correction factor.`, { tempC });
    }
  }
  return slot;
}

/** Temperature correction divisor 1 + alpha * (T - Tcal); 1 when T is unknown. */
export function temperatureFactor(set: CoefficientSet, tempC: number | undefined): number {
  return tempC === undefined ? 1 : 1 + set.alphaPerK * (tempC - set.tCalC);
}

/**
 * E = (C - dark[g]) * luxPerCount[g] * (tRef / t) / (1 + alpha * (T - Tcal))  (project decoding model, DOMAIN.md 2).
 * No validation: call validateSample first. t defaults to tRef; no T means no correction.
 */
export function luxFromCounts(comp: CompiledCoefficients, slot: number, counts: number, intMs: number | undefined, tempC: number | undefined): number {
  const set = comp.set;
  const tRatio = intMs === undefined ? 1 : set.tRefMs / intMs;
  const tf = tempC === undefined ? 1 : 1 + set.alphaPerK * (tempC - set.tCalC);
  return ((counts - comp.dark[slot]) * comp.luxPerCount[slot] * tRatio) / tf;
}

/** Saturated: C >= saturationCounts. Low signal: C - dark[g] < floorCounts (DOMAIN.md 2). */
export function sampleStatus(comp: CompiledCoefficients, slot: number, counts: number): SampleStatus {
  if (counts >= comp.probe.saturationCounts) return 'saturated';
  if (counts - comp.dark[slot] < comp.probe.floorCounts) return 'low_signal';
  return 'ok';
}

/** Budget of a sample at a given net count (see countingBudget). */
export function sampleBudget(comp: CompiledCoefficients, slot: number, netCounts: number, temperatureKnown: boolean): BudgetPart[] {
  return countingBudget({
    calibrationURel: comp.uRel[slot],
    netCounts,
    uDarkCounts: comp.uDark[slot],
    alphaPerK: comp.set.alphaPerK,
    temperatureKnown,
  });
}

/** Decodes one counting sample with the given coefficient set; throws DecodeError on invalid input. */
export function decodeCounts(
  probe: CountingProbe,
  set: CoefficientSet,
  sample: { gainCode: number; counts: number; intMs?: number; tempC?: number },
): DecodedSample {
  const comp = compiledFor(probe, set);
  const slot = validateSample(comp, sample.gainCode, sample.counts, sample.intMs, sample.tempC);
  const net = sample.counts - comp.dark[slot];
  const budget = sampleBudget(comp, slot, net, sample.tempC !== undefined);
  return {
    gainCode: sample.gainCode,
    nominalGain: comp.nominalGain[slot],
    lux: luxFromCounts(comp, slot, sample.counts, sample.intMs, sample.tempC),
    netCounts: net,
    status: sampleStatus(comp, slot, sample.counts),
    temperatureCorrected: sample.tempC !== undefined,
    uRel: combineBudget(budget),
    budget,
    coefficientSetId: set.id,
  };
}
