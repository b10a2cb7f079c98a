/** Calendar dates (due dates) are shown in UTC, as they are entered: the same day everywhere. */
export function formatDueDate(iso: string | null | undefined): string {
  if (!iso) return '–';
  return new Date(iso).toLocaleDateString('en-GB', { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric' });
}

/** Instants (effective-from, approvals, uploads) in the viewer's own time zone. */
export function formatInstant(iso: string | null | undefined): string {
  if (!iso) return '–';
  return new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
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
