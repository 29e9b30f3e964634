/**
 * The page's exact decimals (src/serve/page/decimal.js, plain JS for the
 * browser) against decimal.js, an independent arbitrary-precision library,
 * on seeded random operands from 1e-400 to 1e3: every result must be equal
 * as a number, and the rounded texts identical.
 */
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';

interface Dec {
  m: bigint;
  e: number;
}
interface PageDecimal {
  parse(text: string): Dec | null;
  add(a: Dec, b: Dec): Dec;
  sub(a: Dec, b: Dec): Dec;
  mul(a: Dec, b: Dec): Dec;
  mulInt(a: Dec, k: number): Dec;
  mulPow2(a: Dec, k: number): Dec;
  divide(a: Dec, b: Dec, n?: number): Dec;
  compare(a: Dec, b: Dec): number;
  magnitude(a: Dec): number;
  roundSignificant(a: Dec, n: number): Dec;
  toFixed(a: Dec, places: number): string;
  toText(a: Dec): string;
  ratio(a: Dec, b: Dec): number;
}

const where = '../../src/serve/page/decimal.js';
const P = (await import(where)) as PageDecimal;
const X = Decimal.clone({ precision: 1200, rounding: Decimal.ROUND_HALF_UP, toExpNeg: -9e15, toExpPos: 9e15, minE: -9e15, maxE: 9e15 });

/** mulberry32, a seeded generator (so a failure reproduces). */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function operand(r: () => number): string {
  const digits = 1 + Math.floor(r() * 40);
  let m = String(1 + Math.floor(r() * 9));
  for (let k = 1; k < digits; k++) m += String(Math.floor(r() * 10));
  const e = Math.floor(r() * 403) - 400;
  return `${r() < 0.5 ? '-' : ''}${m}e${e}`;
}

/** The page writes a value that rounds to zero without a sign ("0.00", where decimal.js writes "-0.00"). */
export function unsignedZero(text: string): string {
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

const same = (d: Dec, x: Decimal): boolean => new X(P.toText(d)).eq(x);

describe('page decimals', () => {
  it('add, subtract, multiply, scale by 2^-k and divide exactly as decimal.js does', () => {
    const r = random(16);
    for (let n = 0; n < 400; n++) {
      const a = operand(r);
      const b = operand(r);
      const pa = P.parse(a)!;
      const pb = P.parse(b)!;
      expect(same(P.add(pa, pb), new X(a).plus(b)), `${a} + ${b}`).toBe(true);
      expect(same(P.sub(pa, pb), new X(a).minus(b)), `${a} - ${b}`).toBe(true);
      expect(same(P.mul(pa, pb), new X(a).times(b)), `${a} * ${b}`).toBe(true);
      const k = Math.floor(r() * 80) - 10;
      expect(same(P.mulPow2(pa, k), new X(a).times(new X(2).pow(-k))), `${a} * 2^-${k}`).toBe(true);
      const i = Math.floor(r() * 5000) - 2500;
      expect(same(P.mulInt(pa, i), new X(a).times(i)), `${a} * ${i}`).toBe(true);
      expect(P.compare(pa, pb)).toBe(new X(a).comparedTo(b));
      expect(P.magnitude(pa)).toBe(new X(a).e);
      // 20 significant digits, half away from zero.
      const q = P.divide(pa, pb, 20);
      expect(same(q, new X(a).div(b).toSignificantDigits(20, Decimal.ROUND_HALF_UP)), `${a} / ${b}`).toBe(true);
      // ratio is a double: checked where the quotient is one (within 1e-250 .. 1e250).
      const quotient = new X(a).div(b);
      if (Math.abs(quotient.e) < 250) expect(P.ratio(pa, pb) / quotient.toNumber()).toBeCloseTo(1, 12);
    }
  });

  it('rounds for the readout (fixed places, half away from zero) and writes text decimal.js reads back', () => {
    const r = random(7);
    for (let n = 0; n < 400; n++) {
      const a = operand(r);
      const places = Math.floor(r() * 420);
      expect(P.toFixed(P.parse(a)!, places), `${a} to ${places}`).toBe(unsignedZero(new X(a).toFixed(places, Decimal.ROUND_HALF_UP)));
      const s = Math.floor(r() * 30) + 1;
      expect(same(P.roundSignificant(P.parse(a)!, s), new X(a).toSignificantDigits(s, Decimal.ROUND_HALF_UP))).toBe(true);
    }
    // Ties round away from zero, both signs (decimal.js ROUND_HALF_UP).
    expect(P.toFixed(P.parse('0.125')!, 2)).toBe('0.13');
    expect(P.toFixed(P.parse('-0.125')!, 2)).toBe('-0.13');
    expect(P.toFixed(P.parse('-0.0001')!, 2)).toBe('0.00');
    expect(P.parse('1.2.3')).toBeNull();
    expect(P.parse('')).toBeNull();
  });
});
