/**
 * The invented demo scenario's emergency lighting on the library's ground floor (plan metres,
 * library-layout.ts): the corridor's escape route to the east exit, the stair up from it, the
 * reading room as an open area and the extinguisher by the exit, with the levels the simulated
 * emergency luminaires give. The route's far end is too dark at the end of the rated duration.
 */
import type { EmergencyElementBody } from '@shared/schemas/emergency';
import { autoRangeBurst, seededRandom, simProbe, type SimRow } from './simulate-log';
import { DEMO_COUNTING_PROBES } from './demo-probes';
import { plannedPointsOfBody } from '../../modules/emergency/elements-service';

export const DEMO_EMERGENCY_PLAN = 'Ground floor';

export const DEMO_EMERGENCY_ELEMENTS: EmergencyElementBody[] = [
  { kind: 'escape_route', code: 'R1', name: 'Corridor to the east exit', line: [[20.5, 7.5], [35.5, 7.5]], widthM: 2, stair: false, spacingM: 4 },
  { kind: 'escape_route', code: 'S1', name: 'Stair to the first floor', line: [[28, 9.2], [28, 11.8]], widthM: 1.2, stair: true, spacingM: 1.5 },
  { kind: 'open_area', code: 'A1', name: 'Reading room', polygon: [[0, 0], [20, 0], [20, 12], [0, 12]], borderM: 0.5, spacingM: 4 },
  { kind: 'safety_equipment', code: 'E1', name: 'Extinguisher by the east exit', point: [35.6, 8.6], equipment: 'fire_fighting' },
];

/** Rated duration of the library's self-contained luminaires, minutes. */
export const DEMO_RATED_MIN = 180;

/** The demo luminaires' level at a point in the initial pass, lux (invented): brighter near the fittings, dimmer towards the exit end. */
function initialLevel(code: string, x: number, y: number): number {
  if (code === 'R1') return 2.6 - 0.055 * (x - 20.5) - 0.5 * Math.abs(y - 7.5);
  if (code === 'S1') return 3.4;
  if (code === 'A1') return 1.5 - 0.03 * Math.abs(x - 10) - 0.02 * Math.abs(y - 6);
  return 7.5;
}

/** By the end of the rated duration the batteries give this share of the initial level (invented); the route's far end loses more (a weak battery). */
function endShare(label: string): number {
  return label === 'R1-C05' ? 0.4 : 0.72;
}

/**
 * The night test's log: LX-4107 at floor level with 1 s integration (counts ten times those of
 * 100 ms, so levels near 0.1 lx stay above the probe's floor), every planned point of the
 * elements right after the mains are cut and again in the last quarter hour of the rated
 * duration; the extinguisher measured at its position with a free label.
 */
export function simulateEmergencyLog(mainsOffMs: number, seed = 1838): SimRow[] {
  const rnd = seededRandom(seed);
  const probe = simProbe(DEMO_COUNTING_PROBES[1]);
  const rows: SimRow[] = [];
  let code = 3;
  const points = DEMO_EMERGENCY_ELEMENTS.flatMap((body) => plannedPointsOfBody(body)
    .map((p) => ({ ...p, element: body.code, label: body.kind === 'safety_equipment' ? 'extinguisher-east' : p.label })));
  for (const [startMin, end] of [[3, false], [166, true]] as const) {
    let t = mainsOffMs + startMin * 60_000;
    for (const p of points) {
      const lux = Math.max(0.02, initialLevel(p.element, p.xM, p.yM) * (end ? endShare(p.label) : 1) * (1 + (rnd() - 0.5) * 0.04));
      const burst = autoRangeBurst(probe, lux, code, rnd, 1000, 12);
      code = burst.endCode;
      for (const s of burst.samples) {
        rows.push({ timeMs: t, probe: probe.serial, point: p.label, gain: s.gain, counts: s.counts, xM: p.xM, yM: p.yM, plan: DEMO_EMERGENCY_PLAN, intMs: 1000, tempC: 12, note: end ? 'end of rated duration' : 'after mains cut' });
        t += 1_500;
      }
      t += 12_000;
    }
  }
  return rows;
}
