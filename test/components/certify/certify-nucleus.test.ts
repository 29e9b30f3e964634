import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { ballOrbit, certifyNucleusFixed, primeDivisors } from '../../../src/components/certify/certify-nucleus.js';
import { certifyNucleusDecimal } from '../../../src/components/certify/certify-decimal.js';
import { radiusText } from '../../../src/components/certify/radius-text.js';
import { excludesZero, sqrtUp } from '../../../src/precise/ball.js';
import { fixedScale, fromDecimal } from '../../../src/precise/fixed.js';

const D = Decimal.clone({ precision: 80 });
const BITS = 160;
const S = fixedScale(BITS);
const unit = new D(2).pow(-BITS);
const toD = (n: bigint): Decimal => new D(n.toString()).times(unit);

/** F_p and F_p' at c in decimal.js (z <- z^2 + c, d <- 2 z d + 1 from 0), written here independently of src/. */
function orbit(p: number, re: Decimal, im: Decimal): { fr: Decimal; fi: Decimal; dr: Decimal; di: Decimal } {
  let zr = new D(0),
    zi = new D(0),
    dr = new D(0),
    di = new D(0);
  for (let k = 0; k < p; k += 1) {
    const ndr = zr.times(dr).minus(zi.times(di)).times(2).plus(1);
    di = zr.times(di).plus(zi.times(dr)).times(2);
    dr = ndr;
    const nzr = zr.times(zr).minus(zi.times(zi)).plus(re);
    zi = zr.times(zi).times(2).plus(im);
    zr = nzr;
  }
  return { fr: zr, fi: zi, dr, di };
}

// The period-3 nuclei are the roots of c^3 + 2c^2 + c + 1 (docs/checks.md "period-3 nuclei", exact polynomial;
// OEIS A060006 for the real one); these 40-digit values are from mpmath 1.2.1
// polyroots([1, 2, 1, 1], maxsteps=200, extraprec=200) at mp.dps = 45.
const CUBIC_ROOTS = [
  ['-1.754877666246692760049508896358528691895', '0'],
  ['-0.1225611668766536199752455518207356540527', '0.7448617666197442365931704286043923672402'],
] as const;

describe('certifyNucleusFixed', () => {
  it('certifies both period-3 nuclei of the upper half plane, with a disk that holds the root of c^3 + 2c^2 + c + 1 (mpmath)', () => {
    for (const [re, im] of CUBIC_ROOTS) {
      const near = { re: fromDecimal(re.slice(0, 14), S), im: fromDecimal(im.slice(0, 14), S) };
      const cert = certifyNucleusFixed(3, near.re, near.im, BITS);
      expect(cert.ok, cert.reason ?? '').toBe(true);
      const dist = toD(near.re).minus(re).pow(2).plus(toD(near.im).minus(im).pow(2)).sqrt();
      expect(dist.lte(toD(cert.radius))).toBe(true); // the true root is inside the certified disk
      expect(toD(cert.radius).lt(dist.times(1.01).plus(1e-40))).toBe(true); // and the disk is not much larger
      expect(cert.unique > cert.radius).toBe(true);
    }
  });
  it('a point 1% of the component size off the nucleus still certifies, with a radius that covers the shift', () => {
    // period-4 real nucleus -1.9407998065294847522... (decimal.js Newton below, not src/)
    let c = new D('-1.94');
    for (let i = 0; i < 30; i += 1) {
      const f = orbit(4, c, new D(0));
      c = c.minus(f.fr.div(f.dr));
    }
    const size = 0.0033; // Hunt-Ott size of this component, to 2 digits (docs/methods.md C4)
    const shifted = c.plus(0.01 * size);
    const cert = certifyNucleusFixed(4, fromDecimal(shifted.toFixed(60), S), 0n, BITS);
    expect(cert.ok).toBe(true);
    expect(toD(cert.radius).gte(shifted.minus(c).abs())).toBe(true);
  });
  it('refuses a point midway between two period-3 nuclei and the period-1 nucleus 0 tested for period 2 (exact period)', () => {
    expect(certifyNucleusFixed(3, fromDecimal('-0.94', S), fromDecimal('0.37', S), BITS).ok).toBe(false);
    const zero = certifyNucleusFixed(2, 0n, 0n, BITS);
    expect(zero.ok).toBe(false);
    expect(zero.reason).toMatch(/exclude 0/);
    // c = -1 is a zero of F_4 but has exact period 2
    expect(certifyNucleusFixed(4, -S.one, 0n, BITS).ok).toBe(false);
    expect(certifyNucleusFixed(2, -S.one, 0n, BITS).ok).toBe(true);
  });
  it("ballOrbit encloses F_p and F_p' at 40 points of its disk, evaluated in decimal.js (period 7)", () => {
    const cr = fromDecimal('-0.1565201668', S),
      ci = fromDecimal('1.0322471089', S);
    const rho = fromDecimal('1e-6', S);
    const ball = ballOrbit(7, cr, ci, rho, BITS);
    for (let k = 0; k < 40; k += 1) {
      const t = (2 * Math.PI * k) / 40;
      const f = (k % 3) / 2; // on the rim, half-way and at the centre
      const re = toD(cr).plus(toD(rho).times(f * Math.cos(t)));
      const im = toD(ci).plus(toD(rho).times(f * Math.sin(t)));
      const o = orbit(7, re, im);
      expect(
        o.fr
          .minus(toD(ball.zr))
          .pow(2)
          .plus(o.fi.minus(toD(ball.zi)).pow(2))
          .sqrt()
          .lte(toD(ball.zrad)),
      ).toBe(true);
      expect(
        o.dr
          .minus(toD(ball.dr))
          .pow(2)
          .plus(o.di.minus(toD(ball.di)).pow(2))
          .sqrt()
          .lte(toD(ball.drad)),
      ).toBe(true);
    }
  });
  it('primeDivisors(p) lists the primes dividing p', () => {
    expect(primeDivisors(1)).toEqual([]);
    expect(primeDivisors(12)).toEqual([2, 3]);
    expect(primeDivisors(97)).toEqual([97]);
    expect(primeDivisors(30)).toEqual([2, 3, 5]);
  });
});

