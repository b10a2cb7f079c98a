/**
 * The one rounding rule for numbers shown to people (screens, reasons, the PDF): at least three
 * significant figures, whole numbers from 100 up, thousands grouped ("39,923", "16.5", "0.412").
 * Exports never use it: they carry full precision (shared/export-columns).
 */
export function formatDisplayNumber(value: number): string {
  if (!Number.isFinite(value)) return '–';
  // Decide the digits on the value rounded to 3 significant figures, so 9.99999 shows as 10.0.
  const abs = Math.abs(Number(value.toPrecision(3)));
  const digits = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : 3;
  return value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}
