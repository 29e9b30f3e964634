import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { accelerate, agreeingDigits, aitkenPass } from '../../src/section/accelerate.js';

const D = Decimal.clone({ precision: 60 });

describe('aitkenPass', () => {
  it('aitkenPass returns the exact limit of L + a q^n (exact algebra of the delta-squared formula)', () => {
    const xs = [0, 1, 2, 3].map((n) => new D(3).plus(new D('0.2').pow(n).times(5)));
    for (const v of aitkenPass(xs)) expect(v.minus(3).abs().lt(1e-50)).toBe(true);
  });
});

describe('accelerate', () => {
  it('accelerate removes two geometric error terms and claims only digits it has', () => {
    // x_n = pi + 2 (1/4.669)^n + 3 (1/21.8)^n: two passes make it nearly exact.
    const pi = D.acos(-1);
    const xs = Array.from({ length: 12 }, (_, n) => pi.plus(new D(2).div(new D('4.669').pow(n))).plus(new D(3).div(new D('21.8').pow(n))));
    const a = accelerate(xs, 40);
    expect(a.passes).toBeGreaterThanOrEqual(1);
    expect(a.digits).toBeGreaterThan(10);
    // Every digit claimed is right.
    expect(agreeingDigits(a.value, pi, 60)).toBeGreaterThanOrEqual(a.digits);
  });

  it('accelerate claims no digits for a sequence that does not settle', () => {
    const xs = [1, -1, 1, -1, 1].map((v) => new D(v));
    expect(accelerate(xs, 30).digits).toBe(0);
  });
});
