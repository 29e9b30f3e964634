/**
 * The reference orbit for perturbation (docs/methods.md B1, B7): Z_0 = 0,
 * Z_{m+1} = Z_m^2 + C iterated in BigInt fixed point at a precision chosen
 * from the span, each iterate rounded once to a double for the per-pixel
 * kernels.
 *
 * Sources: K. I. Martin's perturbation note as corrected on
 * math.stackexchange.com/questions/939270; C. Heiland-Allen,
 * mathr.co.uk/web/deep-zoom.html section 2. Precision rule (B7): bits about
 * -log2(pixel spacing) plus guard bits.
 *
 * The result is plain data (strings, numbers, typed arrays) so that it can
 * be posted to workers as is, or copied once into SharedArrayBuffers with
 * {@link shareReferenceOrbit}.
 */
import { fixedScale, fromDecimal, bitLength } from './fixed.js';
import type { FixedScale } from './fixed.js';
import { parseDecimal } from './decimal-string.js';
import { ldexp } from './floatexp.js';

/**
 * Iterates with |Z_m| below this are also kept as floatexp (mantissa and
 * exponent), because a double would lose them (subnormal or zero) and the
 * deep kernel's rescaled steps need them in full range.
 */
export const TINY_ITERATE = 2 ** -500;

/** A reference orbit as plain data. */
export interface ReferenceOrbit {
  /** The reference point C exactly as given (decimal strings). */
  readonly centreRe: string;
  readonly centreIm: string;
  /** Fractional bits of the fixed-point iteration. */
  readonly bits: number;
  /** M: iterates Z_0..Z_M are stored (arrays have M + 1 entries). */
  readonly length: number;
  /** Z_m rounded to double (0 or subnormal where it underflows; see tiny*). */
  readonly re: Float64Array;
  readonly im: Float64Array;
  /** True when |Z_M| > escapeRadius (the reference escaped at M). */
  readonly escaped: boolean;
  /** The escape radius used for the reference. */
  readonly escapeRadius: number;
  /** p when the orbit was computed as periodic (length = p, Z_p ~ 0), else 0. */
  readonly period: number;
  /**
   * Iterates with 0 < |Z_m| < TINY_ITERATE, in full range:
   * Z_m = (tinyRe[k] + i tinyIm[k]) * 2^tinyExp[k] for m = tinyIndex[k]
   * (indices increasing). Empty in almost every orbit; for a periodic orbit
   * Z_p lands here unless it rounded to exactly 0.
   */
  readonly tinyIndex: Int32Array;
  readonly tinyRe: Float64Array;
  readonly tinyIm: Float64Array;
  readonly tinyExp: Int32Array;
}

/** Options of {@link computeReferenceOrbit}. */
export interface ReferenceOptions {
  /** Stop when |Z_m| exceeds this (default 2^10, the shallow kernel's usual radius). */
  readonly escapeRadius?: number;
  /**
   * Compute a periodic reference: C is (to the given digits) a nucleus of
   * this period, so only Z_0..Z_p are stored and the kernel rebases at m = p
   * (docs/methods.md B3). Z_p is kept as computed (tiny, not forced to 0), so the
   * rebase stays exact even when C is only close to the nucleus.
   */
  readonly period?: number;
}

const LOG2_10 = Math.log2(10);

/**
 * Fractional bits for a reference at this span and pixel count
 * (docs/methods.md B7): ceil(-log2(span / pixels)) + guard, at least 64.
 * `span` is a positive decimal string (validated by the caller).
 *
 * Guard 64 (the top of B7's 16-64): C is rounded to 2^-bits, which moves
 * every pixel by 2^-guard of a pixel. Measured at span 1.8e-94 beside a
 * period-127 minibrot: with guard 32 a pixel escaping after ~37 000
 * iterations was off by 244 against decimal.js, with 64 it was exact; the
 * reference then costs ~20% more BigInt time, a small part of a plate.
 */
export function referenceBits(span: string, pixels: number, guard = 64): number {
  const d = parseDecimal(span, 'span');
  const digits = d.mantissa.toString();
  // log2(span) from the leading 15 digits and the decimal exponent
  const lead = Number(digits.slice(0, 15));
  const log2Span = Math.log2(lead) + (d.exponent + Math.max(0, digits.length - 15)) * LOG2_10;
  const log2Spacing = log2Span - Math.log2(Math.max(1, pixels));
  return Math.max(64, Math.ceil(-log2Spacing) + guard);
}

const TOP_MIN = 1n << 64n;

/**
 * n * 2^-bits as a double. Fast path for |value| >= 2^-56: keep 120
 * fractional bits (at least 64 significant) and let Number() round, so the
 * truncation before it moves the result by at most 2^-64 relative; below
 * that the exact sticky-bit conversion.
 */
