import { max, min } from 'simple-statistics';
import { scaleDiverging, scaleSequentialLog } from 'd3-scale';
import { interpolateCividis, interpolatePuOr } from 'd3-scale-chromatic';
import { EN12464_SCALE_LUX } from '@shared/spatial/isolux';

/** Fault readings (no value) and readings without a colour. */
export const NO_VALUE_COLOUR = '#9aa1ab';

/**
 * Illuminance colours: cividis (perceptually uniform and designed for colour-vision deficiency)
 * on a log scale, because a survey spans decades. The domain is the readings' range, at least one decade.
 */
export function luxColourScale(values: readonly number[]) {
  const positive = values.filter((v) => v > 0 && Number.isFinite(v));
  let lo = positive.length ? min(positive) : 10;
  let hi = positive.length ? max(positive) : 1000;
  lo = Math.max(0.1, lo);
  if (hi / lo < 10) { const mid = Math.sqrt(hi * lo); lo = mid / Math.sqrt(10); hi = mid * Math.sqrt(10); }
  const scale = scaleSequentialLog(interpolateCividis).domain([lo, hi]).clamp(true);
  const ticks = EN12464_SCALE_LUX.filter((s) => s >= lo && s <= hi);
  return {
    domain: [lo, hi] as [number, number],
    colour: (lux: number | null) => (lux === null || !(lux > 0) ? (lux === 0 ? scale(lo) : NO_VALUE_COLOUR) : scale(lux)),
    /** Legend ticks: the EN 12464-1 steps in range (or the ends when fewer than two fall in it). */
    ticks: ticks.length >= 2 ? thin([...ticks]) : [lo, hi],
    /** Position of a value along the legend, 0 to 1 (log). */
    position: (lux: number) => Math.log(lux / lo) / Math.log(hi / lo),
    gradient: Array.from({ length: 11 }, (_, i) => interpolateCividis(i / 10)),
  };
}

/** Lux change colours: purple-orange diverging (colour-blind safe), symmetric about no change. */
export function differenceColourScale(deltas: readonly number[]) {
  const finite = deltas.filter(Number.isFinite).map(Math.abs);
  const m = Math.max(1, finite.length ? max(finite) : 0);
  const scale = scaleDiverging(interpolatePuOr).domain([m, 0, -m]);
  return { maxAbs: m, colour: (d: number | null) => (d === null ? NO_VALUE_COLOUR : scale(d)), gradient: Array.from({ length: 11 }, (_, i) => interpolatePuOr(1 - i / 10)) };
}

/** At most 6 legend ticks, keeping the ends, so labels do not overlap at phone width. */
function thin(ticks: number[]): number[] {
  if (ticks.length <= 6) return ticks;
  const step = Math.ceil((ticks.length - 1) / 5);
  const kept = ticks.filter((_, i) => i % step === 0);
  if (kept[kept.length - 1] !== ticks[ticks.length - 1]) kept.push(ticks[ticks.length - 1]);
  return kept;
}
