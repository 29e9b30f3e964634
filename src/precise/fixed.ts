/**
 * BigInt fixed-point real and complex arithmetic.
 *
 * A fixed-point value is a BigInt n standing for n * 2^-bits; the scale
 * (`bits`) travels beside it in a {@link FixedScale}, made once per
 * precision, so hot loops do no BigInt conversions of their own. Measured
 * 15-27x faster than decimal.js for z <- z^2 + c at 40-120 digits
 * (a benchmark of ours), which is why the project iterates in it.
 *
 * Rounding rules (all exact integer arithmetic, no doubles on the way):
 * - add, sub, neg: exact.
 * - mul, square, div, sqrt: rounded to nearest, ties
 *   towards +infinity (one extra BigInt add over plain truncation; plain
 *   `>>` would be floor and bias long orbits downwards).
 * - fromDecimal / fromNumber: rounded to nearest, ties to even (exactly the
 *   nearest multiple of 2^-bits to the decimal or double value).
 * - toDecimal: rounded to nearest, ties to even, on the exact binary value.
 * - toNumber: correctly rounded to nearest double (ties to even), except in
 *   the subnormal range where a second rounding may occur.
 *
 * Precision: {@link bitsForDigits} gives ceil(digits * log2 10) + guard.
 */
import { parseDecimal } from './decimal-string.js';
import type { DecimalNumber } from './decimal-string.js';

/** A precision: value = n * 2^-bits. Create with {@link fixedScale}. */
export interface FixedScale {
  readonly bits: number;
  /** BigInt(bits), for shifts. */
  readonly shift: bigint;
  /** 2^bits: the value 1. */
  readonly one: bigint;
  /** 2^(bits-1): one half, the rounding offset for mul. */
  readonly half: bigint;
}

/** A complex fixed-point value at some scale. */
export interface FixedComplex {
  readonly re: bigint;
  readonly im: bigint;
}

const LOG2_10 = Math.log2(10);

/** Default guard bits added by {@link bitsForDigits}. */
const GUARD_BITS = 16;

/** bits = ceil(digits * log2 10) + guard. */
export function bitsForDigits(digits: number, guard: number = GUARD_BITS): number {
  return Math.ceil(digits * LOG2_10) + guard;
}

/** Makes the scale for `bits` fractional bits (bits >= 1). */
export function fixedScale(bits: number): FixedScale {
  if (!Number.isInteger(bits) || bits < 1) throw new RangeError(`fixedScale: bits must be a positive integer, got ${bits}`);
  const shift = BigInt(bits);
  return { bits, shift, one: 1n << shift, half: 1n << (shift - 1n) };
}

// ---------------------------------------------------------------- integers

/** |n|. */
export function abs(n: bigint): bigint {
  return n < 0n ? -n : n;
}

/** Number of bits of |n| (0 for 0). */
export function bitLength(n: bigint): number {
  const a = n < 0n ? -n : n;
  if (a === 0n) return 0;
  // toString(16) is linear time and avoids a loop of shifts.
  const hex = a.toString(16);
  return (hex.length - 1) * 4 + (32 - Math.clz32(parseInt(hex[0] ?? '0', 16)));
}

/** floor(num / den) and the remainder r, 0 <= r < |den| (den != 0; den made positive). */
function floorDivRem(num: bigint, den: bigint): { q: bigint; r: bigint; den: bigint } {
  if (den < 0n) {
    num = -num;
    den = -den;
  }
  let q = num / den;
  let r = num - q * den;
  if (r < 0n) {
    q -= 1n;
    r += den;
  }
  return { q, r, den };
}

/** num / den rounded to nearest, ties to even (den != 0). */
function divRoundEven(num: bigint, den: bigint): bigint {
  const { q, r, den: d } = floorDivRem(num, den);
  const twice = 2n * r;
  return twice > d || (twice === d && (q & 1n) === 1n) ? q + 1n : q;
}

/** num / den rounded to nearest, ties towards +infinity (den != 0). */
function divRoundUp(num: bigint, den: bigint): bigint {
  const { q, r, den: d } = floorDivRem(num, den);
  return 2n * r >= d ? q + 1n : q;
}

/** floor(sqrt(a)) for a >= 0 (Newton's method on integers). */
export function isqrt(a: bigint): bigint {
  if (a < 0n) throw new RangeError('isqrt of a negative number');
  if (a < 2n) return a;
  let x = 1n << BigInt(Math.ceil(bitLength(a) / 2));
  for (;;) {
    const y = (x + a / x) >> 1n;
    if (y >= x) return x;
    x = y;
  }
}

// ---------------------------------------------------------------- real ops

/** a + b (exact). */
export function add(a: bigint, b: bigint): bigint {
  return a + b;
}

