// How a reading's uncertainty budget is stored in readings.budget: a compact JSON object with one
// short key per part, about half the bytes of the parts spelled out (1,000,000-row import: tens of
// MB less to write). Readers accept the earlier spelled-out array as well.
import type { BudgetPart, BudgetPartName } from '@shared/core/types';

const KEY_OF: Record<BudgetPartName, string> = { calibration: 'c', quantisation: 'q', dark_offset: 'd', temperature: 't', transmitter: 'x' };
const NAME_OF = Object.fromEntries(Object.entries(KEY_OF).map(([name, key]) => [key, name])) as Record<string, BudgetPartName>;

/** The budget as stored, e.g. {"c":0.02,"q":0.0001,"d":0.003,"t":0.004}; non-finite parts are left out. */
export function encodeBudget(parts: readonly BudgetPart[]): string {
  let out = '{';
  for (const p of parts) {
    if (!Number.isFinite(p.uRel)) continue;
    out += `${out.length > 1 ? ',' : ''}"${KEY_OF[p.name]}":${p.uRel}`;
  }
  return `${out}}`;
}

/** The parts of a stored budget (compact object, or the earlier [{name, uRel}] array); [] for anything else. */
export function decodeBudget(stored: unknown): BudgetPart[] {
  if (Array.isArray(stored)) {
    return stored.filter((p): p is BudgetPart => p !== null && typeof p === 'object' && typeof p.name === 'string' && typeof p.uRel === 'number');
  }
  if (stored === null || typeof stored !== 'object') return [];
  const out: BudgetPart[] = [];
  for (const [key, uRel] of Object.entries(stored as Record<string, unknown>)) {
    const name = NAME_OF[key];
    if (name !== undefined && typeof uRel === 'number') out.push({ name, uRel });
  }
  return out;
}
