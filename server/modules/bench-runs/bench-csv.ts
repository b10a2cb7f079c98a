import Papa from 'papaparse';
import { BENCH_COLUMNS, BENCH_MAX_ROWS, BENCH_REQUIRED_COLUMNS, type BenchRowDto, type BenchRowError } from '@shared/schemas/bench-runs';

/** Error rows reported back at most (the count says how many there were in all). */
const MAX_REPORTED_ERRORS = 200;
/** A fit per gain code needs dof >= 1 (shared/core fitLine): three rows or more. */
const MIN_ROWS_PER_GAIN = 3;
/** Probe temperature accepted on a bench, degC (beyond this the row is surely mistyped). */
const TEMP_RANGE_C = [-40, 85] as const;

export type BenchProbeLimits = { gainCodes: number[]; saturationCounts: number; fullScaleCounts: number };
export type BenchParseResult = { rows: BenchRowDto[]; errors: BenchRowError[]; errorCount: number };

/**
 * Parses a bench CSV (`gain, reference_lux, counts, int_ms, temp_c`, header row first, columns in any
 * order, extra columns ignored, lines starting with # are comments) and checks every row against the probe.
 * Line numbers are 1-based lines of the file.
 */
export function parseBenchCsv(text: string, probe: BenchProbeLimits): BenchParseResult {
  const errors: BenchRowError[] = [];
  let errorCount = 0;
  const fail = (e: BenchRowError) => { errorCount++; if (errors.length < MAX_REPORTED_ERRORS) errors.push(e); };
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lineStarts = [0];
  for (let i = 0; i < body.length; i++) if (body.charCodeAt(i) === 10) lineStarts.push(i + 1);
  const lineAt = (offset: number) => {
    let lo = 0; let hi = lineStarts.length;
    while (lo < hi) { const mid = (lo + hi) >>> 1; if (lineStarts[mid] <= offset) lo = mid + 1; else hi = mid; }
    return lo;
  };

  const records: { line: number; cells: string[] }[] = [];
  let start = 0;
  Papa.parse<string[]>(body, {
    skipEmptyLines: false,
    step: (res) => {
      const line = lineAt(start);
      start = res.meta.cursor;
      for (const e of res.errors) fail({ line, column: null, value: null, message: `CSV syntax: ${e.message}` });
      const cells = res.data.map((c) => c.trim());
      if (cells.every((c) => c === '') || cells[0].startsWith('#')) return;
      records.push({ line, cells });
    },
  });
  if (records.length === 0) return { rows: [], errors: [{ line: 1, column: null, value: null, message: 'The file is empty: expected a header row and data rows' }], errorCount: 1 };

  const header = records[0].cells.map((c) => c.toLowerCase());
  const index: Partial<Record<(typeof BENCH_COLUMNS)[number], number>> = {};
  for (const col of BENCH_COLUMNS) {
    const at = header.indexOf(col);
    if (at >= 0) index[col] = at;
    if (header.indexOf(col) !== header.lastIndexOf(col)) fail({ line: records[0].line, column: col, value: null, message: `Column "${col}" appears twice in the header` });
  }
  const missing = BENCH_REQUIRED_COLUMNS.filter((c) => index[c] === undefined);
  if (missing.length) {
    fail({ line: records[0].line, column: missing.join(', '), value: null, message: `The header lacks ${missing.map((m) => `"${m}"`).join(', ')}; expected columns ${BENCH_COLUMNS.join(', ')}` });
    return { rows: [], errors, errorCount };
  }
  const data = records.slice(1);
  if (data.length === 0) fail({ line: records[0].line, column: null, value: null, message: 'The file has a header but no data rows' });
  if (data.length > BENCH_MAX_ROWS) {
    fail({ line: data[BENCH_MAX_ROWS].line, column: null, value: null, message: `Too many rows: at most ${BENCH_MAX_ROWS} per bench run` });
    return { rows: [], errors, errorCount };
  }

  const codes = new Set(probe.gainCodes);
  const rows: BenchRowDto[] = [];
  for (const { line, cells } of data) {
    const cell = (col: (typeof BENCH_COLUMNS)[number]) => (index[col] === undefined ? '' : cells[index[col]!] ?? '');
    let ok = true;
    const num = (col: (typeof BENCH_COLUMNS)[number], check: (v: number) => string | null, optional = false): number | null => {
      const raw = cell(col);
      if (raw === '') {
        if (optional) return null;
        ok = false; fail({ line, column: col, value: '', message: 'Missing value' }); return null;
      }
      const v = Number(raw);
      if (!Number.isFinite(v)) { ok = false; fail({ line, column: col, value: raw, message: 'Not a number (use a dot as the decimal separator)' }); return null; }
      const problem = check(v);
      if (problem) { ok = false; fail({ line, column: col, value: raw, message: problem }); return null; }
      return v;
    };
    const gain = num('gain', (v) => (!Number.isInteger(v) ? 'A gain code is a whole number'
      : !codes.has(v) ? `Gain code ${v} is not one of this probe's codes (${probe.gainCodes.join(', ')})` : null));
    const referenceLux = num('reference_lux', (v) => (v <= 0 ? 'The reference illuminance must be above 0 lx' : null));
    const counts = num('counts', (v) => (v < 0 ? 'Counts cannot be negative'
      : v > probe.fullScaleCounts ? `Counts exceed the ADC full scale (${probe.fullScaleCounts})`
        : v >= probe.saturationCounts ? `Counts are at or above saturation (${probe.saturationCounts}); a saturated point cannot be fitted, remove it` : null));
    const intMs = num('int_ms', (v) => (v <= 0 ? 'The integration time must be above 0 ms' : null));
    const tempC = num('temp_c', (v) => (v < TEMP_RANGE_C[0] || v > TEMP_RANGE_C[1] ? `Probe temperature outside ${TEMP_RANGE_C[0]}..${TEMP_RANGE_C[1]} degC` : null), true);
    if (ok) rows.push({ line, gain: gain!, referenceLux: referenceLux!, counts: counts!, intMs: intMs!, tempC });
  }

  if (errorCount === 0) {
    const byCode = new Map<number, BenchRowDto[]>();
    for (const r of rows) byCode.set(r.gain, [...(byCode.get(r.gain) ?? []), r]);
    for (const [code, list] of byCode) {
      const distinct = new Set(list.map((r) => r.referenceLux)).size;
      if (list.length < MIN_ROWS_PER_GAIN || distinct < 2) {
        fail({ line: list[0].line, column: 'gain', value: String(code), message: `Gain code ${code} has ${list.length} row(s) at ${distinct} distinct reference illuminance(s); a fit needs at least ${MIN_ROWS_PER_GAIN} rows at 2 or more` });
      }
    }
  }
  return { rows: errorCount ? [] : rows, errors, errorCount };
}
