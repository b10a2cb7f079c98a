import type { LuxBound } from './types';

/** Refuse a pairing when the bracketing outdoor samples are further apart than this (project's own choice). */
export const MAX_REFERENCE_GAP_MS = 120_000;

/** Warn when the outdoor level changes faster than this fraction per minute between the bracketing samples (project's own choice). */
export const MAX_OUTDOOR_CHANGE_PER_MINUTE = 0.1;

export interface OutdoorSample {
  timeMs: number;
  lux: number;
}

export interface OutdoorReference {
  times: Float64Array;
  lux: Float64Array;
}

/** Sorts and stores outdoor samples (only finite, positive lux) for repeated lookups. */
export function createOutdoorReference(samples: readonly OutdoorSample[]): OutdoorReference {
  const s = samples.filter((x) => Number.isFinite(x.timeMs) && Number.isFinite(x.lux) && x.lux > 0).sort((a, b) => a.timeMs - b.timeMs);
  return { times: Float64Array.from(s, (x) => x.timeMs), lux: Float64Array.from(s, (x) => x.lux) };
}

export type OutdoorLookup =
  | { ok: true; lux: number; gapMs: number; changePerMinute: number; warning: string | null }
  | { ok: false; reason: string };

/**
 * Outdoor level at timeMs by linear interpolation between the bracketing samples; refused outside the
 * reference or when the bracket is wider than maxGapMs. Warns if |Eo2 - Eo1| / min(Eo1, Eo2) per minute exceeds the limit.
 */
export function outdoorAt(ref: OutdoorReference, timeMs: number, maxGapMs = MAX_REFERENCE_GAP_MS, maxChangePerMinute = MAX_OUTDOOR_CHANGE_PER_MINUTE): OutdoorLookup {
  const t = ref.times;
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid] <= timeMs) lo = mid + 1;
    else hi = mid;
  }
  const i = lo - 1; // last sample at or before timeMs
  if (i >= 0 && t[i] === timeMs) return { ok: true, lux: ref.lux[i], gapMs: 0, changePerMinute: 0, warning: null };
  if (i < 0 || i + 1 >= t.length) return { ok: false, reason: 'No outdoor reference sample on both sides of this time.' };
  const gap = t[i + 1] - t[i];
  if (gap > maxGapMs) return { ok: false, reason: `Outdoor reference samples are ${Math.round(gap / 1000)} s apart (limit ${maxGapMs / 1000} s).` };
  const e1 = ref.lux[i];
  const e2 = ref.lux[i + 1];
  const lux = e1 + ((e2 - e1) * (timeMs - t[i])) / gap;
  const changePerMinute = Math.abs(e2 - e1) / Math.min(e1, e2) / (gap / 60_000);
  const warning = changePerMinute > maxChangePerMinute
    ? `Outdoor level changed ${(changePerMinute * 100).toFixed(0)} % per minute around this reading (limit ${maxChangePerMinute * 100} %): the daylight factor is unreliable.`
    : null;
  return { ok: true, lux, gapMs: gap, changePerMinute, warning };
}

/** DF = Ei / Eo * 100 % (CIE ILV 17-279; Eo under an overcast sky). */
export function daylightFactor(indoorLux: number, outdoorLux: number): number {
  return (indoorLux / outdoorLux) * 100;
}

export type DaylightPair =
  | { ok: true; point: string; timeMs: number; indoorLux: number; outdoorLux: number; dfPercent: number; bound: LuxBound; warning: string | null }
  | { ok: false; point: string; timeMs: number; reason: string };

/** Pairs indoor readings with the outdoor reference in time and gives DF; a bounded indoor value gives a bounded DF. */
export function pairDaylight(
  indoor: readonly { point: string; timeMs: number; lux: number | null; luxBound: LuxBound }[],
  ref: OutdoorReference,
  options: { maxGapMs?: number; maxChangePerMinute?: number } = {},
): DaylightPair[] {
  return indoor.map((r) => {
    if (r.lux === null) return { ok: false, point: r.point, timeMs: r.timeMs, reason: 'Indoor reading is a fault.' };
    const o = outdoorAt(ref, r.timeMs, options.maxGapMs, options.maxChangePerMinute);
    if (!o.ok) return { ok: false, point: r.point, timeMs: r.timeMs, reason: o.reason };
    return { ok: true, point: r.point, timeMs: r.timeMs, indoorLux: r.lux, outdoorLux: o.lux, dfPercent: daylightFactor(r.lux, o.lux), bound: r.luxBound, warning: o.warning };
  });
}
