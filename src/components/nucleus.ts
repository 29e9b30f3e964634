/**
 * The nucleus (centre) of a hyperbolic component of period p, to any number
 * of digits, by Newton's method in BigInt fixed point.
 *
 * Method (docs/methods.md C2): Newton on G(c) = F^p(0,c) / prod_{q | p, q < p} F^q(0,c),
 * step 1 / (D_c F^p / F^p - sum_q D_c F^q / F^q), with D_c <- 2 z D_c + 1
 * (docs/methods.md A2). Sources: mathr.co.uk/web/m-nucleus.html; C. Heiland-Allen,
 * "Newton's method for periodic points" (mathr blog, 2018-11-17).
 * When the orbit escapes (|z| > 2^32) the step is estimated as
 * (z_k / D_c F^k) 2^-(p-k), since each further squaring halves the Newton
 * ratio (docs/methods.md C5(a)); this keeps far start points from building
 * enormous integers.
 *
 * Precision: bits = max(digits, -log10(size) + 12 digits) * log2(10) + guard,
 * raised after a first convergence once the size estimate is known
 * (docs/methods.md C2: at least -log2(size) + guard bits). A result is reported
 * only after Newton, restarted from it at more bits, moves it by less than
 * half a unit of the last reported digit, and after its exact period is
 * checked (|F^q(0,c)| for every proper divisor q of p must stay away from 0).
 */
import { bitLength, bitsForDigits, fixedScale, fromDecimal, fromNumber, toDecimal, toNumber } from '../precise/fixed.js';
import type { FixedScale } from '../precise/fixed.js';
import { NewtonError } from './newton-error.js';
import { properDivisors } from './periodic-angles.js';

/** A complex number as two decimal strings. */
export interface ComplexDecimal {
  re: string;
  im: string;
}

/** Newton steps allowed per precision before giving up. */
export const MAX_NEWTON_STEPS = 400;

/**
 * Newton from `guess` to the nucleus of exact period `period`, reported to
 * `digits` digits after the decimal point. Throws NewtonError when Newton
 * does not converge or converges to a nucleus of a lower exact period.
 */
export function findNucleus(period: number, guess: ComplexDecimal, digits: number): { nucleus: ComplexDecimal; steps: number } {
  const r = findNucleusFixed(period, guess, digits);
  return { nucleus: r.nucleus, steps: r.steps };
}

/** findNucleus with the fixed-point value and the bits it was confirmed at. */
export interface NucleusFixed {
  nucleus: ComplexDecimal;
  steps: number;
  re: bigint;
  im: bigint;
  scale: FixedScale;
}

export function findNucleusFixed(period: number, guess: ComplexDecimal, digits: number): NucleusFixed {
  const shown = `${guess.re},${guess.im}`;
  let bits = bitsForDigits(Math.max(digits, 12), 32);
  let s = fixedScale(bits);
  let c = { re: fromDecimal(guess.re, s, 'near'), im: fromDecimal(guess.im, s, 'near') };
  let steps = 0;
  for (let round = 0; round < 8; round += 1) {
    const r = newtonNucleus(period, c, s);
    steps += r.steps;
    if (!r.ok) {
      throw new NewtonError('near', `a start point in the Newton basin of a period-${period} nucleus`, shown, `Newton did not converge in ${r.steps} steps at ${bits} bits`);
    }
    c = r.c;
    const need = bitsNeeded(period, c, s, digits);
    if (need <= bits) break;
    c = { re: c.re << BigInt(need - bits), im: c.im << BigInt(need - bits) };
    bits = need;
    s = fixedScale(bits);
  }
  // confirm at higher precision
  const bits2 = bits + Math.max(32, Math.ceil(bits / 4));
  const s2 = fixedScale(bits2);
  const up = BigInt(bits2 - bits);
  const c2r = newtonNucleus(period, { re: c.re << up, im: c.im << up }, s2);
  steps += c2r.steps;
  if (!c2r.ok) throw new NewtonError('near', `a start point in the Newton basin of a period-${period} nucleus`, shown, `the result did not confirm at ${bits2} bits`);
  const c2 = c2r.c;
  const tol = (s2.one * 10n) / (2n * 10n ** BigInt(digits + 1)); // 1/2 unit of digit `digits`, rounded down
  const dre = c2.re - (c.re << up);
  const dim = c2.im - (c.im << up);
  if ((dre < 0n ? -dre : dre) > tol || (dim < 0n ? -dim : dim) > tol) {
    throw new NewtonError('near', `a start point in the Newton basin of a period-${period} nucleus`, shown, `the result moved when confirmed at ${bits2} bits`);
  }
  const lower = lowerPeriod(period, c2, s2);
  if (lower !== null) {
    throw new NewtonError('period', `the exact period of the nucleus found from ${shown}`, period, `Newton converged to a nucleus of exact period ${lower}`);
  }
  return { nucleus: formatComplex(c2, s2, digits), steps, re: c2.re, im: c2.im, scale: s2 };
}

