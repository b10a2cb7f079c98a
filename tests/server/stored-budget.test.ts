import { describe, it, expect } from 'vitest';
import { decodeBudget, encodeBudget } from '@server/modules/readings/stored-budget';
import type { BudgetPart } from '@shared/core/types';

describe('stored uncertainty budget', () => {
  const parts: BudgetPart[] = [
    { name: 'calibration', uRel: 0.021 }, { name: 'quantisation', uRel: 0.000123456789012345 }, { name: 'dark_offset', uRel: 0.0031 }, { name: 'temperature', uRel: 0.0047 },
  ];

  it('encode then decode, for a counting budget, gives back every part, in order, to the last digit', () => {
    expect(decodeBudget(JSON.parse(encodeBudget(parts)))).toEqual(parts);
  });

  it('encode, for a counting budget, is at most about half the spelled-out JSON', () => {
    expect(encodeBudget(parts).length).toBeLessThan(JSON.stringify(parts).length * 0.6);
  });

  it('encode, for a part that is not a finite number, leaves that part out', () => {
    expect(decodeBudget(JSON.parse(encodeBudget([{ name: 'transmitter', uRel: Number.NaN }, { name: 'calibration', uRel: 0.01 }])))).toEqual([{ name: 'calibration', uRel: 0.01 }]);
  });

  it('decode, for the earlier spelled-out array, reads it unchanged; for anything else, gives no parts', () => {
    expect(decodeBudget(parts)).toEqual(parts);
    for (const junk of [null, 'x', 3, { z: 0.1 }]) expect(decodeBudget(junk)).toEqual([]);
  });
});
