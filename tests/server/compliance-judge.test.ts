import { describe, it, expect } from 'vitest';
import { judgeZones, worstFirst, MIN_ASSESSABLE_POINTS, type JudgeReading, type JudgeTarget, type JudgeZone } from '@server/modules/compliance/judge-zones';
import type { AcceptanceRule } from '@shared/core/decision';

// Hand-built zones: every reading carries a 5 % calibration part (k = 1), fully systematic, so a
// zone of readings at E has Eavg = E and U = k * 0.05 * E = 0.1 * E exactly (GUM 6.2.1, k = 2).

let nextId = 1;
function reading(x: number, y: number, lux: number | null, extra: Partial<JudgeReading> = {}): JudgeReading {
  const id = nextId++;
  return {
    id, point: `P${id}`, xM: x, yM: y, planId: 1, role: 'task', timeMs: 1_800_000_000_000 + id * 10_000, probeId: 1, lux, uLux: lux === null ? null : lux * 0.1,
    luxBound: 'exact', flag: 'ok', budget: [{ name: 'calibration', uRel: 0.05 }], coefficientSetId: null, ...extra,
  };
}

/** 25 points on a 5 x 5 grid in a 1 m square: exactly what the grid rule asks for such a square (d = 1 m, p = 0.2 m, n = 5). */
function grid25(lux: (i: number, j: number) => number | null, origin: [number, number] = [0, 0]): JudgeReading[] {
  const out: JudgeReading[] = [];
  for (let i = 0; i < 5; i++) for (let j = 0; j < 5; j++) out.push(reading(origin[0] + 0.1 + 0.2 * i, origin[1] + 0.1 + 0.2 * j, lux(i, j)));
  return out;
}

const target = (emLux: number, u0Min: number | null = null): JudgeTarget => ({ id: 1, name: 'Test target', emLux, u0Min, dfTargetPercent: null, source: 'test', confidence: 'published' });

function zone(t: JudgeTarget | null, extra: Partial<JudgeZone> = {}): JudgeZone {
  return { id: 1, name: 'Task', kind: 'task_area', useType: 'test_use', planId: 1, planName: 'Plan', planeHeightM: 0.75, wallBandM: 0, polygon: [[0, 0], [1, 0], [1, 1], [0, 1]], target: t, ...extra };
}

function judge(z: JudgeZone, readings: JudgeReading[], rule: AcceptanceRule, daylightExcluded = false) {
  return judgeZones({ zones: [z], readings, rule, daylightExcluded }).zones[0];
}

describe('judgeZones under the guarded rule (ILAC-G8:2019, w = U)', () => {
  const flat = () => grid25(() => 100);

  it('Eavg - U exactly equal to Em, when judged, meets', () => {
    const z = judge(zone(target(90)), flat(), 'guarded');
    expect(z.eavg).toBe(100);
    expect(z.uEavg).toBe(10);
    expect(z.verdict).toBe('meets');
  });

  it('Em just above Eavg - U, when judged, is inconclusive', () => {
    expect(judge(zone(target(90.001)), flat(), 'guarded').verdict).toBe('inconclusive');
  });

  it('Eavg + U exactly equal to Em, when judged, is inconclusive (falls short needs Eavg + U < Em)', () => {
    expect(judge(zone(target(110)), flat(), 'guarded').verdict).toBe('inconclusive');
  });

  it('Em just above Eavg + U, when judged, falls short', () => {
    expect(judge(zone(target(110.001)), flat(), 'guarded').verdict).toBe('falls_short');
  });
});

describe('judgeZones under simple acceptance', () => {
  const flat = () => grid25(() => 100);

  it('Eavg exactly equal to Em, when judged, meets', () => {
    expect(judge(zone(target(100)), flat(), 'simple').verdict).toBe('meets');
  });

  it('Em just above Eavg, when judged, falls short although the guarded rule would call it inconclusive', () => {
    expect(judge(zone(target(100.001)), flat(), 'simple').verdict).toBe('falls_short');
    expect(judge(zone(target(100.001)), flat(), 'guarded').verdict).toBe('inconclusive');
  });

  it('U0 exactly at its minimum, when judged, meets; just below, falls short', () => {
    // 24 points at 110 lx and one at 60 lx: Eavg = (24 * 110 + 60) / 25 = 108, U0 = 60 / 108 = 0.5555...
    const rs = grid25((i, j) => (i === 0 && j === 0 ? 60 : 110));
    const z = judge(zone(target(100, 60 / 108)), rs, 'simple');
    expect(z.eavg).toBeCloseTo(108, 12);
    expect(z.u0).toBe(60 / 108);
    expect(z.verdict).toBe('meets');
    expect(judge(zone(target(100, 0.556)), grid25((i, j) => (i === 0 && j === 0 ? 60 : 110)), 'simple').verdict).toBe('falls_short');
  });
});