/** Fixed point to decimal strings with `digits` after the point; exact 0 prints "0". */
export function formatComplex(c: { re: bigint; im: bigint }, s: FixedScale, digits: number): ComplexDecimal {
  return { re: formatReal(c.re, s, digits), im: formatReal(c.im, s, digits) };
}

export function formatReal(n: bigint, s: FixedScale, digits: number): string {
  return n === 0n ? '0' : toDecimal(n, s, { digits });
}

/** Bits the result needs: digits, and -log2(size) + 40 digits' worth so that the component is resolved. */
function bitsNeeded(period: number, c: { re: bigint; im: bigint }, s: FixedScale, digits: number): number {
  const log2size = log2SizeAt(period, c, s);
  // a zero multiplier along the orbit (a lower-period nucleus) gives -Infinity: the period check reports it
  const depthDigits = Number.isFinite(log2size) ? Math.max(0, Math.ceil(-log2size / Math.log2(10))) : 0;
  return bitsForDigits(Math.max(digits, depthDigits + 12), 32);
}

/** log2 |size estimate| at c (docs/methods.md C4), from the fixed-point orbit with scaled doubles. */
export function log2SizeAt(period: number, c: { re: bigint; im: bigint }, s: FixedScale): number {
  let zr = 0n;
  let zi = 0n;
  // lambda and beta as (double complex) * 2^exp
  let lr = 1;
  let li = 0;
  let le = 0;
  let br = 1;
  let bi = 0;
  for (let k = 1; k < period; k += 1) {
    const nzr = ((zr * zr - zi * zi) >> s.shift) + c.re;
    zi = ((zr * zi) >> (s.shift - 1n)) + c.im;
    zr = nzr;
    const xr = toNumber(zr, s);
    const xi = toNumber(zi, s);
    const nlr = 2 * (xr * lr - xi * li);
    li = 2 * (xr * li + xi * lr);
    lr = nlr;
    const m = Math.hypot(lr, li);
    if (m === 0) return -Infinity;
    const e = Math.round(Math.log2(m));
    lr *= 2 ** -e;
    li *= 2 ** -e;
    le += e;
    // beta += 1/lambda = conj(l) / |l|^2 * 2^-le
    const mm = lr * lr + li * li;
    const f = 2 ** -le;
    if (f !== 0 && Number.isFinite(f)) {
      br += (lr / mm) * f;
      bi -= (li / mm) * f;
    }
  }
  // s = 1 / (beta lambda^2): log2|s| = -(log2|beta| + 2 (log2|l| + le))
  return -(Math.log2(Math.hypot(br, bi)) + 2 * (Math.log2(Math.hypot(lr, li)) + le));
}

/** Returns a proper divisor q of p with F^q(0,c) ~ 0, or null. */
function lowerPeriod(period: number, c: { re: bigint; im: bigint }, s: FixedScale): number | null {
  const divisors = properDivisors(period);
  if (divisors.length === 0) return null;
  let zr = 0n;
  let zi = 0n;
  const limit = s.bits - Math.floor(s.bits / 2); // |z_q| < 2^-(bits/2) counts as 0
  for (let k = 1; k < period; k += 1) {
    const nzr = ((zr * zr - zi * zi) >> s.shift) + c.re;
    zi = ((zr * zi) >> (s.shift - 1n)) + c.im;
    zr = nzr;
    if (period % k === 0 && Math.max(bitLength(zr), bitLength(zi)) < limit) return k;
  }
  return null;
}

