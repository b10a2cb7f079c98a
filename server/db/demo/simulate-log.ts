import { max, min } from 'simple-statistics';
/**
 * Simulated survey logs in Luxtrail's log format, for the demo seed, the sample files in
 * public/samples/, tests and the ingest benchmark. Counts come from the demo probes'
 * coefficients through the inverse of the decoding model (shared/core countsForLux), so the
 * import decodes them back to the levels of library-layout.ts. Invented data throughout.
 */
import { countsForLux } from '../../../shared/core/counts-for-lux';
import { luxToCurrent } from '../../../shared/core/analog';
import { requiredGrid } from '../../../shared/core/zone-stats';
import type { AnalogProbe, CoefficientSet, CountingProbe } from '../../../shared/core/types';
import { DEMO_ANALOG_PROBE, DEMO_COUNTING_PROBES, type DemoCountingProbe } from './demo-probes';
import { DEMO_PLANS, DEMO_REFERENCE_POINT, type DemoZone } from './library-layout';
import { createZoneOffset } from '../../modules/imports/log-time';

export const LOG_HEADER = ['timestamp', 'probe', 'point', 'gain', 'counts', 'ma', 'x_m', 'y_m', 'plan', 'int_ms', 'temp_c', 'role', 'note'] as const;

export type SimRow = {
  timeMs: number;
  probe: string;
  point: string;
  gain?: number;
  counts?: number;
  ma?: number;
  xM?: number;
  yM?: number;
  /** The plan x_m, y_m refer to, by its name in Luxtrail. */
  plan?: string;
  intMs?: number;
  tempC?: number;
  role?: 'task' | 'reference';
  note?: string;
};

/** Deterministic pseudo-random numbers (an LCG), so a seed always gives the same log. */
export function seededRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32;
}

export type SimCountingProbe = { serial: string; probe: CountingProbe; set: CoefficientSet };

export function simProbe(p: DemoCountingProbe): SimCountingProbe {
  return {
    serial: p.serial,
    probe: { kind: 'counts', fullScaleCounts: p.fullScaleCounts, saturationCounts: p.saturationCounts, floorCounts: p.floorCounts, gains: p.gains },
    set: { id: p.certificateNumber, effectiveFrom: 0, dueDate: null, tRefMs: p.tRefMs, alphaPerK: p.alphaPerK, tCalC: p.tCalC, gains: p.coefficients },
  };
}

export const SIM_ANALOG: AnalogProbe = {
  kind: DEMO_ANALOG_PROBE.kind, rangeLowLux: DEMO_ANALOG_PROBE.rangeLowLux, rangeHighLux: DEMO_ANALOG_PROBE.rangeHighLux,
  scale: DEMO_ANALOG_PROBE.scale, accuracyPercent: DEMO_ANALOG_PROBE.accuracyPercent,
};

/**
 * An auto-ranging burst as a meter logs it: sample at the current gain; saturated, step the gain
 * down; below the floor, step it up; stop at a usable sample or at the end of the gain ladder.
 * Returns the samples and the gain code the meter is left at (it carries over to the next point).
 */
export function autoRangeBurst(p: SimCountingProbe, lux: number, startCode: number, rnd: () => number, intMs = 100, tempC = 21): { samples: { gain: number; counts: number }[]; endCode: number } {
  const codes = [...p.probe.gains].sort((a, b) => a.nominalGain - b.nominalGain).map((g) => g.code);
  let i = Math.max(0, codes.indexOf(startCode));
  const samples: { gain: number; counts: number }[] = [];
  let direction = 0;
  for (let k = 0; k < codes.length + 1; k++) {
    const code = codes[i];
    const exact = countsForLux(p.probe, p.set, code, lux, intMs, tempC);
    const counts = Math.min(p.probe.fullScaleCounts, Math.max(0, Math.round(exact + (rnd() - 0.5) * 6)));
    samples.push({ gain: code, counts });
    const dark = p.set.gains.find((g) => g.code === code)!.darkCounts;
    if (counts >= p.probe.saturationCounts && i > 0 && direction <= 0) { i--; direction = -1; continue; }
    if (counts - dark < p.probe.floorCounts && i < codes.length - 1 && direction >= 0) { i++; direction = 1; continue; }
    break;
  }
  return { samples, endCode: codes[i] };
}

function bbox(poly: [number, number][]) {
  const xs = poly.map((p) => p[0]);
  const ys = poly.map((p) => p[1]);
  return { x0: min(xs), y0: min(ys), x1: max(xs), y1: max(ys) };
}

function inside(poly: [number, number][], x: number, y: number) {
  const b = bbox(poly);
  return x >= b.x0 && x <= b.x1 && y >= b.y0 && y <= b.y1;
}

