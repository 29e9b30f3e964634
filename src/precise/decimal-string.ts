/**
 * Decimal strings: the one way a parameter enters quadatlas. A decimal
 * string is kept exact (sign, integer mantissa, power of ten) until the
 * precision it will be used at is known; nothing here goes through a double.
 *
 * Grammar (no spaces, no hex, no Infinity/NaN):
 *   [+-] digits [ . digits ] [ (e|E) [+-] digits ]   or   [+-] . digits [exponent]
 * The exponent is limited to |e| <= MAX_EXPONENT so that a typo cannot ask
 * for a billion-digit number.
 */
import { UserError } from '../check/user-error.js';

/** An exact decimal value: sign * mantissa * 10^exponent. */
export interface DecimalNumber {
  /** -1 for a leading minus sign, else 1 (so "-0" keeps its sign; its value is 0). */
  readonly sign: 1 | -1;
  /** Non-negative integer of all digits, leading zeros removed. */
  readonly mantissa: bigint;
  /** Power of ten applied to the mantissa. */
  readonly exponent: number;
  /** The text as received (trimmed). */
  readonly text: string;
}

/** Largest decimal exponent accepted. */
export const MAX_EXPONENT = 100_000;

const DECIMAL = /^([+-]?)(?:(\d+)(?:\.(\d*))?|\.(\d+))(?:[eE]([+-]?\d{1,9}))?$/;

/** True when the text is a decimal string in the grammar above. */
export function isDecimal(text: string): boolean {
  const m = DECIMAL.exec(text.trim());
  if (m === null) return false;
  const e = m[5] === undefined ? 0 : Number(m[5]);
  return Math.abs(e) <= MAX_EXPONENT;
}

/**
 * Parses a decimal string exactly. Throws UserError naming `field` when the
 * text is not a decimal number.
 */
export function parseDecimal(text: string, field: string): DecimalNumber {
  const t = typeof text === 'string' ? text.trim() : '';
  const m = DECIMAL.exec(t);
  if (m === null) throw new UserError(field, 'a decimal number such as -1.75 or 2.5e-30', text);
  const intPart = m[2] ?? '';
  const fracPart = m[3] ?? m[4] ?? '';
  const e = m[5] === undefined ? 0 : Number(m[5]);
  if (Math.abs(e) > MAX_EXPONENT) {
    throw new UserError(field, `a decimal number with exponent between -${MAX_EXPONENT} and ${MAX_EXPONENT}`, text);
  }
  const digits = (intPart + fracPart).replace(/^0+/, '');
  return {
    sign: m[1] === '-' ? -1 : 1,
    mantissa: digits === '' ? 0n : BigInt(digits),
    exponent: e - fracPart.length,
    text: t,
  };
}

/** A complex parameter given as two decimal strings. */
export interface DecimalPair {
  readonly re: DecimalNumber;
  readonly im: DecimalNumber;
}

/**
 * Parses "RE,IM" (two decimal strings separated by a comma). Throws
 * UserError naming `field` otherwise.
 */
export function parseDecimalPair(text: string, field: string): DecimalPair {
  const parts = typeof text === 'string' ? text.split(',') : [];
  if (parts.length !== 2 || !isDecimal(parts[0] ?? '') || !isDecimal(parts[1] ?? '')) {
    throw new UserError(field, 'two decimal numbers RE,IM such as -1.75,0', text);
  }
  return { re: parseDecimal(parts[0] ?? '', field), im: parseDecimal(parts[1] ?? '', field) };
}

/**
 * The value as a double, rounded once (the decimal text is parsed by the
 * engine's correctly rounded string-to-number conversion). Only for
 * estimates and start points; never for a coordinate whose precision matters.
 */
export function decimalToNumber(d: DecimalNumber): number {
  if (d.mantissa === 0n) return d.sign < 0 ? -0 : 0;
  return Number(`${d.sign < 0 ? '-' : ''}${d.mantissa}e${d.exponent}`);
}
