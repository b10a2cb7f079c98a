import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { plainDecimal } from '@server/modules/imports/log-parser';

// The log parser's fast path for plain decimals must give exactly the double Number() gives
// (ECMAScript StringToNumber, correctly rounded): checked against it as the reference.
describe('plain decimals in a log', () => {
  it('plainDecimal, for any decimal of at most 15 digits with or without a sign or point, equals Number(text) to the bit', () => {
    const decimal = fc.tuple(fc.boolean(), fc.stringMatching(/^[0-9]{0,9}$/), fc.option(fc.stringMatching(/^[0-9]{0,6}$/), { nil: undefined }))
      .map(([neg, int, frac]) => `${neg ? '-' : ''}${int}${frac === undefined ? '' : `.${frac}`}`)
      .filter((t) => /[0-9]/.test(t));
    fc.assert(fc.property(decimal, (t) => Object.is(plainDecimal(t), Number(t))), { numRuns: 20_000 });
  });

  it('plainDecimal, for values where one division could be tempted to round wrongly, still equals Number', () => {
    for (const t of ['0.1', '0.3', '29.78', '21.5', '-0', '-0.0', '5.', '.5', '999999999999999', '0.00000000000001', '123456.789012345', '4.35', '1.005', '-273.15', '0000.0001']) {
      expect(Object.is(plainDecimal(t), Number(t)), t).toBe(true);
    }
  });

  it('plainDecimal, for anything that is not a plain decimal, answers NaN so the strict path decides', () => {
    for (const t of ['', '-', '.', '+5', '1e3', '1.2.3', '12a', '1 2', '0x10', '1,5', 'Infinity', '--5', '1234567890123456']) {
      expect(plainDecimal(t), t).toBeNaN();
    }
  });
});
