import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  EN_1838_2013, NFPA_101_7_9_2, judgeEmergencyElement, limitLux, printedLux, combineElementVerdicts,
  type EmergencyCriteriaSet, type EmergencyPass, type EmergencyPoint, type EmergencyPointRole,
} from '@shared/core/emergency';
import { addDays, addMonths, DEFAULT_TEST_SCHEDULE, passOfLoggedReading, passOfReading, passTimingWarnings, testDueDates } from '@shared/core/emergency-schedule';
import { LUX_PER_FOOTCANDLE } from '@shared/core/units';
import { combineBudget } from '@shared/core/uncertainty';
import type { LuxBound, Reading } from '@shared/core/types';
import { areaRoleAt, offsetPolyline, plannedAreaPoints, plannedRoutePoints, polylineLength, routeRoleAt, routeStripCount, routeStripRoleAt, routeStrips } from '@shared/spatial/emergency-points';
import { distanceToPolyline, type PlanPoint } from '@shared/spatial/polygon';

/** A reading with a 2 % calibration and 1 % random part (k = 1), so U = 2 * 2.24 % of the value. */
function reading(lux: number | null, luxBound: LuxBound = 'exact', uRelCal = 0.02): Reading {
  const budget = [{ name: 'calibration' as const, uRel: uRelCal }, { name: 'quantisation' as const, uRel: 0.01 }];
  const uRel = combineBudget(budget);
  const flag = lux === null ? 'fault' : luxBound === 'upper' ? 'under_range' : luxBound === 'lower' ? 'over_range' : 'ok';
  return { probe: 'P', point: 'x', timeMs: 0, lux, luxBound, flag, flags: [flag], gainCode: 0, samples: 1, chosenSample: 0, rejected: [], uRel, uLux: 2 * uRel * (lux ?? 0), budget, coefficientSetId: 'A' };
}

let n = 0;
const pt = (lux: number | null, role: EmergencyPointRole, pass: EmergencyPass = 'end_of_duration', bound: LuxBound = 'exact', uRelCal = 0.02): EmergencyPoint =>
  ({ label: `${role}-${++n}`, role, pass, reading: reading(lux, bound, uRelCal) });

const route = (centre: (number | null)[], band: number[] = [], pass: EmergencyPass = 'end_of_duration') => ({
  kind: 'escape_route' as const, widthM: 1.8, response: { toHalfS: 2, toFullS: 20 },
  points: [...centre.map((l) => pt(l, 'centre_line', pass)), ...band.map((l) => pt(l, 'central_band', pass))],
});

const check = (r: ReturnType<typeof judgeEmergencyElement>, id: string) => r.checks.find((c) => c.checkId === id);

