/**
 * Convergence acceleration of a geometrically converging sequence by
 * repeated Aitken delta-squared (A. C. Aitken, Proc. Roy. Soc. Edinburgh 46
 * (1926) 289-305; repeated application as in C. Brezinski & M. Redivo
 * Zaglia, Extrapolation Methods, 1991, ch. 2). docs/methods.md E3: delta_n and
 * alpha_n converge like delta^-n, and one Aitken pass already gains about
 * three digits; each further pass removes the next geometric error term.
 *
 * Honest digits: every column of the Aitken table is itself a sequence; the
 * estimate is the last entry of the column whose last two entries agree
 * best, and the digits trusted are those on which those two entries agree,
 * less one for safety. Richardson extrapolation with a fixed ratio 1/delta
 * was tried as the alternative; it needs the ratio of every error term in
 * advance (delta^-1, delta^-2, alpha^-2 ...), which Aitken estimates itself.
 */
import type { Decimal } from 'decimal.js';

export interface Accelerated {
  /** The accelerated estimate. */
  value: Decimal;
  /** Significant digits trusted (0 when nothing can be trusted). */
  digits: number;
  /** Number of Aitken passes behind the value. */
  passes: number;
}

/** One Aitken pass: x_i - (x_{i+1} - x_i)^2 / (x_{i+2} - 2 x_{i+1} + x_i). */
export function aitkenPass(xs: readonly Decimal[]): Decimal[] {
  const out: Decimal[] = [];
  for (let i = 0; i + 2 < xs.length; i++) {
    const [a, b, c] = [xs[i]!, xs[i + 1]!, xs[i + 2]!];
    const den = c.minus(b.times(2)).plus(a);
    if (den.isZero()) out.push(c);
    else out.push(a.minus(b.minus(a).pow(2).div(den)));
  }
  return out;
}

/** Significant digits on which a and b agree: floor(-log10(|a - b| / |a|)). */
export function agreeingDigits(a: Decimal, b: Decimal, cap: number): number {
  const diff = a.minus(b).abs();
  if (diff.isZero()) return cap;
  if (a.isZero()) return 0;
  const rel = diff.div(a.abs());
  const d = Math.floor(-rel.log(10).toNumber());
  return Math.max(0, Math.min(cap, d));
}

/**
 * Repeated Aitken over `xs` (at least 2 entries); `cap` bounds the digits
 * claimed (the working precision of the terms).
 */
export function accelerate(xs: readonly Decimal[], cap: number): Accelerated {
  if (xs.length === 0) throw new RangeError('accelerate needs at least one term');
  let best: Accelerated = { value: xs[xs.length - 1]!, digits: 0, passes: 0 };
  let bestAgree = -1;
  let column: Decimal[] = [...xs];
  let input: Decimal[] | undefined;
  for (let passes = 0; column.length >= 2; passes++) {
    // A column counts only if the sequence it came from visibly converges
    // (last difference ratio below 0.8): Aitken turns 1, -1, 1, ... into an
    // exact 0, which agrees with itself but means nothing.
    if (!converging(input ?? column)) break;
    const last = column[column.length - 1]!;
    const agree = agreeingDigits(last, column[column.length - 2]!, cap);
    if (agree > bestAgree) {
      bestAgree = agree;
      best = { value: last, digits: Math.max(0, agree - 1), passes };
    }
    input = column;
    column = aitkenPass(column);
  }
  return best;
}

/** True when |x_n - x_{n-1}| / |x_{n-1} - x_{n-2}| < 0.8 at the end of xs (or the last difference is 0). */
function converging(xs: readonly Decimal[]): boolean {
  const n = xs.length;
  if (n < 3) return false;
  const d1 = xs[n - 1]!.minus(xs[n - 2]!).abs();
  const d0 = xs[n - 2]!.minus(xs[n - 3]!).abs();
  if (d1.isZero()) return true;
  return d1.lt(d0.times(0.8));
}
