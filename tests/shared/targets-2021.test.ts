import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  designValue, designValueProblems, ILLUMINANCE_SCALE_LUX, isOnScale, stepAlongScale, stepsBetween,
} from '@shared/core/illuminance-scale';
import { installationText, limitFor, maintenanceFactor, maintenanceStatus } from '@shared/core/maintained';
import {
  backgroundEmFor, cylindricalFromVertical, modellingRatio, MODELLING_RANGE, surroundingEmFor,
} from '@shared/core/planes';

describe('illuminance scale (EN 12464-1, secondary: DOMAIN.md section 5)', () => {
  it('when stepping from 500 lx, one step up is 750 lx and two steps 1000 lx (issue #15 check, secondary)', () => {
    expect(stepAlongScale(500, 1)).toBe(750);
    expect(stepAlongScale(500, 2)).toBe(1000);
    expect(stepAlongScale(500, -1)).toBe(300);
    expect(stepsBetween(500, 1000)).toBe(2);
  });

  it('when a value is off the scale or a step runs past its ends, gives no value', () => {
    expect(isOnScale(400)).toBe(false);
    expect(stepAlongScale(400, 1)).toBeNull();
    expect(stepAlongScale(5000, 1)).toBeNull();
    expect(stepAlongScale(20, -1)).toBeNull();
  });

  it('property: neighbouring steps differ by a factor between 1.33 and 1.67 (the scale\'s "about 1.5", secondary)', () => {
    for (let i = 1; i < ILLUMINANCE_SCALE_LUX.length; i++) {
      const r = ILLUMINANCE_SCALE_LUX[i] / ILLUMINANCE_SCALE_LUX[i - 1];
      expect(r).toBeGreaterThanOrEqual(1.33);
      expect(r).toBeLessThanOrEqual(1.67);
    }
  });

  it('property: stepping up n and down n returns to the start', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 14 }), fc.integer({ min: -14, max: 14 }), (i, n) => {
      const up = stepAlongScale(ILLUMINANCE_SCALE_LUX[i], n);
      if (up !== null) expect(stepAlongScale(up, -n)).toBe(ILLUMINANCE_SCALE_LUX[i]);
    }));
  });
});

describe('required and modified values with context modifiers (EN 12464-1:2021 5.3.3, list from memory)', () => {
  const office = { requiredLux: 500, modifiedLux: 1000 };

  it('when no value is chosen, judges against the required value', () => {
    const d = designValue({ ...office, chosenLux: null, modifiers: [] });
    expect(d).toMatchObject({ emLux: 500, basis: 'required', steps: 0 });
    expect(d.explanation).toMatch(/required value 500 lx/);
  });

  it('when the design chose the modified 1000 lx for critical work, judges against 1000 lx and says why (office: 500 / 1000 lx, secondary)', () => {
    const d = designValue({ ...office, chosenLux: 1000, modifiers: ['critical_work', 'long_duration'] });
    expect(d).toMatchObject({ emLux: 1000, basis: 'modified', steps: 2 });
    expect(d.explanation).toMatch(/modified value 1000 lx, 2 step\(s\) above the required 500 lx, because: visual work is critical; the task is done/);
  });

  it('when 750 lx is chosen, it is a stepped value between required and modified', () => {
    expect(designValue({ ...office, chosenLux: 750, modifiers: ['low_daylight'] })).toMatchObject({ emLux: 750, basis: 'stepped', steps: 1 });
  });

  it('when the chosen value passes the modified one, lacks a reason, or is off the scale, falls back to the required value with the problems', () => {
    expect(designValueProblems({ ...office, chosenLux: 1500, modifiers: ['critical_work'] })).toEqual(["It is above the entry's modified value 1000 lx."]);
    expect(designValueProblems({ ...office, chosenLux: 750, modifiers: [] })[0]).toMatch(/raising context modifier/);
    expect(designValueProblems({ ...office, chosenLux: 300, modifiers: ['critical_work'] })[0]).toMatch(/lowering context modifier/);
    expect(designValueProblems({ ...office, chosenLux: 200, modifiers: ['short_duration'] })[0]).toMatch(/at most one step/);
    expect(designValueProblems({ ...office, chosenLux: 600, modifiers: ['critical_work'] })[0]).toMatch(/steps of the illuminance scale/);
    const d = designValue({ ...office, chosenLux: 1500, modifiers: ['critical_work'] });
    expect(d).toMatchObject({ emLux: 500, basis: 'required' });
    expect(d.explanation).toMatch(/cannot be used/);
  });

  it('when a lowering modifier applies, one step down is accepted (300 lx from 500 lx)', () => {
    expect(designValue({ ...office, chosenLux: 300, modifiers: ['short_duration'] })).toMatchObject({ emLux: 300, steps: -1, basis: 'stepped' });
  });
});

