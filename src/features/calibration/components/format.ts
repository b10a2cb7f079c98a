import { formatDateTime, formatDay } from '@shared/datetime';

/** Calendar dates (due dates) are shown in UTC, as they are entered: the same day everywhere (shared/datetime). */
export function formatDueDate(iso: string | null | undefined): string {
  return iso ? formatDay(iso, 'UTC') : '–';
}

/** Instants (effective-from, approvals, uploads) belong to no site: the viewer's own zone, labelled (shared/datetime). */
export function formatInstant(iso: string | null | undefined): string {
  return iso ? formatDateTime(iso) : '–';
}

/** A date input's value (YYYY-MM-DD) as the end of that day, UTC: a set is valid through its due day. */
export const dueDateToIso = (day: string) => (day ? `${day}T23:59:59.999Z` : '');
/** A datetime-local input's value as an ISO instant. */
export const localToIso = (v: string) => (v ? new Date(v).toISOString() : '');
/** Now as a datetime-local value, for defaults. */
export function nowLocalInput(): string {
  const d = new Date();
  d.setSeconds(0, 0);
  return new Date(d.getTime() - d.getTimezoneOffset() * 60_000).toISOString().slice(0, 16);
}
/** A YYYY-MM-DD a number of days from today, for defaults. */
export const dayFromToday = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

export const percent = (fraction: number, digits = 2) => `${(fraction * 100).toFixed(digits)} %`;

/** Compact significant figures for coefficients (not illuminances). */
export const sig = (v: number, digits = 5) => (Number.isFinite(v) ? Number(v.toPrecision(digits)).toString() : '–');

/** Symmetric axis ticks at a 1-2-5 step around zero covering ±max, so the residual axis reads −50, −25, 0, 25, 50. */
export function symmetricTicks(max: number): number[] {
  if (!(max > 0)) return [-1, 0, 1];
  const raw = max / 2;
  const p = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw)!;
  const n = Math.ceil(max / step);
  return Array.from({ length: 2 * n + 1 }, (_, i) => (i - n) * step);
}
