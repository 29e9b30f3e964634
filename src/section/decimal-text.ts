/**
 * How the real-slice tables write numbers, one rule for every command:
 * `--digits D` is the number of digits after the decimal point (absolute
 * accuracy 10^-D); a value written with an exponent (a width, a size, a
 * spread) carries D significant digits. Plain decimals drop trailing zeros
 * (the value is exact to 10^-D either way), so an exact -2 prints as "-2".
 */
import { Decimal } from 'decimal.js';

/** decimal.js set to print plain notation at any size. */
const Plain = Decimal.clone({ precision: 40, toExpNeg: -9e15, toExpPos: 9e15, rounding: Decimal.ROUND_HALF_EVEN });

/**
 * `value` rounded half-even to `places` digits after the decimal point, in
 * plain notation, without trailing zeros; never "-0".
 */
export function toPlaces(value: Decimal | string, places: number): string {
  const v = new Plain(value.toString());
  let s = v.toFixed(places, Decimal.ROUND_HALF_EVEN);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s === '-0' ? '0' : s;
}

/**
 * `value` with an exponent and `digits` significant digits, e.g. 1.90355e-2.
 * A double has at most 17 significant digits, so for digits >= 17 it is
 * written in its shortest round-trip form instead of with invented digits.
 */
export function toExponent(value: Decimal | number, digits: number): string {
  const d = Math.max(1, digits);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) return String(value);
    return d >= 17 ? value.toExponential() : value.toExponential(d - 1);
  }
  return value.toExponential(d - 1, Decimal.ROUND_HALF_EVEN);
}

/**
 * A double quantity written with exactly `places` digits after the point
 * (trailing zeros kept: the digits are the stated ones), without float
 * noise: rounded half-even in decimal from the double's shortest form, so
 * 0.1 + 0.2 at 6 places is "0.300000", never 0.30000000000000004. A value
 * that rounds to zero is written without a sign.
 */
export function doubleToPlaces(value: number, places: number): string {
  if (!Number.isFinite(value)) return String(value);
  const s = new Plain(String(value)).toFixed(places, Decimal.ROUND_HALF_EVEN);
  return /^-[0.]+$/.test(s) ? s.slice(1) : s;
}
