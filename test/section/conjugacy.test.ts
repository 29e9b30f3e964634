import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { cToR, rToC, xToZ, zToX } from '../../src/section/conjugacy.js';

describe('conjugacy', () => {
  // Exact algebra (docs/checks.md "Conversion"): c = r/2 - r^2/4.
  it('rToC maps r = 3 and r = 4 to c = -3/4 and -2 exactly', () => {
    expect(rToC('3', 30)).toBe('-0.75');
    expect(rToC('4', 30)).toBe('-2');
    expect(rToC('1', 30)).toBe('0.25');
  });

  it('cToR maps c = -5/4 and -7/4 to 1 + sqrt 6 and 1 + sqrt 8 at 50 digits', () => {
    const D = Decimal.clone({ precision: 80 });
    // Exact: r = 1 + sqrt(1 - 4c) with c = -5/4 gives 1 + sqrt 6; c = -7/4 gives 1 + sqrt 8.
    expect(cToR('-1.25', 50)).toBe(new D(6).sqrt().plus(1).toSignificantDigits(50).toString());
    expect(cToR('-1.75', 50)).toBe(new D(8).sqrt().plus(1).toSignificantDigits(50).toString());
  });

  it('cToR(rToC(r)) returns r on the branch r >= 1 at 60 digits', () => {
    // Round trip through the exact algebra of docs/methods.md E1.
    const r = '3.56994567187094490184200515138649893676';
    expect(cToR(rToC(r, 70), 39)).toBe(r);
    // r and 2 - r share c; the inverse picks r >= 1.
    expect(cToR(rToC('0.5', 30), 30)).toBe('1.5');
  });

  it('cToR rejects c > 1/4 with a RangeError', () => {
    expect(() => cToR('0.2500000001', 20)).toThrow(RangeError);
  });

  it('xToZ flips orientation: x > 1/2 gives z < 0 and zToX inverts it', () => {
    // docs/checks.md "Conversion": x > 1/2 exactly when z < 0.
    expect(xToZ('0.75', '4', 20)).toBe('-1');
    expect(xToZ('0.25', '4', 20)).toBe('1');
    expect(xToZ('0.5', '3.7', 20)).toBe('0');
    expect(zToX('-1', '4', 20)).toBe('0.75');
    expect(zToX(xToZ('0.123456789012345678901', '3.83', 40), '3.83', 21)).toBe('0.123456789012345678901');
  });

  it('xToZ conjugates one logistic step to one quadratic step', () => {
    // z' = z^2 + c must equal r(1/2 - r x(1 - x)) (docs/methods.md E1).
    const D = Decimal.clone({ precision: 60 });
    const r = '3.7';
    const x = '0.3';
    const xNext = new D(r).times(x).times(new D(1).minus(x)).toString();
    const z = new D(xToZ(x, r, 50));
    const c = new D(rToC(r, 50));
    expect(z.pow(2).plus(c).toSignificantDigits(40).toString()).toBe(new D(xToZ(xNext, r, 50)).toSignificantDigits(40).toString());
  });
});