describe('certifyNucleusDecimal', () => {
  it('certifies the 20-digit real period-3 nucleus with a radius at least its distance to the mpmath root', () => {
    const cert = certifyNucleusDecimal(3, { re: '-1.75487766624669276005', im: '0' });
    expect(cert.ok).toBe(true);
    const dist = new D('-1.75487766624669276005').minus(CUBIC_ROOTS[0][0]).abs();
    expect(dist.lte(cert.radius!)).toBe(true);
    expect(new D(cert.radius!).lt(1e-20)).toBe(true);
  });
  it('fails (never certifies) a period-12 nucleus printed to too few digits for its size', () => {
    expect(certifyNucleusDecimal(12, { re: '-1.99996', im: '0' }).ok).toBe(false);
  });
});

describe('ball helpers', () => {
  it('sqrtUp(n) >= sqrt(n) and close to it; exact squares and 0', () => {
    for (const n of [0n, 1n, 2n, 99n, 10n ** 40n, (1n << 1500n) + 12345n, 3n ** 600n]) {
      const s = sqrtUp(n);
      expect(s * s >= n).toBe(true);
      if (n > 100n) expect((s - 3n) * (s - 3n) < n * (1n + (n >> 30n)) || s < 1000n).toBe(true);
    }
    expect(sqrtUp(10n ** 40n) >= 10n ** 20n).toBe(true);
  });
  it('excludesZero decides |m| > r exactly', () => {
    expect(excludesZero(3n, 4n, 4n)).toBe(true);
    expect(excludesZero(3n, 4n, 5n)).toBe(false);
  });
  it('radiusText rounds up to two significant digits', () => {
    const b = 20;
    const one = 1n << BigInt(b);
    expect(radiusText(one / 4n, b)).toBe('2.5e-1'); // exact
    expect(radiusText(one / 3n + 1n, b)).toBe('3.4e-1');
    expect(radiusText(one, b)).toBe('1.0e0');
    expect(radiusText(one - 1n, b)).toBe('1.0e0');
    expect(radiusText(99n * one + 1n, b)).toBe('1.0e2');
    expect(radiusText(1n, b)).toBe('9.6e-7'); // 2^-20 = 9.5367e-7
  });
});
