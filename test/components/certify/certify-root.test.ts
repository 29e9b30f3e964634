import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { certifyCycleParameter, certifyRootDecimal, unitRootBall } from '../../../src/components/certify/certify-root.js';
import { exactBall } from '../../../src/precise/ball-complex.js';
import { fixedScale, fromDecimal } from '../../../src/precise/fixed.js';

const D = Decimal.clone({ precision: 60 });

describe('certifyRootDecimal', () => {
  it('certifies the real period-3 root -7/4 (docs/checks.md, exact) from a printed value 1e-22 off, with a radius covering the offset', () => {
    const r = certifyRootDecimal(3, { re: '-1.754877666246692760049509', im: '0' }, { re: '-1.7500000000000000000001', im: '0' }, 25);
    expect(r.ok, r.reason ?? '').toBe(true);
    expect(r.satellite).toBe(false);
    expect(new D(r.radius!).gte('1e-22')).toBe(true);
    expect(new D(r.radius!).lt('2e-22')).toBe(true);
  });
  it('certifies the satellite roots -3/4 (1/2 bulb) and -1/8 + (3 sqrt 3/8) i (1/3 bulb), docs/checks.md exact values', () => {
    const half = certifyRootDecimal(2, { re: '-1', im: '0' }, { re: '-0.75', im: '0' }, 20);
    expect(half.ok && half.satellite).toBe(true);
    const im = new D(3).sqrt().times(3).div(8);
    const third = certifyRootDecimal(3, { re: '-0.12256116687665361997524555', im: '0.74486176661974423659317043' }, { re: '-0.125', im: im.toFixed(30) }, 30);
    expect(third.ok && third.satellite, third.reason ?? '').toBe(true);
    expect(new D(third.radius!).lt('1e-29')).toBe(true);
  });
  it('refuses a root that lies far from its nucleus (the period-12 component 1-11-12 near 0.3256 + 0.0380i is given the 1/12 bulb root)', () => {
    const r = certifyRootDecimal(12, { re: '0.32558950955066032790', im: '0.03804788093475572000' }, { re: '0.30801270189221932338', im: '0.03349364905389033831' }, 20);
    expect(r.ok).toBe(false);
  });
});

describe('certifyCycleParameter', () => {
  it('refuses a centre whose cycle has a lower exact period, and a centre far from any solution', () => {
    const bits = 128;
    const s = fixedScale(bits);
    const one = exactBall(s.one, 0n);
    // w = 0, c = 0: a fixed point (period 1) tested as a period-2 cycle with multiplier 1
    expect(certifyCycleParameter(2, { re: 0n, im: 0n }, { re: 0n, im: 0n }, one, bits).ok).toBe(false);
    // c = -1 has no parabolic 3-cycle near it
    expect(certifyCycleParameter(3, { re: 0n, im: 0n }, { re: -s.one, im: 0n }, one, bits).ok).toBe(false);
    // the cusp 1/4 with w = 1/2: the fixed point with multiplier 1 (docs/checks.md main cardioid, m = 1)
    expect(certifyCycleParameter(1, { re: fromDecimal('0.5', s), im: 0n }, { re: fromDecimal('0.25', s), im: 0n }, one, bits).ok).toBe(true);
  });
});

describe('unitRootBall', () => {
  it('encloses e^{2 pi i j/q} (decimal.js cos and sin) for j/q = 1/5, 2/7, 5/12', () => {
    const bits = 160;
    const unit = new D(2).pow(-bits);
    for (const [j, q] of [
      [1, 5],
      [2, 7],
      [5, 12],
    ] as const) {
      const b = unitRootBall(j, q, bits)!;
      expect(b).not.toBeNull();
      const a = D.acos(-1)
        .times(2 * j)
        .div(q);
      const dist = new D(b.re.toString())
        .times(unit)
        .minus(D.cos(a))
        .pow(2)
        .plus(new D(b.im.toString()).times(unit).minus(D.sin(a)).pow(2))
        .sqrt();
      expect(dist.lte(new D(b.r.toString()).times(unit))).toBe(true);
      expect(new D(b.r.toString()).times(unit).lt(1e-40)).toBe(true);
    }
  });
});