describe('judgeZones: points and grid', () => {
  it('a 10 m x 10 m room with a 0.5 m wall band, when judged, requires 100 points (EN 12464-1:2011 rule)', () => {
    // d = 9 m: p = 0.2 * 5^log10(9) = 0.929 m; n = ceil(9 / 0.929) = 10 per side (DOMAIN.md section 5).
    const room = zone(target(100), { kind: 'room', wallBandM: 0.5, polygon: [[0, 0], [10, 0], [10, 10], [0, 10]] });
    const rs = [1, 3, 5, 7, 9].flatMap((x) => [1, 3, 5, 7, 9].map((y) => reading(x, y, 200)));
    const z = judge(room, rs, 'guarded');
    expect(z.requiredPoints).toBe(100);
    expect(z.points).toBe(25);
    expect(z.gridAdequate).toBe(false);
    // Clearly above target, but with a quarter of the grid the core will not show compliance.
    expect(z.verdict).toBe('inconclusive');
    expect(z.reasons.join(' ')).toMatch(/grid rule/);
  });

  it('a 16 m x 3 m corridor, when judged, takes d from the shorter side and requires 47 x 7 points', () => {
    // Sides 15 m and 2 m after the band differ by 2 or more: d = 2 m, p = 0.2 * 5^log10(2) = 0.3245 m;
    // ceil(15 / 0.3245) = 47 and ceil(2 / 0.3245) = 7 (EN 12464-1:2011 as stated in DOMAIN.md).
    const corridor = zone(target(100), { kind: 'room', wallBandM: 0.5, polygon: [[0, 0], [16, 0], [16, 3], [0, 3]] });
    expect(judge(corridor, [reading(8, 1.5, 85)], 'guarded').requiredPoints).toBe(329);
  });

  it('a dark point in the wall band of a room, when judged, is left out of Emin and counted apart', () => {
    const room = zone(target(100, 0.7), { kind: 'room', wallBandM: 0.5, polygon: [[0, 0], [4, 0], [4, 4], [0, 4]] });
    const rs = [reading(0.2, 2, 10), reading(1, 1, 150), reading(2, 2, 150), reading(3, 3, 150), reading(1, 3, 150)];
    const z = judge(room, rs, 'simple');
    expect(z.wallBandPoints).toBe(1);
    expect(z.points).toBe(4);
    expect(z.emin).toBe(150);
    expect(z.u0).toBe(1);
  });

  it('a task area nested in a room, when judged, takes its own points and the room keeps the rest', () => {
    const room = zone(target(100), { id: 10, kind: 'room', wallBandM: 0.5, polygon: [[0, 0], [6, 0], [6, 6], [0, 6]] });
    const task = zone(target(500), { id: 11, name: 'Desk', polygon: [[2, 2], [3, 2], [3, 3], [2, 3]] });
    const rs = [...grid25(() => 520, [2, 2]), reading(1, 1, 180), reading(5, 5, 190), reading(1, 5, 200)];
    const res = judgeZones({ zones: [room, task], readings: rs, rule: 'simple', daylightExcluded: false });
    const byId = new Map(res.zones.map((z) => [z.zoneId, z]));
    expect(byId.get(11)!.points).toBe(25);
    expect(byId.get(11)!.eavg).toBe(520);
    expect(byId.get(10)!.points).toBe(3);
    expect(byId.get(10)!.eavg).toBe(190);
  });

  it('a zone without a target, when judged, is not assessed and says why', () => {
    const z = judge(zone(null), grid25(() => 300), 'guarded');
    expect(z.verdict).toBe('not_assessed');
    expect(z.reasons[0]).toMatch(/No target.*test_use/);
  });

  it(`a zone with fewer than ${MIN_ASSESSABLE_POINTS} valid points, when judged, is not assessed`, () => {
    const z = judge(zone(target(100)), [reading(0.5, 0.5, 300), reading(0.6, 0.5, null, { flag: 'fault', luxBound: 'exact' })], 'guarded');
    expect(z.verdict).toBe('not_assessed');
    expect(z.points).toBe(1);
    expect(z.reasons[0]).toMatch(/Only 1 valid point/);
  });
});

describe('judgeZones: flagged readings as the core handles them', () => {
  it('an over-range point, when judged, makes Eavg a lower bound that can still prove "meets"', () => {
    const rs = grid25(() => 500);
    rs[0] = { ...rs[0], lux: 5000, luxBound: 'lower', flag: 'over_range' };
    const z = judge(zone(target(300)), rs, 'guarded');
    expect(z.bounds.eavg).toBe('lower');
    expect(z.verdict).toBe('meets');
  });

  it('an over-range point, when Eavg is below Em, never proves "falls short"', () => {
    const rs = grid25(() => 50);
    rs[0] = { ...rs[0], lux: 60, luxBound: 'lower', flag: 'over_range' };
    expect(judge(zone(target(300)), rs, 'guarded').verdict).toBe('inconclusive');
  });

  it('fault readings, when judged, are excluded and named in the reasons', () => {
    const rs = [...grid25(() => 100), reading(0.5, 0.5, null, { flag: 'fault' })];
    const z = judge(zone(target(90)), rs, 'guarded');
    expect(z.points).toBe(25);
    expect(z.reasons.join(' ')).toMatch(/1 point\(s\) excluded as faults/);
  });
});

