import Papa from 'papaparse';

/**
 * A cell a spreadsheet would run as a formula (OWASP "CSV injection"): text starting with
 * = + - @, a tab or a carriage return. Our own pattern rather than papaparse's default,
 * whose `^[=+\-@\t\r].*$` misses text that continues on a second line.
 */
export const FORMULA_START = /^[=+\-@\t\r]/;

/** One text value made safe for a spreadsheet: formula-like text gets a leading apostrophe. */
export function neutraliseCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}

/**
 * CSV text (RFC 4180 quoting by papaparse, CRLF line ends) with every text cell neutralised.
 * Numbers are written as numbers, so -3 stays a number; null and undefined become empty cells.
 */
export function toSafeCsv(header: readonly string[], rows: readonly (readonly unknown[])[]): string {
  return Papa.unparse(
    { fields: [...header], data: rows.map((r) => r.map((v) => (v === null || v === undefined ? '' : v))) },
    { newline: '\r\n', escapeFormulae: FORMULA_START },
  );
}

/** Rows only (no header), for a file written in pieces; same neutralising and quoting as toSafeCsv. */
export function toSafeCsvRows(rows: readonly (readonly unknown[])[]): string {
  return Papa.unparse(rows.map((r) => r.map((v) => (v === null || v === undefined ? '' : v))), { newline: '\r\n', escapeFormulae: FORMULA_START });
}
