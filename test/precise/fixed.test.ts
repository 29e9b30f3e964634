import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { bitsForDigits, cdiv, cmul, csquare, div, fixedScale, fromDecimal, fromNumber, isqrt, mul, sqrt, square, toDecimal, toNumber } from '../../src/precise/fixed.js';

// The independent reference is decimal.js (npm), run at far more digits than the fixed-point scale.
const D = Decimal.clone({ precision: 400, rounding: Decimal.ROUND_HALF_EVEN });

/** Deterministic pseudo-random decimal strings (xorshift; no Math.random so failures reproduce). */
function makeRandom(seed: number): () => string {
  let x = seed >>> 0;
  const next = (): number => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x;
  };
  return () => {
    const sign = next() % 2 === 0 ? '-' : '';
    const intPart = String(next() % 4);
    let frac = '';
    const len = 1 + (next() % 60);
    for (let i = 0; i < len; i += 1) frac += String(next() % 10);
    return `${sign}${intPart}.${frac}`;
  };
}

/** Exact value of a fixed-point n at `bits`, via decimal.js. */
function exact(n: bigint, bits: number): Decimal {
  return new D(n.toString()).div(new D(2).pow(bits));
}

describe('fromDecimal', () => {
  it('fromDecimal(x, 200 bits) is within half an ulp (2^-201) of x per decimal.js', () => {
    const s = fixedScale(200);
    const rnd = makeRandom(1);
    const halfUlp = new D(2).pow(-201);
    for (let i = 0; i < 200; i += 1) {
      const t = rnd();
      const err = exact(fromDecimal(t, s), 200).minus(new D(t)).abs();
      expect(err.lte(halfUlp)).toBe(true);
    }
  });
  it('fromDecimal rounds ties to even and accepts exponents', () => {
    const s = fixedScale(2); // ulp 0.25
    expect(fromDecimal('0.125', s)).toBe(0n); // tie between 0 and 0.25 -> even (0)
    expect(fromDecimal('0.375', s)).toBe(2n); // tie between 0.25 and 0.5 -> even (0.5)
    expect(fromDecimal('-0.375', s)).toBe(-2n);
    expect(fromDecimal('2.5e-1', s)).toBe(1n);
    expect(fromDecimal('1e2', s)).toBe(400n);
  });
  it('fromDecimal("abc") throws a UserError naming the field', () => {
    expect(() => fromDecimal('1.2.3', fixedScale(10), 'centre')).toThrow(/for centre but received "1.2.3"/);
  });
});

describe('mul, square, div, sqrt', () => {
  it('agree with decimal.js to within one ulp on random operands at 300 bits', () => {
    const bits = 300;
    const s = fixedScale(bits);
    const rnd = makeRandom(7);
    const ulp = new D(2).pow(-bits);
    for (let i = 0; i < 100; i += 1) {
      const a = fromDecimal(rnd(), s);
      const b = fromDecimal(rnd(), s);
      const ea = exact(a, bits),
        eb = exact(b, bits);
      // correctly rounded results are within half an ulp; allow exactly that (+ nothing)
      expect(
        exact(mul(a, b, s), bits)
          .minus(ea.times(eb))
          .abs()
          .lte(ulp.div(2)),
      ).toBe(true);
      expect(exact(square(a, s), bits).minus(ea.times(ea)).abs().lte(ulp.div(2))).toBe(true);
      if (b !== 0n)
        expect(
          exact(div(a, b, s), bits)
            .minus(ea.div(eb))
            .abs()
            .lte(ulp.div(2)),
        ).toBe(true);
      const aa = a < 0n ? -a : a;
      expect(exact(sqrt(aa, s), bits).minus(exact(aa, bits).sqrt()).abs().lte(ulp.div(2))).toBe(true);
    }
  });
  it('complex cmul/csquare/cdiv agree with decimal.js per part within one ulp', () => {
    const bits = 180;
    const s = fixedScale(bits);
    const rnd = makeRandom(99);
    const ulp = new D(2).pow(-bits);
    for (let i = 0; i < 60; i += 1) {
      const a = { re: fromDecimal(rnd(), s), im: fromDecimal(rnd(), s) };
      const b = { re: fromDecimal(rnd(), s), im: fromDecimal(rnd(), s) };
      const [ar, ai, br, bi] = [exact(a.re, bits), exact(a.im, bits), exact(b.re, bits), exact(b.im, bits)];
      const p = cmul(a, b, s);
      expect(
        exact(p.re, bits)
          .minus(ar.times(br).minus(ai.times(bi)))
          .abs()
          .lte(ulp),
      ).toBe(true);
      expect(
        exact(p.im, bits)
          .minus(ar.times(bi).plus(ai.times(br)))
          .abs()
          .lte(ulp),
      ).toBe(true);
      const q = csquare(a, s);
      expect(
        exact(q.re, bits)
          .minus(ar.times(ar).minus(ai.times(ai)))
          .abs()
          .lte(ulp),
      ).toBe(true);
      expect(exact(q.im, bits).minus(ar.times(ai).times(2)).abs().lte(ulp)).toBe(true);
      const den = br.times(br).plus(bi.times(bi));
      const d = cdiv(a, b, s);
      expect(
        exact(d.re, bits)
          .minus(ar.times(br).plus(ai.times(bi)).div(den))
          .abs()
          .lte(ulp),
      ).toBe(true);
      expect(
        exact(d.im, bits)
          .minus(ai.times(br).minus(ar.times(bi)).div(den))
          .abs()
          .lte(ulp),
      ).toBe(true);
    }
  });
  it('isqrt(n) is the floor square root', () => {
    for (const n of [0n, 1n, 2n, 3n, 4n, 15n, 16n, 17n, 10n ** 40n, 10n ** 40n - 1n]) {
      const r = isqrt(n);
      expect(r * r <= n && (r + 1n) * (r + 1n) > n).toBe(true);
    }
  });
});