describe('EN 1838:2013 escape routes (external checks from the issue; EN 1838:2013 via secondary sources)', () => {
  it('0.9 lx anywhere on the centre line fails (EN 1838:2013: at least 1 lx on the centre line)', () => {
    const r = judgeEmergencyElement(route([3, 2.5, 0.9, 2]), EN_1838_2013, 'simple');
    expect(check(r, 'route-centre-min')?.verdict).toBe('falls_short');
    expect(check(r, 'route-centre-min')?.value).toBe(0.9);
    expect(r.verdict).toBe('falls_short');
    expect(r.worstPoint?.lux).toBe(0.9);
  });

  it('1.2 lx everywhere on the centre line with a 0.8 lx band meets, with both passes and responses recorded', () => {
    const el = route([1.2, 1.5, 1.3], [0.8, 0.9]);
    const r = judgeEmergencyElement(el, EN_1838_2013, 'simple');
    expect(r.verdict).toBe('meets');
  });

  it('a central band at 0.45 lx against a 1 lx centre-line requirement fails (EN 1838:2013: band at least 50 % of 1 lx)', () => {
    const r = judgeEmergencyElement(route([1.5, 1.4, 1.6], [0.45, 0.9]), EN_1838_2013, 'simple');
    const band = check(r, 'route-band-min');
    expect(band?.verdict).toBe('falls_short');
    expect(band?.limit).toBe(0.5);
    expect(band?.text).toMatch(/Central band minimum 0\.45 lx/);
    expect(check(r, 'route-centre-min')?.verdict).toBe('meets');
    expect(r.verdict).toBe('falls_short');
  });

  it('Emax:Emin 30:1 passes and 45:1 fails (EN 1838:2013: at most 40:1 on the centre line)', () => {
    const ok = judgeEmergencyElement(route([1, 30, 10]), EN_1838_2013, 'simple');
    expect(check(ok, 'route-ratio')?.verdict).toBe('meets');
    expect(check(ok, 'route-ratio')?.text).toMatch(/30\.0:1/);
    const bad = judgeEmergencyElement(route([1, 45, 10]), EN_1838_2013, 'simple');
    expect(check(bad, 'route-ratio')?.verdict).toBe('falls_short');
    expect(check(bad, 'route-ratio')?.text).toMatch(/45\.0:1 .* against at most 40:1/);
  });

  it('ratio near 40:1 under the guarded rule: 39:1 with 2 % calibration is inconclusive, not a pass', () => {
    const r = judgeEmergencyElement(route([1, 39]), EN_1838_2013, 'guarded');
    expect(check(r, 'route-ratio')?.verdict).toBe('inconclusive');
    expect(check(r, 'route-ratio')?.uncertainty).toBeGreaterThan(0);
  });

  it('a route wider than 2 m is judged as 2 m strips (EN 1838:2013: "several 2 m strips"); readings that name no strip are not judged', () => {
    const r = judgeEmergencyElement({ ...route([2, 2, 2]), widthM: 3 }, EN_1838_2013, 'simple');
    expect(check(r, 'route-width')?.verdict).toBe('meets');
    expect(check(r, 'route-width')?.text).toMatch(/2 strips of 1\.5 m/);
    expect(r.points.every((p) => p.verdict === 'not_judged')).toBe(true);
    expect(r.reasons.join(' ')).toMatch(/3 reading\(s\) name no strip/);
    expect(r.verdict).toBe('inconclusive');
  });

  it('a 4 m route as two 2 m strips: a 0.9 lx centre-line point in strip 2 fails that strip and the route; strip 1 meets on its own', () => {
    const strip = (k: number, centre: number[], band: number[]) => [...centre.map((l) => pt(l, 'centre_line')), ...band.map((l) => pt(l, 'central_band'))].map((p) => ({ ...p, strip: k }));
    const points = [...strip(1, [1.4, 1.2, 1.3], [0.8, 0.7]), ...strip(2, [1.5, 0.9, 1.1], [0.8, 0.6])];
    const r = judgeEmergencyElement({ kind: 'escape_route', widthM: 4, response: { toHalfS: 2, toFullS: 20 }, points }, EN_1838_2013, 'simple');
    expect(check(r, 'route-width')?.text).toMatch(/2 strips of 2 m/);
    expect(check(r, 'route-centre-min/S1')?.verdict).toBe('meets');
    expect(check(r, 'route-centre-min/S2')).toMatchObject({ verdict: 'falls_short', value: 0.9 });
    expect(check(r, 'route-band-min/S2')?.verdict).toBe('meets');
    expect(check(r, 'route-ratio/S1')?.verdict).toBe('meets');
    // Response times are judged once for the whole route.
    expect(r.checks.filter((c) => c.checkId.startsWith('response-')).map((c) => c.checkId)).toEqual(['response-half', 'response-full']);
    expect(r.verdict).toBe('falls_short');
    expect(r.reasons.some((x) => x.startsWith('Strip 2 of 2: Centre line minimum 0.90 lx'))).toBe(true);
    // Point results keep the element's order, each with its strip's limit.
    expect(r.points.map((p) => p.label)).toEqual(points.map((p) => p.label));
    expect(r.points.find((p) => p.lux === 0.9)?.verdict).toBe('falls_short');
    // The same points with every strip lit pass, so the strip split above is what failed it.
    const lit = points.map((p) => (p.reading.lux === 0.9 ? { ...p, reading: reading(1.2) } : p));
    expect(judgeEmergencyElement({ kind: 'escape_route', widthM: 4, response: { toHalfS: 2, toFullS: 20 }, points: lit }, EN_1838_2013, 'simple').verdict).toBe('meets');
  });

  it('NFPA 101 has no strip rule: a wide path is judged as one (average and minimum over all its points)', () => {
    const points = [1.5, 1.2, 1.4].map((l, i) => ({ ...pt(l, 'centre_line', 'initial'), strip: i + 1 }));
    const r = judgeEmergencyElement({ kind: 'escape_route', widthM: 5, response: null, points }, NFPA_101_7_9_2, 'simple');
    expect(r.checks.some((c) => c.checkId.includes('/S'))).toBe(false);
    expect(check(r, 'initial-min')?.value).toBe(1.2);
  });

  it('response times: 50 % within 5 s and all within 60 s; a missing time shows no compliance', () => {
    const slow = judgeEmergencyElement({ ...route([2, 2]), response: { toHalfS: 6, toFullS: 30 } }, EN_1838_2013, 'simple');
    expect(check(slow, 'response-half')?.verdict).toBe('falls_short');
    const none = judgeEmergencyElement({ ...route([2, 2]), response: null }, EN_1838_2013, 'simple');
    expect(check(none, 'response-full')?.verdict).toBe('inconclusive');
    expect(none.verdict).toBe('inconclusive');
  });
});

