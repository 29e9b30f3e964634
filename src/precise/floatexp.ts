/**
 * Extended-exponent floats ("floatexp", docs/methods.md B6a; R. Munafo,
 * mrob.com/pub/muency/floatexp.html): a double mantissa m with 0.5 <= |m| < 1
 * (or m = 0) and an integer exponent e, standing for m * 2^e. The exponent is
 * a plain JS number (exact integer), so the range is far beyond 1e+-1e15.
 *
 * Every operation renormalises eagerly and writes into a caller's `out`
 * (which may alias an input), gl-matrix style. Precision is that of a double
 * (53 bits): one rounding per operation, plus the exact power-of-two scaling.
 *
 * The deep kernel itself uses rescaled iterations (B6b) for its hot loop;
 * floatexp carries the values around it: tile offsets, the rare reference
 * iterates that underflow a double, and tests.
 */
export interface FloatExp {
  m: number;
  e: number;
}

/** A new floatexp for x (normalised). */
export function floatExp(x = 0): FloatExp {
  return fromNumber({ m: 0, e: 0 }, x);
}

/** A double and its two 32-bit words, for reading the exponent field. */
const BITS_F64 = new Float64Array(1);
const BITS_U32 = new Uint32Array(BITS_F64.buffer);
/** Index of the word holding sign and exponent (1 on little-endian machines). */
const HIGH_WORD = (() => {
  BITS_F64[0] = 1;
  return BITS_U32[1] === 0x3ff00000 ? 1 : 0;
})();

/** Offset of 2^0 in POW2. */
const POW2_BIAS = 1074;

/** POW2[e + 1074] = 2^e exactly, for every integer e from -1074 (the least subnormal) to 1023. */
const POW2 = (() => {
  const t = new Float64Array(1074 + 1024);
  for (let e = -1074; e <= 1023; e += 1) t[e + POW2_BIAS] = 2 ** e;
  return t;
})();

/** 2^e exactly for an integer e from -1074 to 1023 (a table lookup; outside that range, 2 ** e). */
export function pow2(e: number): number {
  return e >= -1074 && e <= 1023 && (e | 0) === e ? POW2[e + POW2_BIAS]! : 2 ** e;
}

/**
 * x * 2^e for any integer e, without overflow or underflow in the power
 * itself (the result over/underflows only if the true value does).
 */
export function ldexp(x: number, e: number): number {
  // the common case: one multiplication by a tabled power (V8's 2 ** e is a
  // general pow call, several times slower than the lookup)
  if (e >= -1000 && e <= 1000 && (e | 0) === e) return x * POW2[e + POW2_BIAS]!;
  while (e > 1000) {
    x *= 2 ** 1000;
    e -= 1000;
    if (!Number.isFinite(x) || x === 0) return x;
  }
  while (e < -1000) {
    x *= 2 ** -1000;
    e += 1000;
    if (x === 0) return x;
  }
  return x * 2 ** e;
}

/**
 * The binary exponent of x: the integer e with 2^(e-1) <= |x| < 2^e
 * (x finite, nonzero). 0 for x = 0.
 */
export function exponentOf(x: number): number {
  if (x === 0 || !Number.isFinite(x)) return 0;
  // normal doubles: the biased exponent field (IEEE 754 binary64) is e + 1022
  BITS_F64[0] = x;
  const field = (BITS_U32[HIGH_WORD]! >>> 20) & 0x7ff;
  if (field !== 0) return field - 1022;
  const a = Math.abs(x);
  let e = Math.floor(Math.log2(a)) + 1;
  // log2 may be off by one near powers of two; correct exactly.
  const m = ldexp(a, -e);
  if (m >= 1) e += 1;
  else if (m < 0.5) e -= 1;
  return e;
}

/** out = x (a finite double). */
export function fromNumber(out: FloatExp, x: number): FloatExp {
  if (x === 0 || !Number.isFinite(x)) {
    out.m = x === 0 ? 0 : x;
    out.e = 0;
    return out;
  }
  const e = exponentOf(x);
  out.m = ldexp(x, -e);
  out.e = e;
  return out;
}

