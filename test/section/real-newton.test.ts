import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { findNucleus } from '../../src/components/nucleus.js';
import { cToR } from '../../src/section/conjugacy.js';
import { logistic, sine } from '../../src/section/families/index.js';
import { multiplierParameter, superstableParameter } from '../../src/section/real-newton.js';

const D = Decimal.clone({ precision: 60 });

describe('superstableParameter', () => {
  it('superstableParameter(logistic, 2) is 1 + sqrt 5 to 40 digits', () => {
    // docs/checks.md "superstable period-2 logistic parameter" (exact).
    const r = superstableParameter(logistic, 2, '3.2', 40);
    expect(r.converged).toBe(true);
    expect(r.r.minus(new D(5).sqrt().plus(1)).abs().toNumber()).toBeLessThan(1e-40);
  });

  it('superstableParameter agrees with the plane nucleus Newton (findNucleus) for period 5', () => {
    // Two paths: decimal.js in r against BigInt in c plus the conjugacy (docs/methods.md C2, E1).
    const plane = findNucleus(5, { re: '-1.625', im: '0' }, 35).nucleus.re;
    const r = superstableParameter(logistic, 5, cToR(plane, 10), 35);
    expect(r.r.minus(cToR(plane, 40)).abs().toNumber()).toBeLessThan(1e-32);
  });

  it('superstableParameter(sine, 2) solves r sin(pi r) = 1/2', () => {
    const r = superstableParameter(sine, 2, '0.78', 30).r;
    expect(
      r
        .times(D.sin(D.acos(-1).times(r)))
        .minus('0.5')
        .abs()
        .toNumber(),
    ).toBeLessThan(1e-30);
  });
});

describe('multiplierParameter', () => {
  it('multiplierParameter gives the exact doublings r = 3 (period 1) and 1 + sqrt 6 (period 2)', () => {
    // docs/checks.md "first period doublings" (exact).
    expect(multiplierParameter(logistic, 1, -1, '2.9', '0.6', 40).r.minus(3).abs().toNumber()).toBeLessThan(1e-40);
    const b = multiplierParameter(logistic, 2, -1, '3.4', '0.45', 40).r;
    expect(b.minus(new D(6).sqrt().plus(1)).abs().toNumber()).toBeLessThan(1e-40);
  });

  it('multiplierParameter with multiplier +1 gives the period-3 saddle-node at r = 1 + sqrt 8', () => {
    // docs/checks.md "period-3 real window onset" (exact).
    const on = multiplierParameter(logistic, 3, 1, '3.83', '0.5', 40).r;
    expect(on.minus(new D(8).sqrt().plus(1)).abs().toNumber()).toBeLessThan(1e-38);
  });
});
