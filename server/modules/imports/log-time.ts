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
  return (text) => {
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
    return fits.length > 0 ? Math.min(...fits) : before;
  };
}