describe('decision rules at emergency levels (ILAC-G8:2019 as in decision.ts)', () => {
  it('an under-range reading can never pass: upper bound 2 lx against 1 lx is inconclusive, upper bound 0.3 lx falls short', () => {
    const el = { ...route([1.5, 1.5]), points: [pt(1.5, 'centre_line'), pt(2, 'centre_line', 'end_of_duration', 'upper')] };
    expect(check(judgeEmergencyElement(el, EN_1838_2013, 'simple'), 'route-centre-min')?.verdict).toBe('inconclusive');
    const low = { ...route([1.5]), points: [pt(1.5, 'centre_line'), pt(0.3, 'centre_line', 'end_of_duration', 'upper')] };
    expect(check(judgeEmergencyElement(low, EN_1838_2013, 'simple'), 'route-centre-min')?.verdict).toBe('falls_short');
  });

  it('guarded: 1.03 lx with U = 0.046 lx is inconclusive against 1 lx; simple acceptance passes it', () => {
    const el = route([1.03, 1.5]);
    expect(check(judgeEmergencyElement(el, EN_1838_2013, 'guarded'), 'route-centre-min')?.verdict).toBe('inconclusive');
    expect(check(judgeEmergencyElement(el, EN_1838_2013, 'simple'), 'route-centre-min')?.verdict).toBe('meets');
  });

  it('each point is judged against the strictest point limit that applies to it (centre line 1 lx, band 0.5 lx)', () => {
    const r = judgeEmergencyElement(route([1.2], [0.7]), EN_1838_2013, 'simple');
    const c = r.points.find((p) => p.role === 'centre_line');
    const b = r.points.find((p) => p.role === 'central_band');
    expect([c?.limitLux, c?.verdict]).toEqual([1, 'meets']);
    expect([b?.limitLux, b?.verdict]).toEqual([0.5, 'meets']);
  });

  it('property: a route whose every point is at least 1 lx exact and within 40:1 meets under simple acceptance', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: 1, max: 40, noNaN: true }), { minLength: 1, maxLength: 30 }), (lux) => {
      const r = judgeEmergencyElement(route(lux), EN_1838_2013, 'simple');
      expect(r.verdict).toBe('meets');
    }));
  });

  it('property: lowering any centre-line point below 1 lx makes the route fall short under either rule', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: 1.5, max: 20, noNaN: true }), { minLength: 1, maxLength: 20 }), fc.double({ min: 0.01, max: 0.9, noNaN: true }), (lux, low) => {
      for (const rule of ['simple', 'guarded'] as const) expect(judgeEmergencyElement(route([...lux, low]), EN_1838_2013, rule).verdict).toBe('falls_short');
    }));
  });
});

