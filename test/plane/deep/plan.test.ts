import { describe, expect, it } from 'vitest';
import { deepPlan, log2Decimal } from '../../../src/plane/deep/plan.js';

describe('deepPlan', () => {
  it('keeps doubles for a span of 1e-9 at 1000 pixels near -0.75 (spacing 2^-49.8 > 2^-42 * 1)', () => {
    // log2(1e-12) = -39.86 (exact algebra: -12 log2 10)
    expect(deepPlan({ re: '-0.75', im: '0.1' }, '1e-9', 1000).arithmetic).toBe('double');
  });

  it('switches to deep at a span of 1e-11 at 1000 pixels (spacing 1e-14 = 2^-46.5)', () => {
    const p = deepPlan({ re: '-0.75', im: '0.1' }, '1e-11', 1000);
    expect(p.arithmetic).toBe('deep');
    expect(p.unitExponent).toBe(0);
    expect(p.bits).toBe(Math.ceil(14 * Math.log2(10)) + 64);
  });

  it('picks a tile unit below 2^-900: span 1e-320 gives U = floor(log2 1e-320) - 8 = -1072', () => {
    // log2(1e-320) = -1063.02 (exact algebra: -320 log2 10)
    const p = deepPlan({ re: '0', im: '1' }, '1e-320', 640);
    expect(p.unitExponent).toBe(-1072);
    expect(p.log2Spacing).toBeCloseTo(-320 * Math.log2(10) - Math.log2(640), 9);
  });

  it('log2Decimal reads long mantissas and exponents without a double parse', () => {
    expect(log2Decimal('1024', 'x')).toBeCloseTo(10, 12);
    expect(log2Decimal(`3${'0'.repeat(400)}e-500`, 'x')).toBeCloseTo(Math.log2(3) - 100 * Math.log2(10), 9);
    expect(log2Decimal('0', 'x')).toBe(-Infinity);
  });
});
