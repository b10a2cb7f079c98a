import { describe, it, expect } from 'vitest';
import { symmetricTicks } from '@/features/calibration/components/format';

describe('residual axis ticks', () => {
  it('are round and symmetric about zero, covering the largest residual (not −85, −40, 4.7, 50, 85)', () => {
    expect(symmetricTicks(85)).toEqual([-100, -50, 0, 50, 100]);
    expect(symmetricTicks(4.2)).toEqual([-5, 0, 5]);
    expect(symmetricTicks(0)).toEqual([-1, 0, 1]);
    for (const m of [0.37, 12, 999, 12345]) {
      const t = symmetricTicks(m);
      expect(t[0]).toBe(-t[t.length - 1]);
      expect(t[t.length - 1]).toBeGreaterThanOrEqual(m);
      expect(t).toContain(0);
    }
  });
});
