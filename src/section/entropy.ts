/**
 * Topological entropy of a unimodal map from its kneading sequence, by the
 * Milnor-Thurston kneading determinant (J. Milnor, W. Thurston, "On iterated
 * maps of the interval", LNM 1342 (1988) 465-563; docs/methods.md E10).
 *
 * Let x_i = f^i(x_c) be the orbit of the critical point and eps_i = -1 when
 * x_i lies right of x_c (the decreasing branch, letter R), +1 when left (L).
 * With theta_0 = 1 and theta_i = eps_1 ... eps_i, the kneading series is
 * D(t) = sum_{i >= 0} theta_i t^i. The entropy is h = log(1/s) with s the
 * smallest zero of D in (0, 1), and h = 0 when D has none. When the critical
 * orbit returns to x_c at step p (a superstable parameter), D is
 * (sum_{i < p} theta_i t^i) / (1 -+ t^p), and the numerator decides the zero.
 *
 * When the letters are eventually periodic (the critical orbit is attracted
 * to a cycle: m letters, then a block B of q letters repeated, with sign
 * sigma = theta over one block), the series is rational,
 * D(t) = A(t) + t^m theta_m B'(t) / (1 - sigma t^q) with A the first m terms
 * and B' the block's, and the zero is taken from the numerator
 * A(t) (1 - sigma t^q) + t^m theta_m B'(t) exactly: no truncation.
 *
 * The letters are computed in high precision (BigInt fixed point for the
 * logistic family, decimal.js for the others) with enough digits for the
 * expansion of the orbit, and again with more: only the letters on which
 * both runs agree are used. Otherwise the series is truncated to its n
 * known terms, D = D_n + R_n with |R_n(t)| <= t^n / (1 - t) (every |theta_i|
 * is 1). Where D_n exceeds that bound (plus the rounding of its evaluation)
 * D has the sign of D_n: a sign change of D_n between two such points
 * brackets a zero of D, and a stretch (0, u) where D_n stays above the bound
 * proves D has no zero there, so h <= log(1/u). The result is either a value
 * (a bracketed zero) or an upper bound, never a guess. A rational case whose
 * zero the truncated series contradicts (a period mistaken from letters that
 * only looked periodic) falls back to the truncated answer.
 */
import { Decimal } from 'decimal.js';
import { fixedScale, fromDecimal } from '../precise/fixed.js';
import type { UnimodalFamily } from './unimodal-family.js';

export interface Kneading {
  /** Letters of x_1, x_2, ... (R, L; a final C when the orbit returns to the critical point). */
  readonly letters: string;
  /** True when the orbit returned exactly to x_c (the series is a rational function with that numerator). */
  readonly returned: boolean;
}

export interface Entropy {
  /** log(1/s) for the smallest zero s in (0, 1); 0 when there is none; for a bound, the bound. */
  readonly entropy: number;
  /**
   * How the value is known: 'returned' (the orbit returns to x_c: exact numerator), 'periodic' (eventually
   * periodic letters: exact rational series), 'bracketed' (a zero of the truncated series certified by the
   * remainder bound), 'bound' (entropy is at most `entropy`; the truncation cannot tell it from 0).
   */
  readonly basis: 'returned' | 'periodic' | 'bracketed' | 'bound';
  /** The smallest zero s of the kneading series in (0, 1), or null. */
  readonly zero: number | null;
  readonly letters: number;
  /** The eventual period of the letters in the periodic case, else null. */
  readonly period: number | null;
}

/** Largest |f'(x, r)| on the family's state interval, sampled, with a margin: the orbit's worst expansion per step. */
function expansionBound(family: UnimodalFamily, r: number): number {
  const [a, b] = family.stateRange;
  let most = 1;
  for (let k = 0; k <= 256; k++) most = Math.max(most, Math.abs(family.dfdx(a + ((b - a) * k) / 256, r)));
  return 1.1 * most;
}

function logisticLetters(r: string, count: number, bits: number): string {
  const s = fixedScale(bits);
  const rr = fromDecimal(r, s, 'r');
  const half = s.one >> 1n;
  let x = half;
  let out = '';
  for (let i = 0; i < count; i++) {
    // x <- r x (1 - x), each product rounded to nearest (fixed point, 2^-bits).
    x = (rr * ((x * (s.one - x) + s.half) >> s.shift) + s.half) >> s.shift;
    if (x === half) return `${out}C`;
    out += x > half ? 'R' : 'L';
  }
  return out;
}

function decimalLetters(family: UnimodalFamily, r: string, count: number, digits: number): string {
  const D = Decimal.clone({ precision: digits, rounding: Decimal.ROUND_HALF_EVEN });
  const rr = new D(r);
  const xc = new D(family.critical);
  let x = xc;
  let out = '';
  for (let i = 0; i < count; i++) {
    x = family.value(x, rr, D);
    const c = x.comparedTo(xc);
    if (c === 0) return `${out}C`;
    out += c > 0 ? 'R' : 'L';
  }
  return out;
}

/** The first `count` kneading letters of the family at r, each confirmed by a second run with more precision. */
export function kneadingSequence(family: UnimodalFamily, r: string, count: number): Kneading {
  const digits = Math.ceil(count * Math.log10(expansionBound(family, Number(r)))) + 20;
  const run = (extra: number): string =>
    family.name === 'logistic' ? logisticLetters(r, count, Math.ceil((digits + extra) * Math.log2(10))) : decimalLetters(family, r, count, digits + extra);
  const a = run(0);
  const b = run(20);
  let n = 0;
  while (n < a.length && n < b.length && a[n] === b[n]) n++;
  const letters = a.slice(0, n);
  return { letters, returned: letters.endsWith('C') };
}

