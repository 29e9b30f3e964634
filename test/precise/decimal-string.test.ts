import { describe, expect, it } from 'vitest';
import { UserError } from '../../src/check/user-error.js';
import { decimalToNumber, isDecimal, parseDecimal, parseDecimalPair } from '../../src/precise/decimal-string.js';

describe('parseDecimal', () => {
  it('parseDecimal("-1.750e-2") gives sign -1, mantissa 1750, exponent -5', () => {
    const d = parseDecimal('-1.750e-2', 'x');
    expect([d.sign, d.mantissa, d.exponent]).toEqual([-1, 1750n, -5]);
  });
  it('parseDecimal accepts ".5", "5.", "+3", "007"', () => {
    expect(decimalToNumber(parseDecimal('.5', 'x'))).toBe(0.5);
    expect(decimalToNumber(parseDecimal('5.', 'x'))).toBe(5);
    expect(decimalToNumber(parseDecimal('+3', 'x'))).toBe(3);
    expect(parseDecimal('007', 'x').mantissa).toBe(7n);
  });
  it('parseDecimal rejects non-decimals with a UserError naming the field', () => {
    for (const bad of ['', '.', '1e', 'abc', '0x10', 'Infinity', 'NaN', '1,5', '1e999999', '- 1']) {
      expect(() => parseDecimal(bad, 'centre re')).toThrow(UserError);
      expect(() => parseDecimal(bad, 'centre re')).toThrow(/^Expected .* for centre re but received/);
    }
    expect(isDecimal('1e-30')).toBe(true);
    expect(isDecimal('1e-300000')).toBe(false);
  });
  it('parseDecimalPair("-0.75,0.1") splits at the comma; "1" alone is an error', () => {
    const p = parseDecimalPair('-0.75,0.1', 'near');
    expect([decimalToNumber(p.re), decimalToNumber(p.im)]).toEqual([-0.75, 0.1]);
    expect(() => parseDecimalPair('1', 'near')).toThrow(/for near but received "1"/);
    expect(() => parseDecimalPair('1,2,3', 'near')).toThrow(UserError);
  });
});