describe('EN 1838:2013 open areas, high-risk task areas, safety equipment', () => {
  it('open area: 0.5 lx over the area less the border; border readings are not judged', () => {
    const el = { kind: 'open_area' as const, response: { toHalfS: 1, toFullS: 10 }, points: [pt(0.6, 'area'), pt(0.55, 'area'), pt(0.1, 'border')] };
    const r = judgeEmergencyElement(el, EN_1838_2013, 'simple');
    expect(r.verdict).toBe('meets');
    expect(r.points.find((p) => p.role === 'border')?.verdict).toBe('not_judged');
    expect(r.reasons.join(' ')).toMatch(/border/);
    const bad = judgeEmergencyElement({ ...el, points: [pt(0.45, 'area'), pt(0.9, 'area')] }, EN_1838_2013, 'simple');
    expect(check(bad, 'open-min')?.verdict).toBe('falls_short');
  });

  it('high-risk area with normal lighting at 500 lx needs max(50, 15) = 50 lx; at 100 lx it needs 15 lx (external check from the issue)', () => {
    const at = (normal: number, lux: number[]) => judgeEmergencyElement({ kind: 'high_risk_area', normalEmLux: normal, response: { toFullS: 0.3 }, points: lux.map((l) => pt(l, 'area')) }, EN_1838_2013, 'simple');
    expect(check(at(500, [60, 55]), 'high-risk-min')?.limit).toBe(50);
    expect(check(at(500, [49, 55]), 'high-risk-min')?.verdict).toBe('falls_short');
    expect(check(at(100, [16, 18]), 'high-risk-min')?.limit).toBe(15);
    expect(check(at(100, [16, 18]), 'high-risk-min')?.verdict).toBe('meets');
    expect(check(at(100, [14, 18]), 'high-risk-min')?.verdict).toBe('falls_short');
  });

  it('high-risk uniformity Emin/Emax at least 0.1, response within 0.5 s; no normal value: inconclusive', () => {
    const r = judgeEmergencyElement({ kind: 'high_risk_area', normalEmLux: 100, response: { toFullS: 0.8 }, points: [pt(16, 'area'), pt(200, 'area')] }, EN_1838_2013, 'simple');
    expect(check(r, 'high-risk-uniformity')?.verdict).toBe('falls_short'); // 16/200 = 0.08
    expect(check(r, 'high-risk-response')?.verdict).toBe('falls_short');
    const none = judgeEmergencyElement({ kind: 'high_risk_area', response: { toFullS: 0.2 }, points: [pt(20, 'area')] }, EN_1838_2013, 'simple');
    expect(check(none, 'high-risk-min')?.verdict).toBe('inconclusive');
  });

  it('safety equipment: 5 lx (EN 1838:2013, from memory)', () => {
    const at = (l: number) => judgeEmergencyElement({ kind: 'safety_equipment', points: [pt(l, 'equipment')] }, EN_1838_2013, 'simple').verdict;
    expect(at(5.5)).toBe('meets');
    expect(at(4.2)).toBe('falls_short');
  });

  it('EN 1838 asks for the end-of-duration pass: an initial pass alone shows no compliance', () => {
    const r = judgeEmergencyElement(route([2, 2], [], 'initial'), EN_1838_2013, 'simple');
    expect(r.verdict).toBe('inconclusive');
    expect(r.reasons.join(' ')).toMatch(/end-of-duration pass/);
  });
});

