// How a reading's uncertainty budget is stored in readings.budget: a compact JSON object with one
// short key per part, about half the bytes of the parts spelled out (1,000,000-row import: tens of
// MB less to write). Readers accept the earlier spelled-out array as well. The import's writer
// thread encodes budgets with it too (bundled into that thread, see import-runner.ts).
import { BUDGET_PART_NAMES, type BudgetPart, type BudgetPartName } from '@shared/core/types';

/** The parts a budget can have, in the order the measurement core lists them (the shared list). */
export const BUDGET_PARTS = BUDGET_PART_NAMES;
/** The stored key of each part: append only, stored budgets keep them. */
const KEY_OF: Record<BudgetPartName, string> = { calibration: 'c', quantisation: 'q', dark_offset: 'd', temperature: 't', transmitter: 'x', meter_class: 'm', repeatability: 'r' };
const KEYS = BUDGET_PARTS.map((name) => KEY_OF[name]);
const NAME_OF = new Map(BUDGET_PARTS.map((name) => [KEY_OF[name], name]));

/** The budget as stored, e.g. {"c":0.02,"q":0.0001,"d":0.003,"t":0.004}; non-finite parts are left out. */
export function encodeBudget(parts: readonly BudgetPart[]): string {
  const slots = BUDGET_PARTS.map(() => NaN);
  for (const p of parts) {
    const i = BUDGET_PARTS.indexOf(p.name as BudgetPartName);
    if (i >= 0) slots[i] = p.uRel;
  }
  return encodeBudgetSlots(slots, 0);
}

/**
 * The stored text from the parts' uRel at values[offset + i] for BUDGET_PARTS[i] (NaN: no such
 * part), in that order: how the writer thread stores a reading a batch carries as numbers.
 */
export function encodeBudgetSlots(values: ArrayLike<number>, offset: number): string {
  let out = '{';
  for (let i = 0; i < KEYS.length; i++) {
    const u = values[offset + i];
    if (!Number.isFinite(u)) continue;
    out += `${out.length > 1 ? ',' : ''}"${KEYS[i]}":${u}`;
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
  for (const [key, uRel] of Object.entries(stored)) {
    const name = NAME_OF.get(key);
    if (name !== undefined && typeof uRel === 'number') out.push({ name, uRel });
  }
  return out;
}