describe('toDecimal', () => {
  it('prints D fraction digits rounded like decimal.js toFixed (half-even)', () => {
    const bits = 250;
    const s = fixedScale(bits);
    const rnd = makeRandom(3);
    for (let i = 0; i < 100; i += 1) {
      const n = fromDecimal(rnd(), s);
      const want = exact(n, bits).toFixed(40, Decimal.ROUND_HALF_EVEN);
      expect(toDecimal(n, s, { digits: 40 })).toBe(want === '-0.' + '0'.repeat(40) ? '0.' + '0'.repeat(40) : want);
    }
  });
  it('prints D significant digits like decimal.js toSignificantDigits', () => {
    const bits = 400;
    const s = fixedScale(bits);
    const rnd = makeRandom(5);
    for (let i = 0; i < 100; i += 1) {
      const t = `${rnd()}e-${i % 25}`;
      const n = fromDecimal(t, s);
      const want = exact(n, bits).toSignificantDigits(30, Decimal.ROUND_HALF_EVEN);
      const got = toDecimal(n, s, { digits: 30, mode: 'significant' });
      expect(new D(got).eq(want)).toBe(true);
      expect(got.replace(/^-/, '').replace('.', '').replace(/^0+/, '').replace(/e.*$/, '').length).toBe(30);
    }
  });
  it('round-trips -1.75 and prints scientific for tiny values', () => {
    const s = fixedScale(bitsForDigits(50));
    expect(toDecimal(fromDecimal('-1.75', s), s, { digits: 5 })).toBe('-1.75000');
    expect(toDecimal(fromDecimal('-1.75', s), s, { digits: 5, trim: true })).toBe('-1.75');
    expect(toDecimal(fromDecimal('1.5e-40', s), s, { digits: 3, mode: 'significant' })).toBe('1.50e-40');
    expect(toDecimal(fromDecimal('9.9996', s), s, { digits: 4, mode: 'significant' })).toBe('10.00');
  });
});

describe('toNumber and fromNumber', () => {
  it('toNumber(fromDecimal(x)) equals Number(x) (both correctly rounded) on random strings', () => {
    const s = fixedScale(300);
    const rnd = makeRandom(11);
    for (let i = 0; i < 200; i += 1) {
      const t = rnd();
      expect(toNumber(fromDecimal(t, s), s)).toBe(Number(t));
    }
  });
  it('fromNumber(x) is exact when bits suffice', () => {
    const s = fixedScale(1100);
    for (const x of [0.1, -1.7548776662466927, 1e-300, 3.5, 2 ** 60]) expect(toNumber(fromNumber(x, s), s)).toBe(x);
  });
  it('bitsForDigits(50) = ceil(50 log2 10) + 16 = 183', () => {
    expect(bitsForDigits(50)).toBe(Math.ceil(50 * Math.log2(10)) + 16);
    expect(bitsForDigits(50)).toBe(183);
  });
});