describe('NFPA 101 §7.9.2.1 in foot-candles (code text as quoted in secondary sources)', () => {
  const path = (initial: number[], end: number[]) => ({ kind: 'escape_route' as const, widthM: 1.5, points: [...initial.map((l) => pt(l, 'centre_line', 'initial')), ...end.map((l) => pt(l, 'centre_line', 'end_of_duration'))] });
  const fcToLux = (v: number) => v * LUX_PER_FOOTCANDLE;

  it('the exact factor: 1 fc = 10.763910417 lx, 0.1 fc = 1.0764 lx (1 ft = 0.3048 m exactly)', () => {
    expect(limitLux({ value: 1, unit: 'fc' })).toBeCloseTo(10.763910417, 9);
    expect(limitLux({ value: 0.1, unit: 'fc' })).toBeCloseTo(1.0764, 4);
    expect([printedLux({ value: 1, unit: 'fc' }), printedLux({ value: 0.1, unit: 'fc' })]).toEqual([10.8, 1.1]);
  });

  it('average 1.2 fc and minimum 0.09 fc fails initially (external check from the issue)', () => {
    // Three points averaging 1.2 fc with the lowest at 0.09 fc.
    const r = judgeEmergencyElement(path([0.09, 1.71, 1.8].map(fcToLux), [0.7, 0.7, 0.7].map(fcToLux)), NFPA_101_7_9_2, 'simple');
    expect(check(r, 'initial-average')?.value).toBeCloseTo(fcToLux(1.2), 9);
    expect(check(r, 'initial-average')?.verdict).toBe('meets');
    expect(check(r, 'initial-min')?.verdict).toBe('falls_short');
    expect(r.verdict).toBe('falls_short');
  });

  it('a 1.09 lx minimum passes against the exact 1.0764 lx and would fail against a printed 1.1 lx; the verdict says so', () => {
    const r = judgeEmergencyElement(path([1.09, 12, 12], [1, 7, 7]), NFPA_101_7_9_2, 'simple');
    const c = check(r, 'initial-min');
    expect(c?.verdict).toBe('meets');
    expect(c?.roundingNote).toMatch(/rounded 1\.1 lx .*"falls short".*exact 1\.0764 lx/);
    // No note where rounding changes nothing.
    expect(check(r, 'end-min')?.roundingNote).toBeNull();
  });

  it('an average of 10.78 lx meets the exact 1 fc (10.764 lx) but not a printed 10.8 lx: noted', () => {
    const r = judgeEmergencyElement(path([10.78, 10.78], [7, 7]), NFPA_101_7_9_2, 'simple');
    expect(check(r, 'initial-average')?.verdict).toBe('meets');
    expect(check(r, 'initial-average')?.roundingNote).toMatch(/10\.8 lx/);
  });

  it('end of 1½ hours: 0.6 fc average and 0.06 fc minimum; both passes required', () => {
    const r = judgeEmergencyElement(path([12, 12], [0.5, 0.9].map(fcToLux)), NFPA_101_7_9_2, 'simple');
    expect(check(r, 'end-average')?.verdict).toBe('meets'); // 0.7 fc
    expect(check(r, 'end-min')?.verdict).toBe('meets');
    const low = judgeEmergencyElement(path([12, 12], [0.55, 0.6].map(fcToLux)), NFPA_101_7_9_2, 'simple');
    expect(check(low, 'end-average')?.verdict).toBe('falls_short');
    const onlyInitial = judgeEmergencyElement(path([12, 12], []), NFPA_101_7_9_2, 'simple');
    expect(onlyInitial.verdict).toBe('inconclusive');
  });

  it('NFPA sets no level for safety equipment: not judged', () => {
    expect(judgeEmergencyElement({ kind: 'safety_equipment', points: [pt(1, 'equipment')] }, NFPA_101_7_9_2, 'simple').verdict).toBe('not_judged');
    expect(combineElementVerdicts(['not_judged', 'meets'])).toBe('meets');
  });
});

describe('an organisation\'s own criteria set (data, not code)', () => {
  it('the reported 2024 draft: 1 lx over the whole central band fails a 0.8 lx band that EN 1838:2013 accepts', () => {
    const draft: EmergencyCriteriaSet = {
      ...EN_1838_2013, key: 'org-draft', name: 'Own: 1 lx central band',
      checks: EN_1838_2013.checks.map((c) => (c.id === 'route-band-min' && c.kind === 'min' ? { ...c, limit: { value: 1, unit: 'lx' as const } } : c)),
    };
    const el = route([1.2, 1.3], [0.8, 1.1]);
    expect(judgeEmergencyElement(el, EN_1838_2013, 'simple').verdict).toBe('meets');
    expect(judgeEmergencyElement(el, draft, 'simple').verdict).toBe('falls_short');
  });
});

describe('test schedule and passes', () => {
  it('functional every 30 days, full duration every 12 months (NFPA 101 §7.9.3 via secondary sources); a full-duration test counts as functional (common practice)', () => {
    const d = testDueDates([{ kind: 'functional', testedOn: '2026-10-01', result: 'pass' }, { kind: 'full_duration', testedOn: '2025-11-15', result: 'pass' }], DEFAULT_TEST_SCHEDULE, '2026-12-02');
    expect(d[0]).toMatchObject({ kind: 'functional', dueOn: '2026-10-31', state: 'overdue', daysOverdue: 32 });
    expect(d[1]).toMatchObject({ kind: 'full_duration', dueOn: '2026-11-15', state: 'overdue', daysOverdue: 17 });
    const fresh = testDueDates([{ kind: 'full_duration', testedOn: '2026-11-28', result: 'fail' }], DEFAULT_TEST_SCHEDULE, '2026-12-02');
    expect(fresh[0]).toMatchObject({ dueOn: '2026-12-28', state: 'ok', lastResult: 'fail' });
    expect(testDueDates([], DEFAULT_TEST_SCHEDULE, '2026-12-02')[0].state).toBe('never_tested');
  });

  it('calendar arithmetic: 31 Jan + 1 month = 29 Feb in a leap year; +30 days crosses the year', () => {
    expect(addMonths('2028-01-31', 1)).toBe('2028-02-29');
    expect(addMonths('2026-03-15', 12)).toBe('2027-03-15');
    expect(addDays('2026-12-15', 30)).toBe('2027-01-14');
  });

  it('readings before the mains failed belong to no pass; the first half of the rated duration is the initial pass', () => {
    const t0 = Date.UTC(2026, 10, 20, 20, 0);
    expect(passOfReading(t0 - 1, t0, 180)).toBeNull();
    expect(passOfReading(t0 + 10 * 60_000, t0, 180)).toBe('initial');
    expect(passOfReading(t0 + 175 * 60_000, t0, 180)).toBe('end_of_duration');
    expect(passTimingWarnings([{ pass: 'end_of_duration', timeMs: t0 + 120 * 60_000 }], t0, 180)[0]).toMatch(/60 min before/);
    expect(passTimingWarnings([{ pass: 'end_of_duration', timeMs: t0 + 170 * 60_000 }], t0, 180)).toEqual([]);
  });
});