/** a - b (exact). */
export function sub(a: bigint, b: bigint): bigint {
  return a - b;
}

/** a * b rounded to nearest (ties up). */
export function mul(a: bigint, b: bigint, s: FixedScale): bigint {
  return (a * b + s.half) >> s.shift;
}

/** a^2 rounded to nearest (ties up). */
export function square(a: bigint, s: FixedScale): bigint {
  return (a * a + s.half) >> s.shift;
}

/** a / b rounded to nearest (ties up). Throws RangeError when b = 0. */
export function div(a: bigint, b: bigint, s: FixedScale): bigint {
  if (b === 0n) throw new RangeError('fixed-point division by zero');
  return divRoundUp(a << s.shift, b);
}

/** sqrt(a) for a >= 0, rounded to nearest. */
export function sqrt(a: bigint, s: FixedScale): bigint {
  // sqrt(a * 2^-b) * 2^b = sqrt(a * 2^b); take two extra bits and round.
  const r = isqrt(a << (s.shift + 2n));
  return (r + 1n) >> 1n;
}

/** Rescales n from one bit count to another (rounded to nearest, ties up, when narrowing). */
export function rescale(n: bigint, fromBits: number, toBits: number): bigint {
  if (toBits >= fromBits) return n << BigInt(toBits - fromBits);
  const d = BigInt(fromBits - toBits);
  return (n + (1n << (d - 1n))) >> d;
}

// ---------------------------------------------------------------- complex ops

/** a + b. */
export function cadd(a: FixedComplex, b: FixedComplex): FixedComplex {
  return { re: a.re + b.re, im: a.im + b.im };
}

/** a - b. */
export function csub(a: FixedComplex, b: FixedComplex): FixedComplex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** a * b (each part rounded once to nearest). */
export function cmul(a: FixedComplex, b: FixedComplex, s: FixedScale): FixedComplex {
  return {
    re: (a.re * b.re - a.im * b.im + s.half) >> s.shift,
    im: (a.re * b.im + a.im * b.re + s.half) >> s.shift,
  };
}

/** a^2 (each part rounded once to nearest). */
export function csquare(a: FixedComplex, s: FixedScale): FixedComplex {
  return {
    re: ((a.re + a.im) * (a.re - a.im) + s.half) >> s.shift,
    im: (a.re * a.im + (s.half >> 1n)) >> (s.shift - 1n),
  };
}

/** a / b (each part rounded once to nearest). Throws RangeError when b = 0. */
export function cdiv(a: FixedComplex, b: FixedComplex, s: FixedScale): FixedComplex {
  const den = b.re * b.re + b.im * b.im;
  if (den === 0n) throw new RangeError('fixed-point complex division by zero');
  return {
    re: divRoundUp((a.re * b.re + a.im * b.im) << s.shift, den),
    im: divRoundUp((a.im * b.re - a.re * b.im) << s.shift, den),
  };
}

// ---------------------------------------------------------------- conversions

/** 10^k as a BigInt (k >= 0), cached for small k. */
const POW10: bigint[] = [];
export function pow10(k: number): bigint {
  if (k < 64) {
    let p = POW10[k];
    if (p === undefined) {
      p = 10n ** BigInt(k);
      POW10[k] = p;
    }
    return p;
  }
  return 10n ** BigInt(k);
}

/**
 * A decimal number (string or parsed) to fixed point, exactly rounded to the
 * nearest multiple of 2^-bits (ties to even). A string is validated with
 * {@link parseDecimal}; a UserError names `field`.
 */
export function fromDecimal(value: string | DecimalNumber, s: FixedScale, field = 'value'): bigint {
  const d = typeof value === 'string' ? parseDecimal(value, field) : value;
  let n: bigint;
  if (d.exponent >= 0) n = (d.mantissa * pow10(d.exponent)) << s.shift;
  else n = divRoundEven(d.mantissa << s.shift, pow10(-d.exponent));
  return d.sign < 0 ? -n : n;
}

/** A double to fixed point, exactly rounded to nearest (ties to even). Throws on non-finite input. */
export function fromNumber(x: number, s: FixedScale): bigint {
  if (!Number.isFinite(x)) throw new RangeError(`fromNumber: not a finite number: ${x}`);
  if (x === 0) return 0n;
  // x = m * 2^e exactly with m a 53-bit integer.
  const neg = x < 0;
  let a = Math.abs(x);
  let e = 0;
  while (a >= 2 ** 53) {
    a /= 2;
    e += 1;
  }
  while (!Number.isInteger(a)) {
    a *= 2;
    e -= 1;
  }
  const m = BigInt(a);
  const total = e + s.bits;
  let n: bigint;
  if (total >= 0) n = m << BigInt(total);
  else n = divRoundEven(m, 1n << BigInt(-total));
  return neg ? -n : n;
}

