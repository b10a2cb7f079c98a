// Test probe shared by the core tests. Values are invented for tests, not from any real probe.
import type { CoefficientSet, CountingProbe } from '@shared/core/types';

export const probe: CountingProbe = {
  kind: 'counts',
  fullScaleCounts: 65535,
  saturationCounts: 65000,
  floorCounts: 200,
  gains: [
    { code: 0, nominalGain: 1 },
    { code: 1, nominalGain: 8 },
    { code: 2, nominalGain: 64 },
    { code: 3, nominalGain: 512 },
  ],
};

/** Lux per count at gain 1: full scale at gain code 0 is about 130 klx. */
export const LPC0 = 2;

export function makeSet(id: string, effectiveFrom: number, over: Partial<CoefficientSet> = {}): CoefficientSet {
  return {
    id,
    effectiveFrom,
    dueDate: null,
    tRefMs: 100,
    alphaPerK: -0.002,
    tCalC: 25,
    gains: probe.gains.map((g) => ({ code: g.code, darkCounts: 40 + g.code * 5, luxPerCount: LPC0 / g.nominalGain, uRel: 0.015, uDarkCounts: 1 })),
    ...over,
  };
}

export const setA = makeSet('A', 0);