/** demoLevelLux at the centre, falling towards the walls by demoFalloff (quadratic in the distance to the edge). */
export function demoLevelAt(zone: DemoZone, x: number, y: number): number {
  const b = bbox(zone.polygon);
  const r = Math.max(Math.abs(x - (b.x0 + b.x1) / 2) / ((b.x1 - b.x0) / 2), Math.abs(y - (b.y0 + b.y1) / 2) / ((b.y1 - b.y0) / 2));
  return zone.demoLevelLux * (1 - zone.demoFalloff * Math.min(1, r) ** 2);
}

/** Grid points of a rectangular zone: the EN 12464-1 grid (shared/core requiredGrid), cell centres inside a 0.5 m wall band. */
export function gridPoints(zone: DemoZone, wallBandM = 0.5): { x: number; y: number }[] {
  const b = bbox(zone.polygon);
  const w = b.x1 - b.x0 - 2 * wallBandM;
  const h = b.y1 - b.y0 - 2 * wallBandM;
  const g = requiredGrid(w + 2 * wallBandM, h + 2 * wallBandM, wallBandM);
  const [nx, ny] = w >= h ? [g.pointsLong, g.pointsShort] : [g.pointsShort, g.pointsLong];
  const out: { x: number; y: number }[] = [];
  for (let j = 0; j < ny; j++) {
    // Walk in a serpentine, as a surveyor does.
    for (let k = 0; k < nx; k++) {
      const i = j % 2 === 0 ? k : nx - 1 - k;
      out.push({ x: b.x0 + wallBandM + ((i + 0.5) * w) / nx, y: b.y0 + wallBandM + ((j + 0.5) * h) / ny });
    }
  }
  return out;
}

export type DemoWalkOptions = {
  /** Start of the walk, epoch ms. */
  startMs: number;
  seed: number;
  /** Illuminance factor for the season (daylight share), 1 = the layout's levels. */
  levelFactor?: number;
  /** Outdoor overcast level at the roof reference, lux. */
  outdoorLux?: number;
};

const SHORT: Record<string, string> = { reading: 'RR', 'office-a': 'OA', 'office-b': 'OB', corridor: 'CO', toilets: 'WC', stairs: 'ST', store: 'BS', meeting: 'MR', carrels: 'SC', archive: 'AR', staff: 'SR', landing: 'LD', 'car-park': 'CP' };

/** Where the over-range burst is taken: under the glass entrance canopy, on the site plan, outside every zone. */
export const DEMO_CANOPY_POINT: [number, number] = [47, 14];

/**
 * The demo walk-through: grid points in each ground-floor and first-floor room (study tables
 * inside the reading room take their own level) and the car park, each row naming its plan, with
 * auto-ranging bursts from LX-4102 (rooms) and LX-4107 (corridor, stairs, toilets, store,
 * landing), saturated samples where the highest gain is too sensitive, one point in direct sun
 * under the glass entrance canopy (outside every zone, taken on the way in) that saturates even
 * at the lowest gain (over range), and the roof reference RF-20-07 logging 4-20 mA every minute as role=reference
 * while indoor points are taken.
 */