describe('maintained and new installations (CIE 97:2005; checks from secondary sources)', () => {
  it('MF is the product of its parts LLMF × LSF × LMF × RSMF (CIE 97:2005, formula; figures our own)', () => {
    expect(maintenanceFactor({ llmf: 0.9, lsf: 1, lmf: 0.9, rsmf: 0.95 })).toBeCloseTo(0.7695, 12);
    expect(() => maintenanceFactor({ llmf: 1.2, lsf: 1, lmf: 1, rsmf: 1 })).toThrow(/llmf/);
  });

  it('when new, 1000 lx at MF 0.8 needs 1250 lx; 500 lx at MF 0.7 needs 714.3 lx (secondary)', () => {
    expect(limitFor(1000, { state: 'new', maintenanceFactor: 0.8 })).toBeCloseTo(1250, 9);
    expect(Number(limitFor(500, { state: 'new', maintenanceFactor: 0.7 }).toFixed(1))).toBe(714.3);
    expect(limitFor(500, { state: 'in_service' })).toBe(500);
  });

  it('the report text says which case applied and the limit', () => {
    expect(installationText(1000, { state: 'new', maintenanceFactor: 0.8 })).toMatch(/New installation.*1000 lx \/ 0.8.*= 1250 lx/);
    expect(installationText(500, { state: 'in_service' })).toMatch(/in service.*500 lx/);
  });

  it('property: a new installation\'s limit is never below Ēm', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 5000, noNaN: true }), fc.double({ min: 0.05, max: 1, noNaN: true }), (em, mf) => {
      expect(limitFor(em, { state: 'new', maintenanceFactor: mf })).toBeGreaterThanOrEqual(em - 1e-9);
    }));
  });
});

describe('maintenance due (Luxtrail rule: below Ēm now, or a falling least-squares trend reaching it within a year)', () => {
  const day = 24 * 3600 * 1000;
  const year = 365.25 * day;

  it('when the latest signed-off value is below Ēm, maintenance is due', () => {
    expect(maintenanceStatus([{ timeMs: 0, eavg: 620 }, { timeMs: year, eavg: 480 }], 500).state).toBe('due');
  });

  it('when values fall 100 lx a year and stand at 560 lx against 500 lx, it is due soon (line reaches 500 lx in 0.6 years)', () => {
    const s = maintenanceStatus([{ timeMs: 0, eavg: 760 }, { timeMs: year, eavg: 660 }, { timeMs: 2 * year, eavg: 560 }], 500);
    expect(s.state).toBe('due_soon');
    expect(s.slopeLuxPerYear).toBeCloseTo(-100, 9);
    expect((s.reachesTargetAtMs as number) / year).toBeCloseTo(2.6, 9);
  });

  it('when the trend is flat or rising, or far from the target, it is not due', () => {
    expect(maintenanceStatus([{ timeMs: 0, eavg: 700 }, { timeMs: year, eavg: 720 }], 500).state).toBe('ok');
    expect(maintenanceStatus([{ timeMs: 0, eavg: 900 }, { timeMs: year, eavg: 880 }], 500).state).toBe('ok');
    expect(maintenanceStatus([], 500).state).toBe('unknown');
  });
});

