/**
 * The field parsers every layer shares: integers, decimal numbers kept as
 * written, WxH sizes. Each failure is a UserError naming the field, what was
 * expected and what was received.
 */
import { UserError } from './user-error.js';

/** An integer written in decimal, with an optional sign. */
const INTEGER_TEXT = /^[+-]?\d+$/;

/** A decimal number as written in a sheet or on the command line: 1, -0.75, .5, 5., 3.5e-2. */
const DECIMAL_TEXT = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

export function isIntegerText(text: string): boolean {
  return INTEGER_TEXT.test(text.trim());
}

export function isDecimalText(text: string): boolean {
  return DECIMAL_TEXT.test(text.trim());
}

/**
 * An integer in [min, max]. Flags arrive as text and sheets as JSON numbers:
 * `accept` says which forms the field takes ('number' for a sheet's field, so
 * "3000" in a sheet is refused rather than read).
 */
export function parseInteger(value: unknown, field: string, min: number, max: number, accept: 'number' | 'number or text' = 'number or text'): number {
  const n = typeof value === 'number' ? value : accept === 'number or text' && typeof value === 'string' && isIntegerText(value) ? Number(value.trim()) : Number.NaN;
  if (!Number.isInteger(n) || n < min || n > max) throw new UserError(field, `an integer between ${min} and ${max}`, value);
  return n;
}

/** parseInteger for a flag that may be absent: undefined stays undefined (the caller supplies the default). */
export function optionalInteger(value: unknown, field: string, min: number, max: number): number | undefined {
  return value === undefined ? undefined : parseInteger(value, field, min, max);
}

/** A decimal number given as a string, trimmed and otherwise kept exactly as written. */
export function parseDecimalText(value: unknown, field: string, expected = 'a decimal number written as a string (e.g. "-0.75")'): string {
  if (typeof value !== 'string' || !isDecimalText(value)) throw new UserError(field, expected, value);
  return value.trim();
}

/**
 * A size written WxH, with an optional unit suffix ("1600x1200", "420x297mm").
 * Sides may be fractional only with a unit (millimetres); pixel sizes are integers.
 */
export function parseSize(value: unknown, field: string, unit: '' | 'mm' = ''): [number, number] {
  const side = unit === '' ? '(\\d+)' : '(\\d+(?:\\.\\d+)?)';
  const m = typeof value === 'string' ? new RegExp(`^\\s*${side}\\s*[xX]\\s*${side}\\s*${unit}\\s*$`).exec(value) : null;
  if (m === null) throw new UserError(field, `a size written WxH${unit} (e.g. ${unit === 'mm' ? '420x297mm' : '1600x1200'})`, value);
  return [Number(m[1]), Number(m[2])];
}

/**
 * An iteration (Newton, bisection, a cascade step) that did not settle. It is
 * neither the user's fault nor a crash: the command line decides what it
 * means (one line and exit code 1), by its class, never by its name.
 */
export class ConvergenceError extends Error {
  override readonly name = 'ConvergenceError';
}
