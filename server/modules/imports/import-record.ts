import type { SampleProblem } from './log-decoder';

export type ImportProblem = SampleProblem;
export type ImportWarning = { line: number | null; column: string | null; message: string };

/**
 * Bounds of what an import keeps about a file's problems (our own choices): whatever the file,
 * its record stays small enough to store and answer quickly. A 5 MB single-line file would
 * otherwise echo its line as a column name and again in every message.
 */
export const IMPORT_RECORD_LIMITS = {
  errors: 200,
  warnings: 200,
  /** A cell's value as quoted back: its first 100 characters. */
  valueChars: 100,
  /** A column name: its first 60 characters. */
  columnChars: 60,
  /** A message (which may quote the value again): its first 300 characters. */
  messageChars: 300,
  /** The errors and warnings together, as stored JSON (UTF-8). */
  recordBytes: 256 * 1024,
} as const;

const ELLIPSIS = '…';

/** The text cut to `max` characters (UTF-16 units, never splitting a surrogate pair), marked with an ellipsis. */
export function cutText(text: string, max: number): string {
  if (text.length <= max) return text;
  let end = max - 1;
  const last = text.charCodeAt(end - 1);
  if (last >= 0xd800 && last <= 0xdbff) end--;
  return text.slice(0, end) + ELLIPSIS;
}

export function cutProblem(p: ImportProblem): ImportProblem {
  const L = IMPORT_RECORD_LIMITS;
  return { line: p.line, column: cutText(p.column, L.columnChars), value: cutText(p.value, L.valueChars), message: cutText(p.message, L.messageChars) };
}

export function cutWarning(w: ImportWarning): ImportWarning {
  const L = IMPORT_RECORD_LIMITS;
  return { line: w.line, column: w.column === null ? null : cutText(w.column, L.columnChars), message: cutText(w.message, L.messageChars) };
}

/**
 * Collects problems as a file is read: keeps the first 200 of each kind, already cut, and counts
 * the rest, so memory stays bounded however many problems a file has.
 */
export function createProblemCollector() {
  const errors: ImportProblem[] = [];
  const warnings: ImportWarning[] = [];
  let errorCount = 0;
  let warningCount = 0;
  return {
    error(p: ImportProblem) {
      errorCount++;
      if (errors.length < IMPORT_RECORD_LIMITS.errors) errors.push(cutProblem(p));
    },
    warning(w: ImportWarning) {
      warningCount++;
      if (warnings.length < IMPORT_RECORD_LIMITS.warnings) warnings.push(cutWarning(w));
    },
    get errorCount() { return errorCount; },
    get warningCount() { return warningCount; },
    errors,
    warnings,
  };
}

const bytes = (v: unknown) => Buffer.byteLength(JSON.stringify(v), 'utf8');

/** How many entries from the start of a list fit in `budget` bytes (each entry plus its comma). */
function fitting(sizes: number[], budget: number): number {
  let used = 0;
  for (let i = 0; i < sizes.length; i++) {
    used += sizes[i];
    if (used > budget) return i;
  }
  return sizes.length;
}

/**
 * The errors and warnings as stored: at most 200 of each, each cut, and a last entry saying how
 * many more were found when some are not listed. If the whole would still exceed 256 KB (text
 * that JSON escapes to six bytes a character), each list gets half the room (and what the other
 * leaves), entries beyond it counted among the "more".
 */
export function boundImportRecord(input: { errors: ImportProblem[]; errorCount?: number; warnings: ImportWarning[]; warningCount?: number }): { errors: ImportProblem[]; warnings: ImportWarning[] } {
  const L = IMPORT_RECORD_LIMITS;
  const allErrors = input.errors.slice(0, L.errors).map(cutProblem);
  const allWarnings = input.warnings.slice(0, L.warnings).map(cutWarning);
  const errorTotal = Math.max(input.errorCount ?? input.errors.length, input.errors.length);
  const warningTotal = Math.max(input.warningCount ?? input.warnings.length, input.warnings.length);
  const build = (nErrors: number, nWarnings: number) => {
    const e: ImportProblem[] = allErrors.slice(0, nErrors);
    if (errorTotal > nErrors) e.push({ line: 0, column: '', value: '', message: `${errorTotal - nErrors} more problems were found and not listed` });
    const w: ImportWarning[] = allWarnings.slice(0, nWarnings);
    if (warningTotal > nWarnings) w.push({ line: null, column: null, message: `${warningTotal - nWarnings} more warnings were found and not listed` });
    return { errors: e, warnings: w };
  };
  const whole = build(allErrors.length, allWarnings.length);
  if (bytes(whole) <= L.recordBytes) return whole;
  // Room for the braces, keys and the two "more" notes.
  const room = L.recordBytes - 512;
  const errorSizes = allErrors.map((e) => bytes(e) + 1);
  const warningSizes = allWarnings.map((w) => bytes(w) + 1);
  let nErrors = fitting(errorSizes, room / 2);
  let nWarnings = fitting(warningSizes, room / 2);
  const usedBy = (sizes: number[], n: number) => sizes.slice(0, n).reduce((a, b) => a + b, 0);
  nErrors = fitting(errorSizes, room - usedBy(warningSizes, nWarnings));
  nWarnings = fitting(warningSizes, room - usedBy(errorSizes, nErrors));
  let record = build(nErrors, nWarnings);
  while (bytes(record) > L.recordBytes && (nErrors > 0 || nWarnings > 0)) {
    if (nWarnings >= nErrors) nWarnings--; else nErrors--;
    record = build(nErrors, nWarnings);
  }
  return record;
}
