import { describe, it, expect } from 'vitest';
import { judgeZones, DAYLIGHT_SWAMP_RATIO, OUTDOOR_GRID_NOTE, type JudgeReading, type JudgeTarget, type JudgeZone } from '@server/modules/compliance/judge-zones';
import { gridAdequacy } from '@shared/core/zone-stats';

let nextId = 1;
function reading(x: number, y: number, lux: number, extra: Partial<JudgeReading> = {}): JudgeReading {
  const id = nextId++;
  return { id, point: `C${id}`, xM: x, yM: y, planId: 1, role: 'task', timeMs: 1_800_000_000_000 + id * 10_000, probeId: 1, lux, uLux: lux * 0.1, luxBound: 'exact', flag: 'ok', budget: [{ name: 'calibration', uRel: 0.05 }], coefficientSetId: null, ...extra };
}
// Car park target: EN 12464-2, parking, medium traffic, 10 lx (from memory, as the shipped library says).
const carPark: JudgeTarget = { id: 1, name: 'Car park', emLux: 10, u0Min: 0.25, dfTargetPercent: null, source: 'EN 12464-2', confidence: 'memory' };
const park = (kind: JudgeZone['kind']): JudgeZone => ({ id: 1, name: 'Car park', kind, useType: 'car_park', planId: 1, planName: 'Site', planeHeightM: 0, wallBandM: 0, polygon: [[0, 0], [18, 0], [18, 9], [0, 9]], target: carPark });
/** Six points over a 9 m x 18 m car park (far fewer than the indoor grid rule asks for). */
const six = (lux: (k: number) => number) => [0, 1, 2, 3, 4, 5].map((k) => reading(1.5 + 3 * k, 4.5, lux(k)));

describe('outdoor areas are not judged by the indoor grid rule', () => {
  it('a 9 m x 18 m car park asks for no indoor grid points and says what applies instead', () => {
    // The indoor rule would ask for many points here (EN 12464-1 grid, checked in tests/shared).
    expect(gridAdequacy(6, 18, 9, 0).required).toBeGreaterThan(6);
    const z = judgeZones({ zones: [park('outdoor')], readings: six(() => 12), rule: 'simple', daylightExcluded: true }).zones[0];
    expect(z.requiredPoints).toBe(0);
    expect(z.gridAdequate).toBe(true);
    expect(z.gridRuleApplies).toBe(false);
    expect(z.reasons).toContain(OUTDOOR_GRID_NOTE);
    expect(z.reasons.join(' ')).not.toMatch(/points the grid rule asks for/);
  });

  it('the same outline as a room keeps the indoor grid rule', () => {
    const z = judgeZones({ zones: [park('room')], readings: six(() => 12), rule: 'simple', daylightExcluded: true }).zones[0];
    expect(z.gridRuleApplies).toBe(true);
    expect(z.requiredPoints).toBeGreaterThan(6);
  });
});

describe('daylight swamping an electric-lighting target', () => {
  it('a car park measured in 35-44 klx of sun is flagged as measured in daylight, first among its reasons and in the warnings', () => {
    const res = judgeZones({ zones: [park('outdoor')], readings: six((k) => 35_000 + 1_800 * k), rule: 'simple', daylightExcluded: false });
    const z = res.zones[0];
    expect(z.reasons[0]).toMatch(/^Measured in daylight/);
    expect(z.reasons[0]).toContain(`${DAYLIGHT_SWAMP_RATIO} times`);
    expect(res.warnings.some((w) => w.startsWith('Daylight swamps the electric-lighting target in Car park'))).toBe(true);
  });

  it('a car park at night (about 12 lx) carries no daylight warning', () => {
    const res = judgeZones({ zones: [park('outdoor')], readings: six(() => 12), rule: 'simple', daylightExcluded: true });
    expect(res.zones[0].reasons.some((r) => r.startsWith('Measured in daylight'))).toBe(false);
    expect(res.warnings.some((w) => w.startsWith('Daylight swamps'))).toBe(false);
  });
});
