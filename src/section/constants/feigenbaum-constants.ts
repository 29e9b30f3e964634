/**
 * Feigenbaum's alpha and delta for a maximum of order Z from the
 * renormalisation fixed point (docs/methods.md, "Feigenbaum constants from
 * the fixed point"): the plan (how many terms, how many bits, how much
 * memory), one computation at one truncation, and the digits two
 * truncations agree on. The two truncations are independent computations,
 * so the caller may run them on two threads; neither depends on the other
 * or on the thread count.
 */
import { Decimal } from 'decimal.js';
import { BASE_BITS, CONTINUATION_TERMS, LU_BITS, solveFixedPoint, type FixedPointSolution, type NewtonStep } from './fixed-point.js';
import { deltaEstimate, refineDelta } from './doubling-eigenvalue.js';

export const MIN_ORDER = 2;
export const MAX_ORDER = 16;

/**
 * Decimal digits gained per Chebyshev term, measured at orders 2, 3, 4, 6,
 * 8, 12 (1.6, 1.2, 1.0, 0.83, 0.69, 0.57 per term in the fixed-point
 * defect) and fitted by 2.3 / Z^0.55; we plan with 2.2 for a margin.
 */
export function digitsPerTerm(order: number): number {
  return 2.2 / Math.pow(order, 0.55);
}

export interface ConstantsPlan {
  readonly order: number;
  readonly digits: number;
  /** The two truncations, fewer terms first. */
  readonly terms: readonly [number, number];
  /** Fractional bits of the arithmetic. */
  readonly bits: number;
  /** Estimated peak heap of the larger truncation, bytes. */
  readonly bytes: number;
}

/**
 * Peak heap of one truncation, bytes. A BigInt of b bits costs about b/8
 * bytes plus a header; the N^2 arrays (the Jacobian or pencil, its LU and
 * the basis values at the collocation points) hold about 6 N^2 of them at
 * LU_BITS, while the full precision lives only in O(N) vectors.
 */
export function memoryEstimate(terms: number, bits: number): number {
  return 6 * terms * terms * (Math.min(bits, LU_BITS) / 8 + 32) + 40 * terms * (bits / 8 + 32);
}

/** Terms and bits for `digits` significant digits of alpha and delta at order Z. */
export function constantsPlan(order: number, digits: number): ConstantsPlan {
  const rate = digitsPerTerm(order);
  const lower = Math.max(CONTINUATION_TERMS + 2, Math.ceil((digits + 8) / rate) + 2);
  const upper = Math.ceil(lower * 1.15) + 3;
  const bits = Math.ceil((digits + 12) * Math.log2(10)) + 64;
  return { order, digits, terms: [lower, upper], bits, bytes: memoryEstimate(upper, bits) };
}

export interface ConstantsAt {
  readonly order: number;
  readonly terms: number;
  /** alpha = -1/g(1) and delta, written to `places` digits after the point (rounded to nearest). */
  readonly alpha: string;
  readonly delta: string;
  readonly solution: FixedPointSolution;
}

/** Fixed-point BigInt n * 2^-bits to `places` digits after the point, rounded to nearest. */
export function fixedText(n: bigint, bits: number, places: number): string {
  const neg = n < 0n;
  const a = neg ? -n : n;
  const scaled = (a * 10n ** BigInt(places) + (1n << BigInt(bits - 1))) >> BigInt(bits);
  const s = scaled.toString().padStart(places + 1, '0');
  return `${neg ? '-' : ''}${s.slice(0, s.length - places)}${places > 0 ? `.${s.slice(s.length - places)}` : ''}`;
}

/** Terms of the two low truncations that locate delta (about 12 and 16 digits each). */
function estimateTerms(order: number): [number, number] {
  const rate = digitsPerTerm(order);
  return [Math.ceil(12 / rate), Math.ceil(16 / rate)];
}

/** alpha and delta from one truncation of `terms` Chebyshev terms at `bits`. */
export function constantsAt(order: number, terms: number, bits: number, places: number, step?: (s: NewtonStep) => void): ConstantsAt {
  const [a, b] = estimateTerms(order);
  const estimate = deltaEstimate(solveFixedPoint(order, a, BASE_BITS), solveFixedPoint(order, b, BASE_BITS));
  const solution = solveFixedPoint(order, terms, bits, step);
  const delta = refineDelta(solution, estimate, BASE_BITS, step);
  const shift = BigInt(bits);
  const alpha = -((1n << (2n * shift)) / solution.g1);
  return { order, terms, alpha: fixedText(alpha, bits, places), delta: fixedText(delta, bits, places), solution };
}

/** The digits two decimal strings share from the left, and how many significant digits that is. */
export function agreeingDigits(a: string, b: string): { text: string; significant: number } {
  let k = 0;
  while (k < a.length && k < b.length && a[k] === b[k]) k++;
  let text = a.slice(0, k);
  if (text.endsWith('.')) text = text.slice(0, -1);
  const digits = text.replace(/^-/, '').replace('.', '').replace(/^0+/, '');
  return { text, significant: digits.length };
}

/**
 * Progress of one truncation from its last Newton step: the fixed point is
 * the first half and delta the second, each measured by the bits its
 * correction has reached out of the target.
 */
export function truncationProgress(step: NewtonStep, bits: number): number {
  const reached = Math.min(1, Math.max(0, -step.correctionLog2) / bits);
  return (step.stage === 'fixed point' ? 0 : 0.5) + 0.5 * reached;
}

/**
 * The significant digits of the estimate `x` that are right: the largest k up
 * to its length with x and the fixed-point value `y` equal when both are
 * rounded to k significant digits (a rounded estimate may end in a digit
 * the longer value does not show).
 */
export function roundedAgreement(x: string, y: string): number {
  const a = new Decimal(x);
  const b = new Decimal(y);
  const shown = x.replace(/^-/, '').replace('.', '').replace(/^0+/, '').length;
  for (let k = shown; k >= 1; k--) if (a.toSignificantDigits(k).eq(b.toSignificantDigits(k))) return k;
  return 0;
}
