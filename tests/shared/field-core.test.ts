import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { METER_CLASS_LIMIT, manualMeterPart, typedReading, typedValueProblem, type ManualMeter } from '@shared/core/typed-readings';
import { MAX_PAIR_GAP_MS, pairedSubtraction } from '@shared/core/paired-daylight';
import { conditionWarnings, WARM_UP_MS } from '@shared/core/field-conditions';
import { clockOffsetFromAlignment, DEFAULT_MATCH_WINDOW_MS, matchBurstsToMarks } from '@shared/core/mark-matching';
import { footcandlesToLux } from '@shared/core/units';
import { meanUncertainty } from '@shared/core/uncertainty';
import { DecodeError } from '@shared/core/errors';

const classB: ManualMeter = { accuracy: { kind: 'class', meterClass: 'B' }, rangeLowLux: null, rangeHighLux: 20_000 };

describe('typed readings from a meter that does not log', () => {
  it('DIN 5032-7 class limits 3/5/10/20 % (secondary source) enter the budget as a/sqrt(3) (GUM 4.3.7)', () => {
    expect(METER_CLASS_LIMIT).toEqual({ L: 0.03, A: 0.05, B: 0.1, C: 0.2 });
    expect(manualMeterPart({ kind: 'class', meterClass: 'L' }).uRel).toBeCloseTo(0.017320508, 8);
    expect(manualMeterPart({ kind: 'class', meterClass: 'C' }).uRel).toBeCloseTo(0.115470054, 8);
    // One value from a class B meter: U = 2 * 0.1/sqrt(3) * 500 = 57.735 lx.
    const r = typedReading([500], classB);
    expect(r.lux).toBe(500);
    expect(r.spreadLux).toBeNull();
    expect(r.budget.map((p) => p.name)).toEqual(['meter_class']);
    expect(r.uLux).toBeCloseTo(57.735, 3);
  });

  it('a certificate relative uncertainty (k = 1) is used as it is', () => {
    const r = typedReading([320], { accuracy: { kind: 'certificate', uRel: 0.025 }, rangeLowLux: null, rangeHighLux: null });
    expect(r.budget).toEqual([{ name: 'calibration', uRel: 0.025 }]);
    expect(r.uLux).toBeCloseTo(2 * 0.025 * 320, 10);
  });

  it('several values: the mean, with the spread as s/sqrt(n) (GUM 4.2.3), cross-checked with simple-statistics', () => {
    const values = [512, 498, 505, 520];
    const r = typedReading(values, classB);
    expect(r.lux).toBeCloseTo(ss.mean(values), 12);
    expect(r.spreadLux).toBeCloseTo(ss.sampleStandardDeviation(values), 12);
    const uRep = ss.sampleStandardDeviation(values) / Math.sqrt(4) / ss.mean(values);
    expect(r.budget.find((p) => p.name === 'repeatability')!.uRel).toBeCloseTo(uRep, 12);
    expect(r.uRel).toBeCloseTo(Math.hypot(0.1 / Math.sqrt(3), uRep), 12);
  });

  it('foot-candles typed on the phone are stored in lux (1 fc = 10.7639104167 lx, exact by the foot)', () => {
    expect(typedReading([footcandlesToLux(50)], classB).lux).toBeCloseTo(538.195520835, 8);
  });

  it('refuses a negative value, not a number, and a value beyond the meter range, naming which', () => {
    expect(() => typedReading([400, -3], classB)).toThrow(/Value 2 \(-3\) is negative/);
    expect(() => typedReading([Number.NaN], classB)).toThrow(/not a number/);
    expect(() => typedReading([25_000], classB)).toThrow(/beyond the meter's range \(up to 20000 lx\)/);
    expect(() => typedReading([], classB)).toThrow(DecodeError);
    expect(typedValueProblem(20_000, classB)).toBeNull();
  });

  it('repeatability averages down over a room; the meter class does not (systematic)', () => {
    const rs = [[500, 510], [480, 470], [520, 530]].map((v) => typedReading(v, classB));
    const m = meanUncertainty(rs.map((r, i) => ({
      probe: 'M', point: String(i), timeMs: 0, lux: r.lux, luxBound: 'exact' as const, flag: 'ok' as const, flags: ['ok' as const], gainCode: null, samples: 2,
      chosenSample: null, rejected: [], uRel: r.uRel, uLux: r.uLux, budget: r.budget, coefficientSetId: null,
    })))!;
    expect(m.budget.find((p) => p.name === 'meter_class')!.uRel).toBeCloseTo(0.1 / Math.sqrt(3), 12);
    const rep = m.budget.find((p) => p.name === 'repeatability')!.uRel;
    expect(rep).toBeLessThan(Math.max(...rs.map((r) => r.budget[1].uRel)));
  });
});

describe('paired lights-on / lights-off readings (ASR A3.4 section 7.3)', () => {
  it('worked example from meter documentation: 1235 - 355 = 880 lx (secondary source)', () => {
    const p = pairedSubtraction({ lux: 1235, uLux: 0, timeMs: 0 }, { lux: 355, uLux: 0, timeMs: 40_000 });
    expect(p).toEqual({ ok: true, lux: 880, uLux: 0, gapMs: 40_000 });
  });

  it('combines the two uncertainties in quadrature (GUM 5.1.2, coefficients +1 and -1)', () => {
    const on = typedReading([1235], classB);
    const off = typedReading([355], classB);
    const p = pairedSubtraction({ lux: on.lux, uLux: on.uLux, timeMs: 0 }, { lux: off.lux, uLux: off.uLux, timeMs: 1000 });
    if (!p.ok) throw new Error(p.reason);
    expect(p.uLux).toBeCloseTo(Math.hypot(on.uLux, off.uLux), 10);
    expect(p.uLux).toBeCloseTo(2 * (0.1 / Math.sqrt(3)) * Math.hypot(1235, 355), 8);
  });

  it('refuses a pair further apart than the named limit, and a lights-off reading above lights-on', () => {
    expect(MAX_PAIR_GAP_MS).toBe(300_000);
    const late = pairedSubtraction({ lux: 900, uLux: 10, timeMs: 0 }, { lux: 300, uLux: 5, timeMs: MAX_PAIR_GAP_MS + 1000 });
    expect(late.ok).toBe(false);
    if (!late.ok) expect(late.reason).toMatch(/301 s apart.*at most 300 s/);
    expect(pairedSubtraction({ lux: 900, uLux: 10, timeMs: 0 }, { lux: 300, uLux: 5, timeMs: MAX_PAIR_GAP_MS }).ok).toBe(true);
    const swapped = pairedSubtraction({ lux: 300, uLux: 5, timeMs: 0 }, { lux: 900, uLux: 10, timeMs: 1000 });
    expect(swapped.ok).toBe(false);
  });
});

describe('measurement conditions: warm-up and daylight', () => {
  const on = Date.UTC(2026, 10, 20, 18, 0);
  const session = { lightsOnAt: on, sky: 'night' as const, lampBurnInHours: 2000 };

  it('warm-up time is 30 min (common practice); a reading sooner is warned about with the time', () => {
    expect(WARM_UP_MS).toBe(30 * 60_000);
    const w = conditionWarnings(on + 12 * 60_000, session, { daylightExcluded: true });
    expect(w.map((x) => x.code)).toEqual(['before_warm_up']);
    expect(w[0].message).toMatch(/12 min.*30 min.*common practice/);
    expect(conditionWarnings(on + WARM_UP_MS, session, { daylightExcluded: true })).toEqual([]);
    expect(conditionWarnings(on - 1, session, { daylightExcluded: true }).map((x) => x.code)).toEqual(['before_lights_on']);
  });

  it('daylight where the survey excluded it is warned about, unless the reading is a lights-on/off pair', () => {
    const day = { ...session, sky: 'overcast' as const };
    const t = on + 60 * 60_000;
    expect(conditionWarnings(t, day, { daylightExcluded: true }).map((x) => x.code)).toEqual(['daylight_not_excluded']);
    expect(conditionWarnings(t, day, { daylightExcluded: true }, { paired: true })).toEqual([]);
    expect(conditionWarnings(t, day, { daylightExcluded: false })).toEqual([]);
  });

  it('lamps burnt in for less than about 100 h (secondary source) are warned about', () => {
    expect(conditionWarnings(on + WARM_UP_MS, { ...session, lampBurnInHours: 20 }, { daylightExcluded: false }).map((x) => x.code)).toEqual(['lamps_not_burnt_in']);
  });
});

describe('placing a label-free log by time', () => {
  const T = Date.UTC(2026, 10, 20, 9, 0);
  const marks = [
    { id: 1, timeMs: T, probe: null },
    { id: 2, timeMs: T + 60_000, probe: 'LX-4102' },
    { id: 3, timeMs: T + 120_000, probe: null },
  ];

  it('each burst goes to the mark nearest in time within ±20 s by default, the same probe where the mark names one', () => {
    expect(DEFAULT_MATCH_WINDOW_MS).toBe(20_000);
    const m = matchBurstsToMarks([
      { id: 10, timeMs: T + 4000, probe: 'LX-4102' },
      { id: 11, timeMs: T + 61_000, probe: 'LX-4107' }, // mark 2 names another probe
      { id: 12, timeMs: T + 135_000, probe: 'LX-4102' },
      { id: 13, timeMs: T + 200_000, probe: 'LX-4102' },
    ], marks);
    expect(m.matched).toEqual([{ burstId: 10, markId: 1, deltaMs: 4000 }, { burstId: 12, markId: 3, deltaMs: 15_000 }]);
    expect(m.unplaced.map((u) => [u.burstId, u.reason])).toEqual([[11, 'no_mark'], [13, 'no_mark']]);
    expect(m.marksWithoutBurst).toEqual([2]);
  });

  it('a meter clock 95 s slow: nothing matches without the offset; an offset found by aligning one mark places them all', () => {
    const bursts = [0, 60_000, 120_000].map((d, i) => ({ id: 20 + i, timeMs: T + d - 95_000 + i * 1000, probe: 'LX-4102' }));
    expect(matchBurstsToMarks(bursts, marks).matched).toEqual([]);
    const offset = clockOffsetFromAlignment(marks[0].timeMs, bursts[0].timeMs);
    expect(offset).toBe(95_000);
    const m = matchBurstsToMarks(bursts, marks, { clockOffsetMs: offset });
    expect(m.matched.map((x) => [x.burstId, x.markId])).toEqual([[20, 1], [21, 2], [22, 3]]);
    expect(m.unplaced).toEqual([]);
  });

  it('a burst two marks could claim is never guessed: it is unplaced with both marks named', () => {
    const close = [{ id: 1, timeMs: T, probe: null }, { id: 2, timeMs: T + 30_000, probe: null }];
    const m = matchBurstsToMarks([{ id: 30, timeMs: T + 16_000, probe: 'P' }], close);
    expect(m.matched).toEqual([]);
    expect(m.unplaced[0]).toMatchObject({ burstId: 30, reason: 'ambiguous', markIds: [1, 2] });
    expect(m.marksWithoutBurst).toEqual([1, 2]);
  });

  it('a mark takes one burst: the nearer; a second burst to the same mark, or a tie, is unplaced', () => {
    const one = [{ id: 1, timeMs: T, probe: null }];
    const m = matchBurstsToMarks([{ id: 40, timeMs: T + 3000, probe: 'P' }, { id: 41, timeMs: T - 9000, probe: 'P' }], one);
    expect(m.matched).toEqual([{ burstId: 40, markId: 1, deltaMs: 3000 }]);
    expect(m.unplaced[0]).toMatchObject({ burstId: 41, reason: 'mark_taken' });
    const tie = matchBurstsToMarks([{ id: 42, timeMs: T + 5000, probe: 'P' }, { id: 43, timeMs: T - 5000, probe: 'P' }], one);
    expect(tie.matched).toEqual([]);
    expect(tie.unplaced.map((u) => u.reason)).toEqual(['ambiguous', 'ambiguous']);
  });

  it('property: no burst is placed twice, no mark takes two bursts, and every burst is either placed or listed', () => {
    fc.assert(fc.property(
      fc.array(fc.integer({ min: 0, max: 600 }), { maxLength: 30 }),
      fc.array(fc.integer({ min: 0, max: 600 }), { maxLength: 20 }),
      fc.integer({ min: 0, max: 60 }),
      (b, mk, w) => {
        const m = matchBurstsToMarks(b.map((s, i) => ({ id: i, timeMs: s * 1000, probe: 'P' })), mk.map((s, i) => ({ id: i, timeMs: s * 1000, probe: null })), { windowMs: w * 1000 });
        const placed = m.matched.map((x) => x.burstId);
        expect(new Set(placed).size).toBe(placed.length);
        expect(new Set(m.matched.map((x) => x.markId)).size).toBe(m.matched.length);
        expect(placed.length + m.unplaced.length).toBe(b.length);
        for (const x of m.matched) expect(Math.abs(x.deltaMs)).toBeLessThanOrEqual(w * 1000);
      },
    ));
  });
});
