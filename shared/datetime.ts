/**
 * Luxtrail's one way of writing dates and times (screens, PDF, e-mail): "2 Dec 2026" and
 * "2 Dec 2026, 09:30 GMT", always in a named time zone (the site's, where there is a site) and
 * labelled with that zone's abbreviation or offset, so a time never silently changes with the viewer.
 */
export const DAY_MS = 86_400_000;

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string | undefined, kind: 'day' | 'minute' | 'second' | 'clock' | 'clockSeconds' | 'zone'): Intl.DateTimeFormat {
  const key = `${timeZone ?? ''}|${kind}`;
  let f = formatters.get(key);
  if (!f) {
    const day = { day: 'numeric', month: 'short', year: 'numeric' } as const;
    const time = { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' } as const;
    const byKind: Record<typeof kind, Intl.DateTimeFormatOptions> = {
      day, minute: { ...day, ...time }, second: { ...day, ...time, second: '2-digit' }, clock: time, clockSeconds: { ...time, second: '2-digit' }, zone: { timeZoneName: 'short' },
    };
    const options = byKind[kind];
    f = new Intl.DateTimeFormat('en-GB', { ...options, ...(timeZone ? { timeZone } : {}) });
    formatters.set(key, f);
  }
  return f;
}

type Instant = number | string | Date;
const ms = (t: Instant) => (typeof t === 'number' ? t : new Date(t).getTime());

/** The viewer's own zone (for instants with no site, such as audit events). */
export const viewerTimeZone = (): string => Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';

/** The zone's abbreviation or offset at that instant ("GMT", "BST", "CET", "GMT+1"). */
export function zoneLabel(t: Instant, timeZone?: string): string {
  const part = formatter(timeZone, 'zone').formatToParts(ms(t)).find((p) => p.type === 'timeZoneName');
  return part?.value ?? timeZone ?? '';
}

/** "2 Dec 2026" in the zone. */
export function formatDay(t: Instant, timeZone?: string): string {
  return formatter(timeZone, 'day').format(ms(t));
}

/** "2 Dec 2026, 09:30 GMT" (with seconds: "09:30:15 GMT"), labelled with the zone. */
export function formatDateTime(t: Instant, timeZone?: string, opts: { seconds?: boolean } = {}): string {
  return `${formatter(timeZone, opts.seconds ? 'second' : 'minute').format(ms(t))} ${zoneLabel(t, timeZone)}`;
}

/** "09:30" (or "09:30:15") in the zone, unlabelled: for chart axes and table cells whose heading names the zone. */
export function formatClock(t: Instant, timeZone?: string, opts: { seconds?: boolean } = {}): string {
  return formatter(timeZone, opts.seconds ? 'clockSeconds' : 'clock').format(ms(t));
}

/** A calendar day "YYYY-MM-DD" (no zone: the same day everywhere) as "2 Dec 2026". */
export function formatCalendarDay(day: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(day);
  return m ? formatDay(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])), 'UTC') : day;
}

/**
 * Whole calendar days from `from` to `to`, counted on UTC calendar dates (due dates are UTC
 * calendar days): 2 Dec to 14 Dec is 12 whatever the hours; negative when `to` is earlier.
 */
export function calendarDaysBetween(from: Instant, to: Instant): number {
  return Math.floor(ms(to) / DAY_MS) - Math.floor(ms(from) / DAY_MS);
}

/** The UTC offset (ms) of a zone at an instant. */
function offsetAt(ms: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' }).formatToParts(ms);
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  return Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second')) - Math.floor(ms / 1000) * 1000;
}

/** A wall-clock time typed for the site ("2026-11-18T19:00") as ISO 8601 with the site's offset then; '' for anything else. */
export function siteLocalToIso(local: string, timeZone: string): string {
  // Only "YYYY-MM-DDTHH:MM" (a datetime-local field): Date.parse reads much else leniently.
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(local)) return '';
  const asUtc = Date.parse(`${local}:00Z`);
  if (Number.isNaN(asUtc)) return '';
  let ms = asUtc - offsetAt(asUtc, timeZone);
  ms = asUtc - offsetAt(ms, timeZone);
  const off = offsetAt(ms, timeZone) / 60_000;
  const sign = off < 0 ? '-' : '+';
  const hh = String(Math.floor(Math.abs(off) / 60)).padStart(2, '0');
  const mm = String(Math.abs(off) % 60).padStart(2, '0');
  return `${new Date(ms + off * 60_000).toISOString().slice(0, 19)}${sign}${hh}:${mm}`;
}