function toDouble(n: bigint, bits: number, shift120: bigint): number {
  if (bits > 120) {
    const top = n >> shift120;
    if (top >= TOP_MIN || top <= -TOP_MIN) return Number(top) * 2 ** -120;
  }
  return exactToDouble(n, bits);
}

/** Nearest double of n * 2^-bits for small values (sticky-bit rounding). */
function exactToDouble(n: bigint, bits: number): number {
  if (n === 0n) return 0;
  const neg = n < 0n;
  let a = neg ? -n : n;
  let e = -bits;
  const len = bitLength(a);
  if (len > 64) {
    const sh = BigInt(len - 64);
    const top = a >> sh;
    a = top << sh === a ? top : top | 1n;
    e += len - 64;
  }
  const x = ldexp(Number(a), e);
  return neg ? -x : x;
}

/**
 * A reference orbit being computed: the BigInt state after the last stored
 * iterate and growable arrays, so that the orbit can be extended in chunks
 * as the iteration limit is raised (the probe of an `auto` limit,
 * plane/deep/probe-limit.ts) and never computed further than asked. The
 * iterates do not depend on how the length was reached: extending 0..a then
 * a..b gives the same doubles as computing 0..b at once (tested).
 * Main-thread only (BigInts do not cross to workers); snapshot with
 * {@link orbitSnapshot}.
 */
export interface ReferenceBuilder {
  readonly centre: { readonly re: string; readonly im: string };
  readonly bits: number;
  readonly escapeRadius: number;
  /** p > 0: stop at Z_p (one cycle of a nucleus), else 0. */
  readonly period: number;
  /** Iterates computed so far (Z_0..Z_length). */
  length: number;
  escaped: boolean;
  re: Float64Array;
  im: Float64Array;
  readonly tinyIndex: number[];
  readonly tinyRe: number[];
  readonly tinyIm: number[];
  readonly tinyExp: number[];
  zr: bigint;
  zi: bigint;
  readonly cr: bigint;
  readonly ci: bigint;
}

/** A builder holding only Z_0 = 0 for the reference point `centre` at `bits` fractional bits. */
export function startReferenceOrbit(centre: { readonly re: string; readonly im: string }, bits: number, options: ReferenceOptions = {}): ReferenceBuilder {
  const s: FixedScale = fixedScale(bits);
  return {
    centre: { re: centre.re, im: centre.im },
    bits,
    escapeRadius: options.escapeRadius ?? 2 ** 10,
    period: options.period ?? 0,
    length: 0,
    escaped: false,
    re: new Float64Array(1),
    im: new Float64Array(1),
    tinyIndex: [],
    tinyRe: [],
    tinyIm: [],
    tinyExp: [],
    zr: 0n,
    zi: 0n,
    cr: fromDecimal(centre.re, s, 'centre'),
    ci: fromDecimal(centre.im, s, 'centre'),
  };
}

/** Whether the builder can give no more iterates (escaped, or one full cycle of a periodic reference). */
export function orbitComplete(b: ReferenceBuilder): boolean {
  return b.escaped || (b.period > 0 && b.length >= b.period);
}

/**
 * Extends the orbit to Z_0..Z_length (or to its escape, or to Z_p for a
 * periodic reference, whichever comes first). Array capacity grows by
 * doubling as iterates are computed (chunks of at least 1024), capped at the
 * length asked for, so memory follows the orbit computed, not the limit it
 * might reach.
 */
export function extendReferenceOrbit(b: ReferenceBuilder, length: number): ReferenceBuilder {
  const steps = b.period > 0 ? Math.min(b.period, length) : length;
  if (orbitComplete(b) || b.length >= steps) return b;
  const bits = b.bits;
  const s: FixedScale = fixedScale(bits);
  const shift = s.shift;
  const halfUp = s.half;
  // |Z|^2 > R^2 in fixed point: compare zr^2 + zi^2 (scale 2^(2 bits)) with R^2 2^(2 bits)
  const r2 = BigInt(Math.ceil(b.escapeRadius * b.escapeRadius)) << (2n * shift);
  const shift120 = BigInt(Math.max(0, bits - 120));
  const { cr, ci } = b;
  let { re, im } = b;
  let zr = b.zr;
  let zi = b.zi;
  let m = b.length;
  let escaped = false;
  while (m < steps) {
    const rr = zr * zr;
    const ii = zi * zi;
    const ri = zr * zi;
    zr = ((rr - ii + halfUp) >> shift) + cr;
    zi = ((ri + (halfUp >> 1n)) >> (shift - 1n)) + ci;
    m += 1;
    if (m >= re.length) {
      // grow by doubling in chunks of at least 1024, never beyond the length asked for
      const capacity = Math.min(steps + 1, Math.max(2 * re.length, 1025));
      const nre = new Float64Array(capacity);
      const nim = new Float64Array(capacity);
      nre.set(re);
      nim.set(im);
      re = nre;
      im = nim;
    }
    const x = toDouble(zr, bits, shift120);
    const y = toDouble(zi, bits, shift120);
    re[m] = x;
    im[m] = y;
    if (Math.abs(x) + Math.abs(y) < TINY_ITERATE && (zr !== 0n || zi !== 0n)) {
      // full-range copy with a shared exponent for both parts
      const big = (zr < 0n ? -zr : zr) > (zi < 0n ? -zi : zi) ? zr : zi;
      const e = bitLength(big) - bits; // 2^(e-1) <= |big| 2^-bits < 2^e
      b.tinyIndex.push(m);
      b.tinyRe.push(exactToDouble(zr, bits + e));
      b.tinyIm.push(exactToDouble(zi, bits + e));
      b.tinyExp.push(e);
    }
    if (zr * zr + zi * zi > r2) {
      escaped = true;
      break;
    }
  }
  b.re = re;
  b.im = im;
  b.zr = zr;
  b.zi = zi;
  b.length = m;
  b.escaped = escaped;
  return b;
}