describe('cylindrical illuminance and modelling', () => {
  it('when four vertical readings face 90° apart, Ēz is their mean (secondary: DOMAIN.md section 10)', () => {
    const r = cylindricalFromVertical([{ azimuthDeg: 0, lux: 200 }, { azimuthDeg: 90, lux: 150 }, { azimuthDeg: 180, lux: 100 }, { azimuthDeg: 270, lux: 150 }]);
    expect(r).toEqual({ ok: true, ezLux: 150, azimuthsDeg: [0, 90, 180, 270] });
  });

  it('when the set is incomplete or not spread 90° apart, refuses with the reason', () => {
    const three = cylindricalFromVertical([{ azimuthDeg: 0, lux: 1 }, { azimuthDeg: 90, lux: 1 }, { azimuthDeg: 180, lux: 1 }]);
    expect(three.ok).toBe(false);
    const skew = cylindricalFromVertical([{ azimuthDeg: 0, lux: 1 }, { azimuthDeg: 45, lux: 1 }, { azimuthDeg: 180, lux: 1 }, { azimuthDeg: 270, lux: 1 }]);
    expect(skew.ok === false && skew.reason).toMatch(/90° apart/);
    // Starting direction is free and wraps around north.
    expect(cylindricalFromVertical([{ azimuthDeg: 350, lux: 4 }, { azimuthDeg: 80, lux: 4 }, { azimuthDeg: 170, lux: 4 }, { azimuthDeg: 260, lux: 4 }]).ok).toBe(true);
  });

  // Derived check (our own integration): a point source at elevation e with normal illuminance En gives a
  // vertical plane facing azimuth t the illuminance En cos e max(0, cos(phi - t)); the true cylindrical
  // illuminance is the mean over the cylinder's surface, En cos e / pi. In a uniformly diffuse field of
  // luminance L every plane receives pi L, so the four-reading mean is exact there.
  it('against the definition: exact in a uniform field, within pi/4 .. pi*sqrt2/4 of the truth for one point source', () => {
    const uniform = cylindricalFromVertical([0, 90, 180, 270].map((a) => ({ azimuthDeg: a, lux: Math.PI * 40 })));
    expect(uniform.ok && uniform.ezLux).toBeCloseTo(Math.PI * 40, 12);
    fc.assert(fc.property(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 0, max: 1.5, noNaN: true }), (phiDeg, elev) => {
      const en = 1000;
      const vertical = (t: number) => en * Math.cos(elev) * Math.max(0, Math.cos(((phiDeg - t) * Math.PI) / 180));
      // The true value by numerical integration around the cylinder (3600 slices).
      let sum = 0;
      for (let k = 0; k < 3600; k++) sum += vertical(k / 10);
      const exact = (en * Math.cos(elev)) / Math.PI;
      if (exact < 1e-6) return;
      expect(sum / 3600 / exact).toBeCloseTo(1, 5);
      const truth = exact;
      const r = cylindricalFromVertical([0, 90, 180, 270].map((a) => ({ azimuthDeg: a, lux: vertical(a) })));
      if (!r.ok) return;
      expect(r.ezLux / truth).toBeGreaterThanOrEqual(Math.PI / 4 - 1e-9);
      expect(r.ezLux / truth).toBeLessThanOrEqual((Math.PI * Math.SQRT2) / 4 + 1e-9);
    }));
  });

  it('modelling ratio Ēz / Ēh, and the 2011 recommendation 0.30 .. 0.60 (secondary)', () => {
    expect(modellingRatio(150, 500)).toBeCloseTo(0.3, 12);
    expect(modellingRatio(150, 0)).toBeNull();
    expect(MODELLING_RANGE).toMatchObject({ min: 0.3, max: 0.6 });
  });
});

describe('areas around a task (EN 12464-1:2011 Table 1 as quoted in secondary sources; background from 2021, secondary)', () => {
  it('immediate surrounding: 750 → 500, 500 → 300, 300 → 200, 200 → 200 lx', () => {
    expect([1000, 750, 500, 300, 200, 150].map(surroundingEmFor)).toEqual([500, 500, 300, 200, 200, 150]);
  });

  it('background: a third of the surrounding (300 lx surrounding → 100 lx)', () => {
    expect(backgroundEmFor(300)).toBeCloseTo(100, 12);
  });
});
