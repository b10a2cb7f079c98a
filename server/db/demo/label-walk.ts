import { DEMO_COUNTING_PROBES } from './demo-probes';
import { DEMO_PLANS } from './library-layout';
import { autoRangeBurst, demoLevelAt, seededRandom, simProbe, type SimRow } from './simulate-log';

/** The demo's label-only walk: a ground-floor check on 2 September 2026 whose logging meter recorded labels, not positions. */
export const LABEL_WALK = { name: 'Ground-floor offices, label walk 2026', startedOn: '2026-09-02', startIso: '2026-09-02T17:30:00Z', zones: ['Office A', 'Office B', 'Meeting room'] } as const;

/**
 * Rows of a label-only log for the given planned points (label and position on the ground floor):
 * each point's level from the demo layout, auto-ranging bursts from the tripod probe, no x_m, y_m
 * or plan, so every reading reaches the plan through the planned point its label names.
 */
export function simulateLabelWalk(points: readonly { label: string; zoneName: string; xM: number; yM: number }[], startMs: number, seed = 902): SimRow[] {
  const rnd = seededRandom(seed);
  const tripod = simProbe(DEMO_COUNTING_PROBES[0]);
  const ground = DEMO_PLANS.find((p) => p.key === 'ground')!;
  const rows: SimRow[] = [];
  let t = startMs;
  for (const p of points) {
    const zone = ground.zones.find((z) => z.name === p.zoneName);
    if (!zone) continue;
    const lux = demoLevelAt(zone, p.xM, p.yM) * (0.96 + 0.08 * rnd());
    const tempC = 20.5 + rnd() * 1.5;
    for (const s of autoRangeBurst(tripod, lux, 3, rnd, 100, tempC).samples) {
      rows.push({ timeMs: t, probe: tripod.serial, point: p.label, gain: s.gain, counts: s.counts, intMs: 100, tempC: Math.round(tempC * 10) / 10, role: 'task' });
      t += 400;
    }
    t += 12_000 + Math.round(rnd() * 6_000);
  }
  return rows;
}
