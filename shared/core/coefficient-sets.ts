import type { CoefficientSet } from './types';

/** Picks the coefficient set in force at a time, over a pre-sorted list (binary search). */
export interface CoefficientSelector {
  readonly sets: readonly CoefficientSet[];
  select(timeMs: number): CoefficientSet | null;
}

function isApproved(s: CoefficientSet): boolean {
  return s.approved !== false;
}

/**
 * Selector over the approved sets: the latest set whose effectiveFrom <= timeMs
 * (a sample exactly at effectiveFrom uses the new set). Equal effectiveFrom: the later one in the input wins.
 */
export function createCoefficientSelector(sets: readonly CoefficientSet[]): CoefficientSelector {
  const sorted = sets
    .map((s, i) => ({ s, i }))
    .filter(({ s }) => isApproved(s))
    .sort((a, b) => a.s.effectiveFrom - b.s.effectiveFrom || a.i - b.i)
    .map(({ s }) => s);
  const from = Float64Array.from(sorted, (s) => s.effectiveFrom);
  return {
    sets: sorted,
    select(timeMs: number): CoefficientSet | null {
      // Last index with from[i] <= timeMs.
      let lo = 0;
      let hi = from.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (from[mid] <= timeMs) lo = mid + 1;
        else hi = mid;
      }
      return lo === 0 ? null : sorted[lo - 1];
    },
  };
}

const cache = new WeakMap<readonly CoefficientSet[], CoefficientSelector>();

/**
 * The latest approved set whose effectiveFrom is not after timeMs, or null.
 * Repeated calls with the same array reuse a cached sorted selector (do not mutate the array in between).
 */
export function selectCoefficientSet(sets: readonly CoefficientSet[], timeMs: number): CoefficientSet | null {
  let sel = cache.get(sets);
  if (!sel) {
    sel = createCoefficientSelector(sets);
    cache.set(sets, sel);
  }
  return sel.select(timeMs);
}

/** True when the set has a due date and timeMs is after it. */
export function isCalibrationLapsed(set: CoefficientSet, timeMs: number): boolean {
  return set.dueDate !== null && timeMs > set.dueDate;
}