/** Multiplies a double by 2^e without overflow/underflow in the power itself. */
function ldexp(x: number, e: number): number {
  while (e > 1000) {
    x *= 2 ** 1000;
    e -= 1000;
  }
  while (e < -1000) {
    x *= 2 ** -1000;
    e += 1000;
  }
  return x * 2 ** e;
}

/** Fixed point to the nearest double. */
/** Below 2^1000 in magnitude a BigInt's Number is finite and its scaling exact (bigToNumberScaled). */
const NUMBER_FAST = 1n << 1000n;

export function toNumber(n: bigint, s: FixedScale): number {
  return bigToNumberScaled(n, -s.bits);
}

/** n * 2^e as the nearest double. */
export function bigToNumberScaled(n: bigint, e: number): number {
  if (n === 0n) return 0;
  // Number(bigint) rounds to nearest (ECMA-262 ToNumber); scaling by 2^e is then exact unless the
  // result leaves the normal range, so the same value comes out without measuring the bits
  if (e >= -1022 && e <= 0 && n < NUMBER_FAST && n > -NUMBER_FAST) {
    const x = Number(n) * 2 ** e;
    if (Math.abs(x) >= 2 ** -1022) return x;
  }
  const neg = n < 0n;
  let a = neg ? -n : n;
  const len = bitLength(a);
  if (len > 64) {
    const sh = BigInt(len - 64);
    const top = a >> sh;
    // a sticky bit keeps Number()'s single rounding correct.
    a = top << sh === a ? top : top | 1n;
    e += len - 64;
  }
  const x = ldexp(Number(a), e);
  return neg ? -x : x;
}

/** Decimal formatting options for {@link toDecimal}. */
interface DecimalFormat {
  /** Number of digits: significant digits, or digits after the point. */
  readonly digits: number;
  /** 'fraction' (default): `digits` after the decimal point; 'significant': `digits` significant digits. */
  readonly mode?: 'fraction' | 'significant';
  /** Drop trailing zeros after the point (default false: fixed width). */
  readonly trim?: boolean;
}

/**
 * Fixed point to a decimal string, rounded to nearest (ties to even) from
 * the exact binary value. 'fraction' mode is always positional; 'significant'
 * mode is positional for decimal exponents -20..29 and otherwise scientific
 * ("1.234e-45"). Zero prints as "0" (or "0.000..." in fixed-width fraction mode).
 */
export function toDecimal(n: bigint, s: FixedScale, format: DecimalFormat): string {
  const digits = format.digits;
  if (!Number.isInteger(digits) || digits < 0) throw new RangeError(`toDecimal: digits must be a non-negative integer, got ${digits}`);
  const mode = format.mode ?? 'fraction';
  const neg = n < 0n;
  const a = neg ? -n : n;
  let body: string;
  if (mode === 'fraction') {
    const m = divRoundEven(a * pow10(digits), s.one);
    body = placePoint(m, digits);
    if (m === 0n) return format.trim === true ? '0' : body;
  } else {
    if (a === 0n) return '0';
    const p = Math.max(digits, 1);
    // estimate the decimal exponent of a * 2^-bits, then correct it.
    let e = Math.floor((bitLength(a) - 1 - s.bits) * Math.LOG10E * Math.LN2);
    let m = 0n;
    for (let guard = 0; guard < 4; guard += 1) {
      const k = p - 1 - e; // m = round(a * 10^k / 2^bits)
      m = k >= 0 ? divRoundEven(a * pow10(k), s.one) : divRoundEven(a, s.one * pow10(-k));
      if (m >= pow10(p)) e += 1;
      else if (m < pow10(p - 1)) e -= 1;
      else break;
    }
    if (m >= pow10(p)) {
      m /= 10n; // a rounding carry: 9.99.. -> 10.0
      e += 1;
    }
    if (e >= -20 && e < 30) {
      const frac = p - 1 - e;
      body = frac >= 0 ? placePoint(m, frac) : (m * pow10(-frac)).toString();
    } else {
      const ds = m.toString();
      body = ds.length > 1 ? `${ds[0]}.${ds.slice(1)}` : ds;
      if (format.trim === true) body = trimZeros(body);
      return `${neg ? '-' : ''}${body}e${e}`;
    }
  }
  if (format.trim === true) body = trimZeros(body);
  return `${neg ? '-' : ''}${body}`;
}

/** m with `frac` digits after the decimal point. */
function placePoint(m: bigint, frac: number): string {
  if (frac === 0) return m.toString();
  const ds = m.toString().padStart(frac + 1, '0');
  return `${ds.slice(0, ds.length - frac)}.${ds.slice(ds.length - frac)}`;
}

function trimZeros(t: string): string {
  if (!t.includes('.')) return t;
  return t.replace(/0+$/, '').replace(/\.$/, '');
}
