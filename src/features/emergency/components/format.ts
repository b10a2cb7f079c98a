/** Calendar dates (YYYY-MM-DD, already in the site's calendar) in the app's one date format. */
export function formatCalendarDate(date: string | null): string {
  if (!date) return '–';
  return new Date(`${date}T12:00:00Z`).toLocaleDateString('en-GB', { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric' });
}

/** An instant in the site's time zone, in the app's date format. */
export function formatSiteTime(iso: string | null, timeZone: string): string {
  if (!iso) return '–';
  return new Date(iso).toLocaleString('en-GB', { timeZone, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** The UTC offset (ms) of a zone at an instant. */
function offsetAt(ms: number, timeZone: string): number {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' }).formatToParts(ms);
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  return Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second')) - Math.floor(ms / 1000) * 1000;
}

/** A wall-clock time typed for the site ("2026-11-18T19:00") as ISO 8601 with the site's offset then. */
export function siteLocalToIso(local: string, timeZone: string): string {
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

/** "x y; x y" in metres, as typed or drawn. */
export function parseCoordinates(text: string): [number, number][] | null {
  const pairs = text.split(/[;\n]+/).map((s) => s.trim()).filter(Boolean).map((s) => s.split(/[\s,]+/).map(Number));
  if (pairs.length === 0 || pairs.some((p) => p.length !== 2 || p.some((v) => !Number.isFinite(v)))) return null;
  return pairs as [number, number][];
}

export const coordinatesText = (pts: readonly [number, number][]) => pts.map(([x, y]) => `${x.toFixed(2)} ${y.toFixed(2)}`).join('; ');
