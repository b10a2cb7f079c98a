// How a reading's uncertainty budget is stored in readings.budget: a compact JSON object with one
// short key per part, about half the bytes of the parts spelled out (1,000,000-row import: tens of
// MB less to write). Readers accept the earlier spelled-out array as well. Plain JavaScript so the
// import's writer thread encodes budgets too; types in stored-budget.d.mts.

/** The parts a budget can have, in the order the measurement core lists them. */
export const BUDGET_PARTS = ['calibration', 'quantisation', 'dark_offset', 'temperature', 'transmitter', 'meter_class', 'repeatability'];
const KEYS = ['c', 'q', 'd', 't', 'x', 'm', 'r'];
const NAME_OF = Object.fromEntries(BUDGET_PARTS.map((name, i) => [KEYS[i], name]));

/** The budget as stored, e.g. {"c":0.02,"q":0.0001,"d":0.003,"t":0.004}; non-finite parts are left out. */
export function encodeBudget(parts) {
  const slots = BUDGET_PARTS.map(() => NaN);
  for (const p of parts) {
    const i = BUDGET_PARTS.indexOf(p.name);
    if (i >= 0) slots[i] = p.uRel;
  }
  return encodeBudgetSlots(slots, 0);
}

/**
 * The stored text from the parts' uRel at values[offset + i] for BUDGET_PARTS[i] (NaN: no such
 * part), in that order: how the writer thread stores a reading a batch carries as numbers.
 */
export function encodeBudgetSlots(values, offset) {
  let out = '{';
  for (let i = 0; i < KEYS.length; i++) {
    const u = values[offset + i];
    if (!Number.isFinite(u)) continue;
    out += `${out.length > 1 ? ',' : ''}"${KEYS[i]}":${u}`;
  }
  return `${out}}`;
}

/** The parts of a stored budget (compact object, or the earlier [{name, uRel}] array); [] for anything else. */
export function decodeBudget(stored) {
  if (Array.isArray(stored)) {
    return stored.filter((p) => p !== null && typeof p === 'object' && typeof p.name === 'string' && typeof p.uRel === 'number');
  }
  if (stored === null || typeof stored !== 'object') return [];
  const out = [];
  for (const [key, uRel] of Object.entries(stored)) {
    const name = NAME_OF[key];
    if (name !== undefined && typeof uRel === 'number') out.push({ name, uRel });
  }
  return out;
}