/** theta_0 .. theta_(n-1) of the kneading series for these letters (a final C ends the numerator before it). */
export function kneadingCoefficients(letters: string): Int8Array {
  const n = letters.endsWith('C') ? letters.length : letters.length + 1;
  const theta = new Int8Array(n);
  theta[0] = 1;
  for (let i = 1; i < n; i++) theta[i] = letters[i - 1] === 'R' ? -theta[i - 1]! : theta[i - 1]!;
  return theta;
}

function series(theta: ArrayLike<number>, t: number): number {
  let v = 0;
  for (let i = theta.length - 1; i >= 0; i--) v = v * t + theta[i]!;
  return v;
}

/** Scan points for the first sign change: in -log t for exact numerators (short), in t for truncated series (long). */
const SCAN = 8192;
const TRUNCATED_SCAN = 2048;

function bisect(theta: ArrayLike<number>, lo: number, hi: number): number {
  const sLo = Math.sign(series(theta, lo));
  for (let i = 0; i < 200 && hi - lo > 1e-16; i++) {
    const m = (lo + hi) / 2;
    if (Math.sign(series(theta, m)) === sLo) lo = m;
    else hi = m;
  }
  return (lo + hi) / 2;
}

/** The smallest zero of an exactly known numerator sum theta_i t^i in (0, 1), or null (zeros at t = 1 are the denominator's). */
export function smallestZero(theta: ArrayLike<number>): number | null {
  // Scan in u = -log t so that small entropies near t = 1 are resolved as well as large ones.
  let a = 0;
  let fa = series(theta, 0);
  for (let k = 1; k <= SCAN; k++) {
    const b = Math.exp((-Math.log(2 ** 60) * (SCAN - k)) / SCAN) * (1 - 1e-12);
    const fb = series(theta, b);
    if (fb === 0) return b;
    if (Math.sign(fb) !== Math.sign(fa)) return bisect(theta, a, b);
    a = b;
    fa = fb;
  }
  return null;
}

/**
 * The truncated series' answer: a zero of the whole series bracketed where D_n
 * is outside its remainder bound, or the point u from which the bound hides
 * the sign (then h <= log(1/u)).
 */
export function truncatedZero(theta: ArrayLike<number>): { zero: number | null; certainUpTo: number } {
  const n = theta.length;
  const bound = (t: number): number => (t ** n + 4 * n * Number.EPSILON) / (1 - t);
  let a = 0;
  for (let k = 1; k <= TRUNCATED_SCAN; k++) {
    const t = k / (TRUNCATED_SCAN + 1);
    const v = series(theta, t);
    const e = bound(t);
    if (v > e) {
      a = t;
      continue;
    }
    if (v < -e) return { zero: bisect(theta, a, t), certainUpTo: t };
    return { zero: null, certainUpTo: a };
  }
  return { zero: null, certainUpTo: a };
}

/**
 * Eventual period of the letters: the least q with the last max(3q, n/2)
 * letters q-periodic, and the first index m from which they are, or null.
 */
export function eventualPeriod(letters: string): { start: number; period: number } | null {
  const n = letters.length;
  if (letters.endsWith('C')) return null;
  for (let q = 1; 4 * q <= n; q++) {
    let m = n - q;
    while (m > 0 && letters[m - 1] === letters[m - 1 + q]) m--;
    if (n - m >= Math.max(3 * q, n / 2)) return { start: m, period: q };
  }
  return null;
}

/** Numerator coefficients A(t)(1 - sigma t^q) + t^m theta_m B'(t) of the rational kneading series (see above). */
function rationalNumerator(theta: Int8Array, m: number, q: number): Int8Array {
  // theta_m .. theta_(m+q-1) is the block; theta_(m+q) = sigma theta_m.
  const sigma = theta[m + q]! * theta[m]!;
  const out = new Int8Array(m + q + 1);
  for (let i = 0; i < m; i++) {
    out[i] = out[i]! + theta[i]!;
    out[i + q] = out[i + q]! - sigma * theta[i]!;
  }
  for (let j = 0; j < q; j++) out[m + j] = out[m + j]! + theta[m + j]!;
  return out;
}

const entropyAt = (zero: number | null): number => (zero === null ? 0 : -Math.log(zero));

/** The topological entropy at parameter r from `count` kneading letters. */
export function topologicalEntropy(family: UnimodalFamily, r: string, count: number): Entropy {
  const k = kneadingSequence(family, r, count);
  const letters = k.letters.length;
  const theta = kneadingCoefficients(k.letters);
  if (k.returned) {
    const zero = smallestZero(theta);
    return { entropy: entropyAt(zero), basis: 'returned', zero, letters, period: null };
  }
  const truncated = truncatedZero(theta);
  const cycle = eventualPeriod(k.letters);
  if (cycle !== null) {
    // theta_i belongs to letter i (theta_i = eps_1 .. eps_i): the periodic letters start at theta index start + 1.
    const found = smallestZero(rationalNumerator(theta, cycle.start + 1, cycle.period));
    // A zero at t = 1 is the denominator's (1 - t^q), met by rounding just below 1: not an entropy.
    const zero = found !== null && found > 1 - 1e-9 ? null : found;
    // The truncated series proves D > 0 on (0, certainUpTo) and, with a bracket, where the zero is: agree or fall back.
    const consistent = truncated.zero !== null ? zero !== null && Math.abs(zero - truncated.zero) < 1e-9 : zero === null || zero >= truncated.certainUpTo;
    if (consistent) return { entropy: entropyAt(zero), basis: 'periodic', zero, letters, period: cycle.period };
  }
  if (truncated.zero !== null) return { entropy: entropyAt(truncated.zero), basis: 'bracketed', zero: truncated.zero, letters, period: null };
  return { entropy: -Math.log(truncated.certainUpTo), basis: 'bound', zero: null, letters, period: null };
}