export function simulateDemoWalk(o: DemoWalkOptions): SimRow[] {
  const rnd = seededRandom(o.seed);
  const tripod = simProbe(DEMO_COUNTING_PROBES[0]);
  const handheld = simProbe(DEMO_COUNTING_PROBES[1]);
  const ground = DEMO_PLANS.find((p) => p.key === 'ground')!;
  const first = DEMO_PLANS.find((p) => p.key === 'first')!;
  const outdoor = DEMO_PLANS.find((p) => p.key === 'outdoor')!;
  const study = ground.zones.find((z) => z.key === 'study')!;
  const rows: SimRow[] = [];
  const gainOf = new Map<string, number>([[tripod.serial, 2], [handheld.serial, 2]]);
  let t = o.startMs;
  let nextReference = o.startMs;
  const outdoorLux = o.outdoorLux ?? 14000;
  const factor = o.levelFactor ?? 1;

  const reference = (until: number) => {
    while (nextReference <= until) {
      const lux = outdoorLux * (1 + 0.15 * Math.sin((nextReference - o.startMs) / 1_800_000)) * (0.97 + 0.06 * rnd());
      rows.push({ timeMs: nextReference, probe: DEMO_ANALOG_PROBE.serial, point: 'ROOF-REF', ma: Math.round(luxToCurrent(SIM_ANALOG, lux) * 1000) / 1000, xM: DEMO_REFERENCE_POINT[0], yM: DEMO_REFERENCE_POINT[1], plan: outdoor.name, role: 'reference' });
      nextReference += 60_000;
    }
  };

  const point = (plan: string, probe: SimCountingProbe, label: string, x: number, y: number, lux: number, outdoorPoint: boolean, note?: string) => {
    const tempC = outdoorPoint ? 8.5 + rnd() : 20.5 + rnd() * 1.5;
    // The tripod probe starts every point at its highest gain and steps down; the handheld keeps its last gain.
    const start = probe === tripod ? 3 : gainOf.get(probe.serial)!;
    const burst = autoRangeBurst(probe, lux, start, rnd, 100, tempC);
    gainOf.set(probe.serial, burst.endCode);
    if (!outdoorPoint) reference(t);
    for (const s of burst.samples) {
      rows.push({ timeMs: t, probe: probe.serial, point: label, gain: s.gain, counts: s.counts, xM: Math.round(x * 100) / 100, yM: Math.round(y * 100) / 100, plan, intMs: 100, tempC: Math.round(tempC * 10) / 10, role: 'task', note });
      t += 400;
    }
    t += 15_000 + Math.round(rnd() * 10_000);
  };

  const walkZone = (plan: string, zone: DemoZone, outdoorZone: boolean) => {
    const probe = ['corridor', 'stairs', 'toilets', 'store', 'landing'].includes(zone.key) ? handheld : tripod;
    gridPoints(zone).forEach((pt, n) => {
      const inStudy = zone.key === 'reading' && inside(study.polygon, pt.x, pt.y);
      const lux = demoLevelAt(inStudy ? study : zone, pt.x, pt.y) * (outdoorZone ? 1 : factor) * (0.96 + 0.08 * rnd());
      point(plan, probe, `${SHORT[zone.key] ?? zone.key.toUpperCase()}-${String(n + 1).padStart(2, '0')}`, pt.x, pt.y, lux, outdoorZone);
    });
    t += 120_000; // to the next room
  };

  // In through the entrance: sun on the glass canopy and its reflection, beyond the probe's lowest gain (over range).
  point(outdoor.name, tripod, 'EC-01', DEMO_CANOPY_POINT[0], DEMO_CANOPY_POINT[1], 175_000, true, 'Glass entrance canopy, direct sun and its reflection');
  t += 60_000;
  for (const z of ground.zones) if (z.kind === 'room') walkZone(ground.name, z, false);
  for (const z of first.zones) if (z.kind === 'room') walkZone(first.name, z, false);
  reference(t);
  t += 3 * 3600_000; // the car park after dusk
  walkZone(outdoor.name, outdoor.zones.find((z) => z.key === 'car-park')!, true);
  return rows;
}

function fmt(v: number | undefined): string {
  return v === undefined ? '' : String(v);
}

function csvText(v: string | undefined): string {
  if (v === undefined) return '';
  return /[",;\t\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** Formats epoch ms as ISO 8601 local time with the zone's offset, e.g. 2026-10-14T09:00:00+01:00. */
export function localIso(timeZone: string): (ms: number) => string {
  const offsetAt = createZoneOffset(timeZone);
  return (ms) => {
    const off = offsetAt(ms);
    const local = new Date(ms + off).toISOString().slice(0, 19);
    const m = Math.abs(off) / 60_000;
    return `${local}${off < 0 ? '-' : '+'}${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
  };
}

/** The rows as a log file (comma-separated, LF line ends). */
export function toLogCsv(rows: SimRow[], timeZone = 'UTC'): string {
  const time = localIso(timeZone);
  const lines = [LOG_HEADER.join(',')];
  for (const r of rows) {
    lines.push([time(r.timeMs), r.probe, csvText(r.point), fmt(r.gain), fmt(r.counts), fmt(r.ma), fmt(r.xM), fmt(r.yM), csvText(r.plan), fmt(r.intMs), fmt(r.tempC), r.role ?? 'task', csvText(r.note)].join(','));
  }
  return `${lines.join('\n')}\n`;
}

/**
 * A long log for the ingest benchmark: points at illuminances spread over six decades, two
 * counting probes, auto-ranging bursts (some saturate before a usable gain, some stay over
 * range). Yields CSV lines (header first) until `rows` sample rows; `plan` fills the plan column.
 */
export function* benchLogLines(rows: number, probes: [SimCountingProbe, SimCountingProbe], startMs: number, seed = 7, plan = ''): Generator<string> {
  const rnd = seededRandom(seed);
  yield LOG_HEADER.join(',');
  const gain = [2, 2];
  let t = startMs;
  let n = 0;
  let point = 0;
  while (n < rows) {
    const which = rnd() < 0.6 ? 0 : 1;
    const p = probes[which];
    const lux = 10 ** (-0.3 + rnd() * 5.6);
    const burst = autoRangeBurst(p, lux, gain[which], rnd);
    gain[which] = burst.endCode;
    const label = `P${String(++point).padStart(7, '0')}`;
    const x = (rnd() * 60).toFixed(2);
    const y = (rnd() * 40).toFixed(2);
    for (const s of burst.samples) {
      if (n >= rows) break;
      yield `${new Date(t).toISOString()},${p.serial},${label},${s.gain},${s.counts},,${x},${y},${plan},100,21.5,task,`;
      n++;
      t += 400;
    }
    t += 11_000;
  }
}