/** The orbit computed so far as plain data (arrays copied to their length). */
export function orbitSnapshot(b: ReferenceBuilder): ReferenceOrbit {
  const m = b.length;
  return {
    centreRe: b.centre.re,
    centreIm: b.centre.im,
    bits: b.bits,
    length: m,
    re: b.re.slice(0, m + 1),
    im: b.im.slice(0, m + 1),
    escaped: b.escaped,
    escapeRadius: b.escapeRadius,
    period: b.period > 0 && !b.escaped && m === b.period ? b.period : 0,
    tinyIndex: Int32Array.from(b.tinyIndex),
    tinyRe: Float64Array.from(b.tinyRe),
    tinyIm: Float64Array.from(b.tinyIm),
    tinyExp: Int32Array.from(b.tinyExp),
  };
}

/** Bytes an orbit of this many stored iterates holds (two doubles each, plus its tiny iterates). */
export function orbitBytes(orbit: ReferenceOrbit): number {
  return 16 * (orbit.length + 1) + 24 * orbit.tinyIndex.length;
}

/**
 * Computes Z_0..Z_M for the reference point `centre` at `bits` fractional
 * bits, stopping at escape (|Z_M| > escapeRadius), after `maxIterations`
 * steps, or after `options.period` steps. Decimal strings are parsed
 * exactly (fixed.ts) and never pass through a double.
 */
export function computeReferenceOrbit(centre: { readonly re: string; readonly im: string }, bits: number, maxIterations: number, options: ReferenceOptions = {}): ReferenceOrbit {
  return orbitSnapshot(extendReferenceOrbit(startReferenceOrbit(centre, bits, options), maxIterations));
}

/**
 * Copies a reference orbit's arrays into SharedArrayBuffers, so that every
 * worker of a plate reads one copy (post the result; nothing is cloned
 * but the small header).
 */
export function shareReferenceOrbit(orbit: ReferenceOrbit): ReferenceOrbit {
  const f64 = (a: Float64Array): Float64Array => {
    const out = new Float64Array(new SharedArrayBuffer(a.byteLength));
    out.set(a);
    return out;
  };
  const i32 = (a: Int32Array): Int32Array => {
    const out = new Int32Array(new SharedArrayBuffer(Math.max(4, a.byteLength)), 0, a.length);
    out.set(a);
    return out;
  };
  return {
    ...orbit,
    re: f64(orbit.re),
    im: f64(orbit.im),
    tinyIndex: i32(orbit.tinyIndex),
    tinyRe: f64(orbit.tinyRe),
    tinyIm: f64(orbit.tinyIm),
    tinyExp: i32(orbit.tinyExp),
  };
}

/**
 * The offset point - reference.centre in units of 2^exponent, as two
 * doubles (exact decimal subtraction in fixed point, one rounding each).
 * The renderer uses this for the offset of a view centre (or a tile corner)
 * from the reference; `bits` must resolve 2^exponent (e.g. the orbit's bits).
 */
export function referenceOffset(
  orbit: Pick<ReferenceOrbit, 'centreRe' | 'centreIm' | 'bits'>,
  point: { readonly re: string; readonly im: string },
  exponent: number,
  bits: number = orbit.bits,
): { re: number; im: number } {
  const s = fixedScale(bits);
  const dr = fromDecimal(point.re, s, 'centre') - fromDecimal(orbit.centreRe, s, 'centre');
  const di = fromDecimal(point.im, s, 'centre') - fromDecimal(orbit.centreIm, s, 'centre');
  return { re: exactToDouble(dr, bits + exponent), im: exactToDouble(di, bits + exponent) };
}
