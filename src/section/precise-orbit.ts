/**
 * An orbit printed to D digits after the point, with an honest count of the
 * steps whose printed digits are right.
 *
 * A chaotic orbit multiplies an error by about e^lambda a step (lambda the
 * Lyapunov exponent, docs/methods.md E6), so it loses one decimal digit every
 * ln 10 / lambda steps. To print n steps to D digits the orbit is therefore
 * computed with D + G significant digits, G = 10 + ceil(n max(lambda, 0) / ln 10)
 * guard digits, and the whole run is repeated with 20 more digits: a printed
 * value is trusted while the two runs agree on it (rounded to D digits), and
 * each row also carries the number of digits after the point in which the
 * two runs agree. Rerunning at higher precision and comparing is the
 * standard empirical check (e.g. N. J. Higham, Accuracy and Stability of
 * Numerical Algorithms, 2nd ed. (2002), section 1.1 on the role of
 * precision); it can overstate the accuracy only if both runs err alike,
 * which 20 digits of difference make unlikely for an expanding map.
 */
import { Decimal } from 'decimal.js';
import type { UnimodalFamily } from './unimodal-family.js';

/** Most working digits; beyond it the orbit is computed there and fewer steps are trusted. */
export const MAX_WORKING_DIGITS = 20_000;
/** Extra digits of the confirming rerun. */
export const CHECK_EXTRA_DIGITS = 20;

export interface PreciseOrbit {
  /** x_0 .. x_n, each rounded to `digits` places after the point. */
  readonly values: readonly string[];
  /** Digits after the point in which the run and its rerun agree, per step (at most `digits`). */
  readonly agree: readonly number[];
  /** Steps 0 .. trustedSteps - 1 are printed right (the two runs round alike). */
  readonly trustedSteps: number;
  /** The first step where the runs round differently, or null when all n + 1 agree. */
  readonly firstDisagreement: number | null;
  readonly digits: number;
  readonly workingDigits: number;
  readonly checkDigits: number;
  /** ln 10 / lambda: steps per digit lost (null when lambda <= 0: the orbit does not lose digits). */
  readonly stepsPerDigit: number | null;
  /** The estimate D ln 10 / lambda of steps before the D printed digits would be lost at D-digit working precision. */
  readonly estimate: number | null;
}

function run(family: UnimodalFamily, r: string, x0: string, n: number, precision: number): Decimal[] {
  const D = Decimal.clone({ precision, rounding: Decimal.ROUND_HALF_EVEN });
  const rr = new D(r);
  let x = new D(x0);
  const out = [x];
  for (let k = 0; k < n; k++) {
    x = family.value(x, rr, D);
    out.push(x);
  }
  return out;
}

function show(x: Decimal, digits: number): string {
  const s = x.toFixed(digits);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/**
 * The orbit of x0 under f(., r) for n steps, printed to `digits` places, with
 * its trusted count (see above). `guard` overrides the guard digits (for
 * testing the count with too little precision).
 */
export function preciseOrbit(family: UnimodalFamily, r: string, x0: string, n: number, digits: number, lyapunov: number, guard?: number): PreciseOrbit {
  const lambda = Number.isFinite(lyapunov) ? lyapunov : 0;
  guard ??= 10 + Math.ceil((n * Math.max(lambda, 0)) / Math.LN10);
  const working = Math.min(MAX_WORKING_DIGITS, digits + guard);
  const check = working + CHECK_EXTRA_DIGITS;
  const a = run(family, r, x0, n, working);
  const b = run(family, r, x0, n, check);
  const values: string[] = [];
  const agree: number[] = [];
  let first: number | null = null;
  for (let k = 0; k <= n; k++) {
    const sa = show(a[k]!, digits);
    values.push(sa);
    if (first === null && sa !== show(b[k]!, digits)) first = k;
    const diff = a[k]!.minus(b[k]!).abs();
    agree.push(diff.isZero() ? digits : Math.max(0, Math.min(digits, Math.floor(-diff.log(10).toNumber()))));
  }
  const stepsPerDigit = lambda > 0 ? Math.LN10 / lambda : null;
  return {
    values,
    agree,
    trustedSteps: first ?? n + 1,
    firstDisagreement: first,
    digits,
    workingDigits: working,
    checkDigits: check,
    stepsPerDigit,
    estimate: stepsPerDigit === null ? null : digits * stepsPerDigit,
  };
}
