/**
 * The conjugacy between the logistic map x -> r x (1 - x) and the quadratic
 * map z -> z^2 + c, on decimal strings at any precision.
 *
 * With z = r (1/2 - x) the logistic step becomes z -> z^2 + c where
 *   c = r/2 - r^2/4 = r (2 - r) / 4,      r = 1 + sqrt(1 - 4c).
 * (docs/methods.md E1; checked by expanding (r(1/2 - x))^2 + c = r(1/2 - r x (1 - x)).)
 *
 * Orientation flip: z = r (1/2 - x) with r > 0 reverses the order of the
 * line, so x > 1/2 exactly when z < 0. In the kneading letters of the
 * logistic map (R when x > 1/2) an R is a point left of the critical point 0
 * in the z coordinate. Along the parameter axis c and r also run in opposite
 * directions on r >= 1: larger r means smaller (more negative) c.
 *
 * The map r -> c is two-to-one (r and 2 - r give the same c); `cToR` returns
 * the branch r >= 1, the one on which the logistic map has its cascade.
 * Real c exists for every r; real r >= 1 exists only for c <= 1/4.
 *
 * Results are rounded to `digits` significant digits and written in plain
 * (never exponential) notation; the working precision carries 10 guard digits.
 */
import { Decimal } from 'decimal.js';

/** A Decimal constructor working at `digits` plus guard digits, printing plain notation. */
export function decimalAt(digits: number): typeof Decimal {
  return Decimal.clone({ precision: digits + 10, toExpNeg: -9e15, toExpPos: 9e15, rounding: Decimal.ROUND_HALF_EVEN });
}

/** Rounds a Decimal to `digits` significant digits as a plain decimal string. */
export function toDigits(value: Decimal, digits: number): string {
  const s = value.toSignificantDigits(digits).toString();
  return s === '-0' ? '0' : s;
}

/** c = r/2 - r^2/4 (docs/methods.md E1). */
export function rToC(r: string, digits: number): string {
  const D = decimalAt(digits);
  const rr = new D(r);
  return toDigits(rr.times(new D(2).minus(rr)).div(4), digits);
}

/**
 * r = 1 + sqrt(1 - 4c), the branch r >= 1 (docs/methods.md E1).
 * Throws RangeError for c > 1/4, where no real r exists.
 */
export function cToR(c: string, digits: number): string {
  const D = decimalAt(digits);
  const disc = new D(1).minus(new D(c).times(4));
  if (disc.isNegative()) throw new RangeError(`c = ${c} > 1/4 has no real logistic parameter r`);
  return toDigits(disc.sqrt().plus(1), digits);
}

/** z = r (1/2 - x): logistic state x at parameter r to the quadratic state z (docs/methods.md E1). */
export function xToZ(x: string, r: string, digits: number): string {
  const D = decimalAt(digits);
  return toDigits(new D(r).times(new D('0.5').minus(new D(x))), digits);
}

/**
 * x = 1/2 - z / r: quadratic state z to the logistic state x at parameter r.
 * Throws RangeError for r = 0, where the conjugacy degenerates.
 */
export function zToX(z: string, r: string, digits: number): string {
  const D = decimalAt(digits);
  const rr = new D(r);
  if (rr.isZero()) throw new RangeError('r = 0 has no conjugacy between x and z');
  return toDigits(new D('0.5').minus(new D(z).div(rr)), digits);
}