describe('planned points (plan metres)', () => {
  it('a 10 m straight route 2 m wide at 2 m spacing: 6 centre points and band points at ±0.5 m', () => {
    const p = plannedRoutePoints('R1', [[0, 1], [10, 1]], 2, 2);
    const c = p.filter((q) => q.role === 'centre_line');
    expect(c.map((q) => q.xM)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(p.filter((q) => q.role === 'central_band').map((q) => q.yM).slice(0, 2)).toEqual([1.5, 0.5]);
    expect(c[0].label).toBe('R1-C01');
  });

  it('an L-shaped route follows its corner; length 7 m at 2 m spacing gives ceil(3.5) + 1 = 5 evenly spread points', () => {
    const line: [number, number][] = [[0, 0], [4, 0], [4, 3]];
    expect(polylineLength(line)).toBe(7);
    const c = plannedRoutePoints('S', line, 1, 2).filter((q) => q.role === 'centre_line');
    expect(c).toHaveLength(5);
    expect(c[2]).toMatchObject({ xM: 3.5, yM: 0 });
    expect(c[4]).toMatchObject({ xM: 4, yM: 3 });
  });

  it('an open area 6 x 4 m less a 0.5 m border at 1 m spacing: 5 x 3 points, none in the border', () => {
    const poly: [number, number][] = [[0, 0], [6, 0], [6, 4], [0, 4]];
    const a = plannedAreaPoints('A', poly, 0.5, 1);
    expect(a).toHaveLength(15);
    for (const q of a) expect(areaRoleAt([q.xM, q.yM], poly, 0.5)).toBe('area');
    expect(areaRoleAt([0.2, 2], poly, 0.5)).toBe('border');
    expect(areaRoleAt([7, 2], poly, 0.5)).toBeNull();
  });

  it('route roles by distance: centre line within 0.1 m, band within width/4, else border, off the route null', () => {
    const line: [number, number][] = [[0, 0], [10, 0]];
    expect(routeRoleAt([5, 0.05], line, 2)).toBe('centre_line');
    expect(routeRoleAt([5, 0.4], line, 2)).toBe('central_band');
    expect(routeRoleAt([5, 0.8], line, 2)).toBe('border');
    expect(routeRoleAt([5, 1.2], line, 2)).toBeNull();
  });
});

describe('wide escape routes as 2 m strips (EN 1838:2013 via secondary sources: wider routes as several 2 m strips)', () => {
  const close = (a: readonly PlanPoint[], b: readonly PlanPoint[]) => {
    expect(a).toHaveLength(b.length);
    a.forEach((p, i) => { expect(p[0]).toBeCloseTo(b[i][0], 9); expect(p[1]).toBeCloseTo(b[i][1], 9); });
  };

  it('counts strips of at most 2 m: 2 m is one route, 2.01 m two strips, 5 m three of 5/3 m', () => {
    expect([1.2, 2, 2.01, 4, 4.2, 5, 6].map((w) => routeStripCount(w))).toEqual([1, 1, 2, 2, 3, 3, 3]);
  });

  it('offsets a polyline with mitred corners (worked by hand: an L turning left, 0.9 m to either side)', () => {
    const l: PlanPoint[] = [[0, 0], [10, 0], [10, 10]];
    close(offsetPolyline(l, 0.9), [[0, 0.9], [9.1, 0.9], [9.1, 10]]);
    close(offsetPolyline(l, -0.9), [[0, -0.9], [10.9, -0.9], [10.9, 10]]);
    // Each offset segment lies exactly |d| from the original (checked at its mid-point, away from the corners).
    const zig: PlanPoint[] = [[0, 0], [4, 3], [9, 1], [12, 6]];
    for (const d of [0.7, -1.3]) {
      const o = offsetPolyline(zig, d);
      for (let i = 1; i < o.length; i++) expect(distanceToPolyline([(o[i][0] + o[i - 1][0]) / 2, (o[i][1] + o[i - 1][1]) / 2], zig)).toBeCloseTo(Math.abs(d), 9);
    }
  });

  it('splits a 3.6 m route into two 1.8 m strips 0.9 m either side of its centre line, strip 1 on the left', () => {
    const s = routeStrips([[0, 5], [20, 5]], 3.6);
    expect(s.map((x) => x.widthM)).toEqual([1.8, 1.8]);
    close(s[0].line, [[0, 5.9], [20, 5.9]]);
    close(s[1].line, [[0, 4.1], [20, 4.1]]);
    const three = routeStrips([[0, 5], [20, 5]], 5);
    expect(three.map((x) => x.line[0][1])).toEqual([5 + 5 / 3, 5, 5 - 5 / 3].map((v) => expect.closeTo(v, 9)));
    expect(routeStrips([[0, 5], [20, 5]], 2)).toEqual([{ index: 1, widthM: 2, line: [[0, 5], [20, 5]] }]);
  });

  it('plans each strip as a route of its own (labels R1-S1-C01, band at ±width/8) and places a positioned reading in the nearest strip', () => {
    const p = plannedRoutePoints('R1', [[0, 5], [8, 5]], 3.6, 4);
    expect(p.filter((q) => q.strip === 1).map((q) => q.label)).toEqual(['R1-S1-C01', 'R1-S1-L01', 'R1-S1-R01', 'R1-S1-C02', 'R1-S1-L02', 'R1-S1-R02', 'R1-S1-C03', 'R1-S1-L03', 'R1-S1-R03']);
    expect(p.find((q) => q.label === 'R1-S2-C02')).toMatchObject({ xM: 4, yM: 4.1, role: 'centre_line', strip: 2 });
    expect(p.find((q) => q.label === 'R1-S1-L01')).toMatchObject({ yM: 6.35, role: 'central_band' });
    expect(plannedRoutePoints('R1', [[0, 5], [8, 5]], 2, 4).every((q) => q.strip === undefined && /^R1-[CLR]\d\d$/.test(q.label))).toBe(true);
    const line: PlanPoint[] = [[0, 5], [20, 5]];
    expect(routeStripRoleAt([10, 5.9], line, 3.6)).toEqual({ role: 'centre_line', strip: 1 });
    expect(routeStripRoleAt([10, 4.5], line, 3.6)).toEqual({ role: 'central_band', strip: 2 });
    expect(routeStripRoleAt([10, 5.05], line, 3.6)).toEqual({ role: 'border', strip: 1 });
    expect(routeStripRoleAt([10, 7], line, 3.6)).toBeNull();
    expect(routeStripRoleAt([10, 5.05], line, 1.6)).toEqual({ role: 'centre_line', strip: null });
  });
});

describe('the pass a log says (project\'s rule: the surveyor\'s word first, time as the fallback)', () => {
  const off = Date.parse('2026-11-18T19:00:00Z');
  it('takes the log\'s pass when given, else splits by half the rated duration; before the mains failed it is no pass either way', () => {
    expect(passOfLoggedReading(off + 80 * 60_000, off, 180, null)).toBe('initial');
    expect(passOfLoggedReading(off + 80 * 60_000, off, 180, 'end_of_duration')).toBe('end_of_duration');
    expect(passOfLoggedReading(off + 170 * 60_000, off, 180, 'initial')).toBe('initial');
    expect(passOfLoggedReading(off + 170 * 60_000, off, 180, null)).toBe('end_of_duration');
    expect(passOfLoggedReading(off - 60_000, off, 180, 'initial')).toBeNull();
  });
});
