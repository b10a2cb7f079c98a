import { min } from 'simple-statistics';
// ISO 8601 timestamps of a survey log; a time without an offset is read in the site's time zone.

const ISO = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?\s*(Z|z|[+-]\d{2}(?::?\d{2})?)?$/;

/**
 * Offset of a time zone from UTC at an instant, in ms, from the runtime's IANA database
 * (Intl). Cached per quarter hour: every offset in use today is a multiple of 15 minutes.
 */
export function createZoneOffset(timeZone: string): (utcMs: number) => number {
  const format = new Intl.DateTimeFormat('en-GB', {
    timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit',
  });
  const cache = new Map<number, number>();
  return (utcMs) => {
    const key = Math.floor(utcMs / 900_000);
    let off = cache.get(key);
    if (off === undefined) {
      const at = key * 900_000;
      const p: Record<string, number> = {};
      for (const part of format.formatToParts(at)) if (part.type !== 'literal') p[part.type] = Number(part.value);
      off = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second) - at;
      cache.set(key, off);
    }
    return off;
  };
}

/**
 * Parses a log timestamp to epoch ms, or null when it is not ISO 8601 (date, T or space, time
 * to the minute at least). Without an offset the wall time is the site's: in the hour skipped
 * by a clock change it is read with the offset before the change; in the repeated hour, as the
 * first (earlier) of the two instants.
 */
export function createTimestampParser(timeZone: string): (text: string) => number | null {
  const offsetAt = createZoneOffset(timeZone);
  let lastDay = '';
  let lastDayMs = 0;
  const digits = (t: string, i: number, n: number) => {
    let v = 0;
    for (let k = i; k < i + n; k++) {
      const c = t.charCodeAt(k) - 48;
      if (c < 0 || c > 9) return -1;
      v = v * 10 + c;
    }
    return v;
  };
  return (text) => {
    // Fast path for the common YYYY-MM-DDTHH:MM:SS[.sss]Z: the day's epoch is cached.
    if (text.length === 20 || text.length === 24) {
      const last = text.charCodeAt(text.length - 1);
      if (last === 90 && text.charCodeAt(10) === 84 && text.charCodeAt(13) === 58 && text.charCodeAt(16) === 58 && (text.length === 20 || text.charCodeAt(19) === 46)) {
        let sameDay = lastDay !== '' && text.startsWith(lastDay);
        if (!sameDay) {
          const y = digits(text, 0, 4), mo = digits(text, 5, 2), d = digits(text, 8, 2);
          if (y >= 0 && mo >= 1 && mo <= 12 && d >= 1 && text.charCodeAt(4) === 45 && text.charCodeAt(7) === 45) {
            const ms = Date.UTC(y, mo - 1, d);
            if (new Date(ms).getUTCDate() === d) {
              lastDay = text.slice(0, 11);
              lastDayMs = ms;
              sameDay = true;
            }
          }
        }
        if (sameDay) {
          const h = digits(text, 11, 2), mi = digits(text, 14, 2), sec = digits(text, 17, 2), frac = text.length === 24 ? digits(text, 20, 3) : 0;
          if (h >= 0 && h <= 23 && mi >= 0 && mi <= 59 && sec >= 0 && sec <= 59 && frac >= 0) return lastDayMs + h * 3600_000 + mi * 60_000 + sec * 1000 + frac;
        }
      }
    }
    const m = ISO.exec(text);
    if (m === null) return null;
    const [, y, mo, d, h, mi, s, frac, zone] = m;
    const year = +y, month = +mo, day = +d, hour = +h, minute = +mi, second = s === undefined ? 0 : +s;
    if (month < 1 || month > 12 || day < 1 || hour > 23 || minute > 59 || second > 59) return null;
    const ms = frac === undefined ? 0 : Math.floor(Number(`0.${frac}`) * 1000);
    const wall = Date.UTC(year, month - 1, day, hour, minute, second, ms);
    if (new Date(wall).getUTCDate() !== day) return null; // 31 April and the like
    if (zone !== undefined) {
      if (zone === 'Z' || zone === 'z') return wall;
      const sign = zone[0] === '-' ? -1 : 1;
      const digits = zone.slice(1).replace(':', '');
      const oh = +digits.slice(0, 2), om = digits.length > 2 ? +digits.slice(2) : 0;
      if (oh > 18 || om > 59) return null;
      return wall - sign * (oh * 3600_000 + om * 60_000);
    }
    // Offsets a day either side bracket any clock change; a candidate fits if its own offset gives it back.
    const before = wall - offsetAt(wall - 86_400_000);
    const after = wall - offsetAt(wall + 86_400_000);
    const fits = [before, after].filter((c) => wall - offsetAt(c) === c);
    return fits.length > 0 ? min(fits) : before;
  };
}
