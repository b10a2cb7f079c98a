import { compiledFor, slotOf } from './decode-counts';
import { DecodeError } from './errors';
import type { CoefficientSet, CountingProbe } from './types';

/**
 * The counts a probe would report for an illuminance: the inverse of the decoding model
 * E = (C - dark[g]) * luxPerCount[g] * (tRef / t) / (1 + alpha * (T - Tcal)) (DOMAIN.md 2), i.e.
 * C = dark[g] + E * (1 + alpha * (T - Tcal)) * (t / tRef) / luxPerCount[g]. Unrounded and not
 * clipped to full scale: for simulated logs and tests, never for decoding.
 */
export function countsForLux(probe: CountingProbe, set: CoefficientSet, gainCode: number, lux: number, intMs?: number, tempC?: number): number {
  const comp = compiledFor(probe, set);
  const slot = slotOf(comp, gainCode);
  if (slot < 0) throw new DecodeError('unknown_gain', `Gain code ${gainCode} is not known to this probe or its coefficient set ${set.id}.`, { gainCode });
  const tRatio = intMs === undefined ? 1 : intMs / set.tRefMs;
  const tf = tempC === undefined ? 1 : 1 + set.alphaPerK * (tempC - set.tCalC);
  return comp.dark[slot] + (lux * tf * tRatio) / comp.luxPerCount[slot];
}
