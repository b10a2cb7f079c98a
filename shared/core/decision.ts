import type { StatBound, ZoneStats } from './zone-stats';
import { formatDisplayNumber } from '../display-number';

export type AcceptanceRule = 'simple' | 'guarded';
export type VerdictKind = 'meets' | 'falls_short' | 'inconclusive';

export interface Target {
  emLux: number;
  u0Min?: number;
}

export interface Verdict {
  verdict: VerdictKind;
  rule: AcceptanceRule;
  /** The rule in words, for the report. */
  ruleText: string;
  reasons: string[];
}

export const RULE_TEXT: Record<AcceptanceRule, string> = {
  simple: 'Simple acceptance (ILAC-G8:2019): the measured value is compared with the limit as it is.',
  guarded: 'Guarded acceptance (ILAC-G8:2019), guard band w = U (k = 2): meets when value − U ≥ limit, falls short when value + U < limit, otherwise inconclusive.',
};

/**
 * Verdict of one lower limit. Exact value x, guard band w (0 under simple acceptance):
 * meets if x - w >= limit, falls short if x + w < limit, else inconclusive. A lower bound x (truth >= x)
 * can prove "meets" but never "falls short"; an upper bound (truth <= x) can prove only "falls short".
 */
export function judgeLowerLimit(x: number | null, bound: StatBound, w: number, limit: number): VerdictKind {
  if (x === null || bound === 'indeterminate') return 'inconclusive';
  const meets = x - w >= limit;
  const short = x + w < limit;
  if (bound === null) return meets ? 'meets' : short ? 'falls_short' : 'inconclusive';
  if (bound === 'lower') return meets ? 'meets' : 'inconclusive';
  return short ? 'falls_short' : 'inconclusive';
}

/**
 * Zone verdict against {emLux, u0Min}: Eavg against Em (guard band U = stats.uEavg under the guarded
 * rule), and, if u0Min is given, U0 against it (guard band stats.uU0). Falls short if any check falls
 * short; meets if all meet; otherwise inconclusive. Missing uncertainty under the guarded rule: inconclusive.
 * gridAdequate === false turns a "meets" into "inconclusive" (too few points to show it).
 */
export function decideZone(stats: ZoneStats, target: Target, rule: AcceptanceRule, options: { gridAdequate?: boolean } = {}): Verdict {
  const reasons: string[] = [];
  const checks: VerdictKind[] = [];
  // The display rule the screens use, so a reason and a table show the same figure.
  const fmt = formatDisplayNumber;
  const bw = (b: StatBound) => (b === 'lower' ? ' (a lower bound)' : b === 'upper' ? ' (an upper bound)' : '');

  const one = (name: string, x: number | null, bound: StatBound, u: number | null, limit: number, unit: string) => {
    if (rule === 'guarded' && u === null && x !== null) {
      reasons.push(`${name}: no uncertainty available for the guard band.`);
      checks.push('inconclusive');
      return;
    }
    const w = rule === 'guarded' ? (u as number) : 0;
    const v = judgeLowerLimit(x, bound, w, limit);
    checks.push(v);
    const shown = x === null ? 'not available' : `${fmt(x)}${unit}${bw(bound)}${rule === 'guarded' ? ` ± ${fmt(w)}${unit}` : ''}`;
    reasons.push(`${name} ${shown} against ${fmt(limit)}${unit}: ${v.replace('_', ' ')}.`);
  };

  if (stats.validPoints === 0) reasons.push('No valid points.');
  one('Eavg', stats.eavg, stats.bounded.eavg, stats.uEavg, target.emLux, ' lx');
  if (target.u0Min !== undefined) one('U0', stats.u0, stats.bounded.u0, stats.uU0, target.u0Min, '');

  let verdict: VerdictKind = checks.includes('falls_short') ? 'falls_short' : checks.every((c) => c === 'meets') ? 'meets' : 'inconclusive';
  if (verdict === 'meets' && options.gridAdequate === false) {
    verdict = 'inconclusive';
    reasons.push('Fewer points than the grid rule requires: compliance is not shown.');
  }
  return { verdict, rule, ruleText: RULE_TEXT[rule], reasons };
}
