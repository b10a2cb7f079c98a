import { describe, it, expect } from 'vitest';
import { zoneVerdictCountsText } from '@shared/schemas/compliance';

describe('zone verdicts counted in words (sign-off e-mail and report summary)', () => {
  it('agrees each count with its verb, one and many', () => {
    expect(zoneVerdictCountsText({ meets: 1, falls_short: 1, inconclusive: 1, not_assessed: 1 }))
      .toBe('4 zones: 1 meets its target, 1 falls short, 1 is inconclusive, 1 is not assessed');
    expect(zoneVerdictCountsText({ meets: 6, falls_short: 5, inconclusive: 3, not_assessed: 0 }))
      .toBe('14 zones: 6 meet their target, 5 fall short, 3 are inconclusive, 0 are not assessed');
    expect(zoneVerdictCountsText({ meets: 1, falls_short: 0, inconclusive: 0, not_assessed: 0 })).toMatch(/^1 zone: /);
  });
});
