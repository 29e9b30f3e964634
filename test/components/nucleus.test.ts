import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { findNucleus } from '../../src/components/nucleus.js';
import { NewtonError } from '../../src/components/newton-error.js';

const D = Decimal.clone({ precision: 120 });

/** c^3 + 2c^2 + c + 1 evaluated exactly enough in decimal.js (docs/checks.md: period-3 nuclei are its roots). */
function cubic(re: string, im: string): number {
  const cr = new D(re),
    ci = new D(im);
  // (a+bi)^2, ^3
  const r2 = cr.times(cr).minus(ci.times(ci)),
    i2 = cr.times(ci).times(2);
  const r3 = r2.times(cr).minus(i2.times(ci)),
    i3 = r2.times(ci).plus(i2.times(cr));
  const vr = r3.plus(r2.times(2)).plus(cr).plus(1),
    vi = i3.plus(i2.times(2)).plus(ci);
  return vr.times(vr).plus(vi.times(vi)).sqrt().toNumber();
}

/** |F_p(c) / F_p'(c)| with F_p(c) = f_c^p(0), in decimal.js (the length of a Newton step for a zero of F_p). */
function newtonStep(p: number, cr: Decimal, ci: Decimal): Decimal {
  let zr = new D(0),
    zi = new D(0),
    dr = new D(0),
    di = new D(0);
  for (let k = 0; k < p; k += 1) {
    const ndr = zr.times(dr).minus(zi.times(di)).times(2).plus(1);
    const ndi = zr.times(di).plus(zi.times(dr)).times(2);
    const nzr = zr.times(zr).minus(zi.times(zi)).plus(cr);
    const nzi = zr.times(zi).times(2).plus(ci);
    [zr, zi, dr, di] = [nzr, nzi, ndr, ndi];
  }
  return zr
    .pow(2)
    .plus(zi.pow(2))
    .div(dr.pow(2).plus(di.pow(2)))
    .sqrt();
}

describe('findNucleus', () => {
  it('findNucleus(3, -1.8) gives -1.7548776662466927600... (OEIS A060006, real root of c^3+2c^2+c+1)', () => {
    const r = findNucleus(3, { re: '-1.8', im: '0' }, 19);
    expect(r.nucleus.re).toBe('-1.7548776662466927600'); // docs/checks.md: -1.7548776662466927600
    expect(r.nucleus.im).toBe('0');
  });
  it('the complex period-3 nuclei match docs/checks.md and are roots of c^3+2c^2+c+1 to 60 digits', () => {
    const r = findNucleus(3, { re: '-0.1', im: '0.7' }, 60).nucleus;
    expect(r.re.slice(0, 22)).toBe('-0.12256116687665361998'.slice(0, 22)); // docs/checks.md
    expect(r.im.slice(0, 22)).toBe('0.74486176661974423659'.slice(0, 22));
    expect(cubic(r.re, r.im)).toBeLessThan(1e-58);
  });
  it('findNucleus agrees with itself at 20 and 50 digits (the 20-digit result is the rounded 50-digit one)', () => {
    const a = findNucleus(7, { re: '-0.12', im: '0.95' }, 20).nucleus;
    const b = findNucleus(7, { re: '-0.12', im: '0.95' }, 50).nucleus;
    expect(new D(a.re).minus(new D(b.re)).abs().toNumber()).toBeLessThanOrEqual(0.5e-20);
    expect(new D(a.im).minus(new D(b.im)).abs().toNumber()).toBeLessThanOrEqual(0.5e-20);
  });
  it('findNucleus(1000, near the 1/1000 bulb, 100 digits) converges to a nucleus of exact period 1000', () => {
    const q = 1000;
    const th = (2 * Math.PI) / q;
    const rr = Math.cos(th) / 2 - Math.cos(2 * th) / 4; // cardioid formula, docs/checks.md
    const ri = Math.sin(th) / 2 - Math.sin(2 * th) / 4;
    const rad = Math.sin(Math.PI / q) / q ** 2; // bulb radius rule, docs/checks.md
    const m = Math.hypot(rr, ri);
    const r = findNucleus(q, { re: String(rr + (rad * rr) / m), im: String(ri + (rad * ri) / m) }, 100);
    // The guess already shares the first 7 digits, so the digits prove nothing; checked instead in
    // decimal.js (120 digits, written here): c is a zero of F_1000 (Newton step below 1e-90), not a
    // zero of F_500 or F_200 (every proper divisor of 1000 divides one of them; Newton steps towards
    // their zeros are at least a bulb radius), and its distance to the 1/1000 root is about a radius.
    const c = { re: new D(r.nucleus.re), im: new D(r.nucleus.im) };
    expect(newtonStep(q, c.re, c.im).lt(1e-90)).toBe(true);
    for (const d of [500, 200]) expect(newtonStep(d, c.re, c.im).gt(rad), `divisor ${d}`).toBe(true);
    const fromRoot = Math.hypot(c.re.minus(rr).toNumber(), c.im.minus(ri).toNumber()) / rad;
    expect(fromRoot).toBeGreaterThan(0.5);
    expect(fromRoot).toBeLessThan(2);
  });
  it('findNucleus throws a NewtonError when the exact period differs, and a UserError for a bad guess', () => {
    // c = 0 is the period-1 nucleus: F^2(0, 0) = 0, but the exact period is 1
    expect(() => findNucleus(2, { re: '0', im: '0' }, 20)).toThrow(NewtonError);
    expect(() => findNucleus(2, { re: '0', im: '0' }, 20)).toThrow(/exact period 1/);
    expect(() => findNucleus(3, { re: 'x', im: '0' }, 20)).toThrow(/for near but received "x"/);
  });
});