describe('judgeZones: daylight factor', () => {
  // DF = Ei / Eo * 100 % (CIE ILV 17-279), outdoor level interpolated in time between reference samples.
  function withReference(outdoor: (k: number) => number) {
    const indoor = grid25(() => 200);
    const start = indoor[0].timeMs - 30_000;
    const end = indoor[indoor.length - 1].timeMs + 30_000;
    const ref: JudgeReading[] = [];
    for (let k = 0, t = start; t <= end; k++, t += 30_000) ref.push(reading(0, 0, outdoor(k), { role: 'reference', xM: null, yM: null, timeMs: t }));
    return [...indoor, ...ref];
  }

  it('a steady overcast reference of 10 klx, when paired, gives DF 2 % with no warning', () => {
    const z = judge(zone(target(100)), withReference(() => 10_000), 'guarded');
    expect(z.dfAvg).toBeCloseTo(2, 12);
    expect(z.dfWarning).toBeUndefined();
  });

  it('each point, when paired, keeps its own DF = Ei / Eo(t) * 100 % with Eo interpolated linearly between the bracketing reference samples', () => {
    // Outdoor rising 1,000 lx per 30 s sample from 8 klx: each point's Eo is worked out here by hand.
    const rs = withReference((k) => 8000 + 1000 * k);
    const ref = rs.filter((r) => r.role === 'reference');
    const z = judge(zone(target(100)), rs, 'guarded');
    const indoor = rs.filter((r) => r.role === 'task');
    expect(Object.keys(z.pointDf ?? {})).toHaveLength(indoor.length);
    for (const r of indoor) {
      const after = ref.findIndex((o) => o.timeMs >= r.timeMs);
      const [a, b] = [ref[after - 1], ref[after]];
      const eo = (a.lux as number) + ((b.lux as number) - (a.lux as number)) * (r.timeMs - a.timeMs) / (b.timeMs - a.timeMs);
      expect(z.pointDf![r.id]).toBeCloseTo((200 / eo) * 100, 10);
    }
    // The zone's average is the mean of its points' factors.
    const values = Object.values(z.pointDf!);
    expect(z.dfAvg).toBeCloseTo(values.reduce((s, v) => s + v, 0) / values.length, 12);
  });

  it('an outdoor level doubling every 30 s, when paired, warns that the pairing cannot be trusted', () => {
    const z = judge(zone(target(100)), withReference((k) => 5000 * 2 ** k), 'guarded');
    expect(z.dfWarning).toMatch(/changed too fast/);
  });

  it('over-range outdoor reference readings (direct sun), when judged, are left out of the pairing and a warning says how many', () => {
    const rs = withReference(() => 10_000);
    // The last two reference samples saturate: lower bounds, not levels.
    const ref = rs.filter((r) => r.role === 'reference');
    for (const r of ref.slice(-2)) Object.assign(r, { lux: 150_000, luxBound: 'lower', flag: 'over_range' });
    const res = judgeZones({ zones: [zone(target(100))], readings: rs, rule: 'guarded', daylightExcluded: false });
    expect(res.warnings.some((w) => w.startsWith('2 outdoor reference reading(s) were over range'))).toBe(true);
    // Points still bracketed by exact samples keep DF = 200 / 10,000 = 2 %; none is computed from a bound.
    expect(Object.values(res.zones[0].pointDf ?? {}).every((df) => Math.abs(df - 2) < 1e-9)).toBe(true);
    expect(Object.keys(res.zones[0].pointDf ?? {}).length).toBeGreaterThan(0);
  });

  it('a survey with daylight excluded, when judged, gives no daylight factor', () => {
    const res = judgeZones({ zones: [zone(target(100))], readings: withReference(() => 10_000), rule: 'guarded', daylightExcluded: true });
    expect(res.zones[0].dfAvg).toBeUndefined();
    expect(res.zones[0].pointDf).toBeUndefined();
    expect(res.warnings.join(' ')).toMatch(/Daylight was excluded/);
  });
});

describe('worstFirst', () => {
  it('verdicts, when sorted, put the largest shortfall first and zones that meet last', () => {
    const base = judge(zone(target(100)), grid25(() => 100), 'simple');
    const mk = (name: string, verdict: typeof base.verdict, eavg: number) => ({ ...base, name, verdict, eavg });
    const sorted = worstFirst([mk('ok', 'meets', 120), mk('slightly dark', 'falls_short', 95), mk('unclear', 'inconclusive', 101), mk('very dark', 'falls_short', 40), mk('none', 'not_assessed', 0)]);
    expect(sorted.map((z) => z.name)).toEqual(['very dark', 'slightly dark', 'unclear', 'none', 'ok']);
  });
});