interface NewtonResult {
  ok: boolean;
  c: { re: bigint; im: bigint };
  steps: number;
}

/** Deflated Newton for the period-p nucleus at a fixed scale; converged when |step| < 2^16 ulp, then one more step. */
export function newtonNucleus(period: number, start: { re: bigint; im: bigint }, s: FixedScale): NewtonResult {
  let cr = start.re;
  let ci = start.im;
  const sh = s.shift;
  const one = s.one;
  const escape = 1n << (sh + 32n); // |re z| or |im z| > 2^32
  const doneBits = 17;
  let closeSteps = 0;
  for (let step = 1; step <= MAX_NEWTON_STEPS; step += 1) {
    let zr = 0n;
    let zi = 0n;
    let dr = 0n;
    let di = 0n;
    // L = sum over divisors of D_c F^q / F^q, as doubles scaled (only the direction matters far away)
    let lr = 0;
    let li = 0;
    let hr: bigint | null = null;
    let hi: bigint | null = null;
    for (let k = 1; k <= period; k += 1) {
      const ndr = ((zr * dr - zi * di) >> (sh - 1n)) + one;
      di = (zr * di + zi * dr) >> (sh - 1n);
      dr = ndr;
      const nzr = ((zr * zr - zi * zi) >> sh) + cr;
      zi = ((zr * zi) >> (sh - 1n)) + ci;
      zr = nzr;
      if (zr > escape || zr < -escape || zi > escape || zi < -escape) {
        // step ~ (z_k / d_k) 2^-(p-k)
        const q = cdivFixed(zr, zi, dr, di, sh);
        const down = BigInt(period - k);
        hr = q.re >> down;
        hi = q.im >> down;
        break;
      }
      if (k < period && period % k === 0 && (zr !== 0n || zi !== 0n)) {
        const x = toNumber(zr, s);
        const y = toNumber(zi, s);
        const u = toNumber(dr, s);
        const v = toNumber(di, s);
        const m = x * x + y * y;
        if (m > 0) {
          lr += (u * x + v * y) / m;
          li += (v * x - u * y) / m;
        }
      }
    }
    if (hr === null || hi === null) {
      if (zr === 0n && zi === 0n) return { ok: true, c: { re: cr, im: ci }, steps: step };
      // step = 1 / (d/z - L) = z / (d - L z)
      let er = dr;
      let ei = di;
      if (lr !== 0 || li !== 0) {
        // L z in fixed point through doubles: fine, the correction only matters far from the root
        const x = toNumber(zr, s);
        const y = toNumber(zi, s);
        const fr = lr * x - li * y;
        const fi = lr * y + li * x;
        if (Number.isFinite(fr) && Number.isFinite(fi)) {
          er -= fromNumber(fr, s);
          ei -= fromNumber(fi, s);
        }
      }
      if (er === 0n && ei === 0n) return { ok: false, c: { re: cr, im: ci }, steps: step };
      const q = cdivFixed(zr, zi, er, ei, sh);
      hr = q.re;
      hi = q.im;
    }
    cr -= hr;
    ci -= hi;
    const size = Math.max(bitLength(hr), bitLength(hi));
    if (size <= doneBits) {
      closeSteps += 1;
      if (closeSteps >= 2 || (hr === 0n && hi === 0n)) return { ok: true, c: { re: cr, im: ci }, steps: step };
    }
  }
  return { ok: false, c: { re: cr, im: ci }, steps: MAX_NEWTON_STEPS };
}

/** (a + ib) / (c + id) in fixed point (truncating). */
function cdivFixed(a: bigint, b: bigint, c: bigint, d: bigint, sh: bigint): { re: bigint; im: bigint } {
  const den = c * c + d * d;
  return { re: ((a * c + b * d) << sh) / den, im: ((b * c - a * d) << sh) / den };
}
