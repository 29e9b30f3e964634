import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { add, compare, div, exponentOf, floatExp, fromDecimalString, ldexp, mul, pow2, set, sqrt, sub, toNumber } from '../../src/precise/floatexp.js';
import type { FloatExp } from '../../src/precise/floatexp.js';

// decimal.js (npm) is the independent reference; 60 digits is far beyond a double.
const D = Decimal.clone({ precision: 60, minE: -9e15, maxE: 9e15 });
const TWO = new D(2);
// exact binary value: new Decimal(number) would go through the shortest decimal string
const exact = (a: FloatExp): Decimal => new D(BigInt(a.m * 2 ** 60).toString()).times(TWO.pow(a.e - 60));
/** |x - ref| / |ref| as a double. */
const relErr = (x: FloatExp, ref: Decimal): number => (ref.isZero() ? Math.abs(x.m) : exact(x).minus(ref).abs().div(ref.abs()).toNumber());

/** Deterministic generator (mulberry32), so failures reproduce. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random value with decimal exponent in -1000..1000 and either sign. */
function randomValue(r: () => number): FloatExp {
  const e = Math.round((r() * 2 - 1) * 1000 * Math.log2(10));
  return set(floatExp(), (r() < 0.5 ? -1 : 1) * (0.5 + 0.5 * r()), e);
}

// One rounding to 53 bits gives relative error <= 2^-53; allow 2^-52.
const ULP = 2 ** -52;

describe('floatexp arithmetic against decimal.js over 1e-1000..1e1000', () => {
  const r = rng(20261201);
  const pairs = Array.from({ length: 400 }, () => [randomValue(r), randomValue(r)] as const);

  it('mul, div: each within one rounding of the exact product and quotient', () => {
    let worst = 0;
    for (const [a, b] of pairs) {
      worst = Math.max(worst, relErr(mul(floatExp(), a, b), exact(a).times(exact(b))));
      worst = Math.max(worst, relErr(div(floatExp(), a, b), exact(a).div(exact(b))));
    }
    expect(worst).toBeLessThanOrEqual(ULP);
  });

  it('add, sub: within one rounding of the exact sum, including near-cancellation and far-apart exponents', () => {
    let worst = 0;
    const cases: [FloatExp, FloatExp][] = pairs.map(([a, b]) => [a, b]);
    for (const [a] of pairs.slice(0, 100)) {
      // near-cancellation: b = -a (1 + 2^-40) and exponents 30 and 70 bits apart
      cases.push([a, set(floatExp(), -a.m * (1 + 2 ** -40), a.e)]);
      cases.push([a, set(floatExp(), a.m, a.e - 30)]);
      cases.push([a, set(floatExp(), -a.m, a.e - 70)]);
    }
    for (const [a, b] of cases) {
      const s = add(floatExp(), a, b);
      const d = sub(floatExp(), a, b);
      // beyond 60 bits apart the smaller operand is dropped: error < 2^-60 relative
      worst = Math.max(worst, relErr(s, exact(a).plus(exact(b))), relErr(d, exact(a).minus(exact(b))));
    }
    expect(worst).toBeLessThanOrEqual(ULP);
  });

  it('sqrt and compare agree with decimal.js', () => {
    let worst = 0;
    for (const [a, b] of pairs) {
      const pa = set(floatExp(), Math.abs(a.m), a.e);
      worst = Math.max(worst, relErr(sqrt(floatExp(), pa), exact(pa).sqrt()));
      expect(compare(a, b)).toBe(exact(a).comparedTo(exact(b)));
    }
    expect(worst).toBeLessThanOrEqual(ULP);
  });

  it('fromDecimalString parses to within one rounding, and toNumber matches Number() inside the double range', () => {
    let worst = 0;
    for (const [a] of pairs) {
      const text = exact(a).toSignificantDigits(30).toString();
      const parsed = fromDecimalString(floatExp(), text);
      worst = Math.max(worst, relErr(parsed, new D(text)));
    }
    expect(worst).toBeLessThanOrEqual(ULP);
    for (const s of ['1e-300', '-2.5e307', '7e-320', '0.1', '123456789.125']) {
      expect(toNumber(fromDecimalString(floatExp(), s))).toBe(Number(s));
    }
    expect(toNumber(fromDecimalString(floatExp(), '1e-400'))).toBe(0);
    expect(toNumber(fromDecimalString(floatExp(), '1e400'))).toBe(Infinity);
  });

  it('ldexp and exponentOf are exact at the ends of the double range', () => {
    expect(ldexp(1, -1074)).toBe(5e-324); // smallest subnormal (IEEE 754 binary64)
    expect(ldexp(0.75, 1024)).toBe(0.75 * 2 ** 1023 * 2);
    expect(ldexp(2 ** 600, -1200)).toBe(2 ** -600);
    expect(exponentOf(1)).toBe(1);
    expect(exponentOf(0.5)).toBe(0);
    expect(exponentOf(5e-324)).toBe(-1073);
    expect(exponentOf(-Number.MAX_VALUE)).toBe(1024);
    // the definition 2^(e-1) <= |x| < 2^e at every normal power of two and the double just below it
    for (let e = -1020; e <= 1023; e += 1) {
      const p = new D(2).pow(e - 1).toNumber();
      expect(exponentOf(p), `2^${e - 1}`).toBe(e);
      expect(exponentOf(-p * (1 - 2 ** -53)), `below 2^${e - 1}`).toBe(e - 1);
    }
  });

  it('pow2 is 2^e exactly from the least subnormal to the largest power (IEEE 754 binary64)', () => {
    for (let e = -1074; e <= 1023; e += 1) {
      // decimal.js: 2^e to 60 digits, parsed to the nearest double, is 2^e
      const ref = e >= 0 ? new D((2n ** BigInt(e)).toString()) : new D(1).div(new D((2n ** BigInt(-e)).toString()));
      expect(pow2(e), `2^${e}`).toBe(ref.toNumber());
    }
    // ldexp through the table equals repeated doubling and halving (exact powers of two)
    let x = 3;
    for (let e = 0; e <= 1000; e += 1, x *= 2) expect(ldexp(3, e)).toBe(x);
    x = 3;
    for (let e = 0; e >= -1000; e -= 1, x /= 2) expect(ldexp(3, e)).toBe(x);
  });
});