/** out = m * 2^e, normalised. */
export function set(out: FloatExp, m: number, e: number): FloatExp {
  if (m === 0 || !Number.isFinite(m)) {
    out.m = m;
    out.e = 0;
    return out;
  }
  const k = exponentOf(m);
  out.m = ldexp(m, -k);
  out.e = e + k;
  return out;
}

/** The nearest double (0 or +-Infinity outside the double range). */
export function toNumber(a: FloatExp): number {
  return ldexp(a.m, a.e);
}

/** out = a * b. */
export function mul(out: FloatExp, a: FloatExp, b: FloatExp): FloatExp {
  return set(out, a.m * b.m, a.e + b.e);
}

/** out = a / b (b != 0). */
export function div(out: FloatExp, a: FloatExp, b: FloatExp): FloatExp {
  return set(out, a.m / b.m, a.e - b.e);
}

/** out = a + b. The smaller operand is shifted; beyond 60 bits apart it is below half an ulp. */
export function add(out: FloatExp, a: FloatExp, b: FloatExp): FloatExp {
  if (a.m === 0) return set(out, b.m, b.e);
  if (b.m === 0) return set(out, a.m, a.e);
  const d = a.e - b.e;
  if (d >= 0) {
    if (d > 60) return set(out, a.m, a.e);
    return set(out, a.m + ldexp(b.m, -d), a.e);
  }
  if (d < -60) return set(out, b.m, b.e);
  return set(out, ldexp(a.m, d) + b.m, b.e);
}

/** out = a - b. */
export function sub(out: FloatExp, a: FloatExp, b: FloatExp): FloatExp {
  const bm = b.m;
  const be = b.e;
  return add(out, a, { m: -bm, e: be });
}

/** out = sqrt(a) (a >= 0). */
export function sqrt(out: FloatExp, a: FloatExp): FloatExp {
  if (a.m === 0) return set(out, 0, 0);
  // make the exponent even so it halves exactly
  return a.e % 2 === 0 ? set(out, Math.sqrt(a.m), a.e / 2) : set(out, Math.sqrt(a.m * 2), (a.e - 1) / 2);
}

/** -1, 0 or 1 as a < b, a = b, a > b. */
export function compare(a: FloatExp, b: FloatExp): number {
  const sa = Math.sign(a.m);
  const sb = Math.sign(b.m);
  if (sa !== sb) return sa < sb ? -1 : 1;
  if (sa === 0) return 0;
  if (a.e !== b.e) return (a.e < b.e ? -1 : 1) * sa;
  return a.m < b.m ? -1 : a.m > b.m ? 1 : 0;
}

/**
 * Parses a decimal string like "-1.25e-4000" (sign, digits, optional point,
 * optional exponent), correctly rounded up to a sticky-bit double rounding
 * (exact BigInt division, then one rounding to 53 bits).
 */
export function fromDecimalString(out: FloatExp, text: string): FloatExp {
  const match = /^([+-]?)(\d*)(?:\.(\d*))?(?:[eE]([+-]?\d+))?$/.exec(text.trim());
  if (match === null || (match[2] ?? '') + (match[3] ?? '') === '') throw new RangeError(`not a decimal number: ${text}`);
  const neg = match[1] === '-';
  const digits = ((match[2] ?? '') + (match[3] ?? '')).replace(/^0+/, '');
  if (digits === '') return set(out, 0, 0);
  const exp10 = Number(match[4] ?? '0') - (match[3] ?? '').length;
  let n = BigInt(digits);
  let e2 = 0;
  if (exp10 >= 0) n *= 10n ** BigInt(exp10);
  else {
    const den = 10n ** BigInt(-exp10);
    // enough quotient bits: 64 beyond the denominator's length
    const shift = Math.max(0, den.toString(2).length + 66 - n.toString(2).length);
    const scaled = n << BigInt(shift);
    const q = scaled / den;
    n = q * den === scaled ? q : q | 1n; // sticky bit
    e2 = -shift;
  }
  const len = n.toString(2).length;
  if (len > 64) {
    const sh = BigInt(len - 64);
    const top = n >> sh;
    n = top << sh === n ? top : top | 1n;
    e2 += len - 64;
  }
  return set(out, neg ? -Number(n) : Number(n), e2);
}
