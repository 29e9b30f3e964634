/**
 * Which arithmetic a view needs, and the precision and tile unit of the
 * deep path. Pure: decimal strings in, numbers out (nothing is parsed into a
 * double before its precision is known; only logarithms are taken).
 *
 * - Plain doubles while the pixel spacing is at least 2^-42 of the centre's
 *   magnitude (at least 1): that leaves ~10 bits of a double's 53 below a
 *   pixel for the orbit's rounding. The "double runs out near a span
 *   of 1e-13" is the same rule at ~1000 pixels. [common practice]
 * - Deep otherwise: reference bits from referenceBits (docs/methods.md B7), and a
 *   tile unit U = 0 while the span is above 2^-900 (~1e-271), so that
 *   offsets and distances stay in c units like the shallow kernel; below,
 *   U = floor(log2 span) - 8, so offsets are at most ~2^8 in tile units.
 */
import { parseDecimal } from '../../precise/decimal-string.js';
import { referenceBits } from '../../precise/reference-orbit.js';

export interface DeepPlan {
  readonly arithmetic: 'double' | 'deep';
  /** log2 of the pixel spacing span / pixels. */
  readonly log2Spacing: number;
  /** Fractional bits for the reference orbit (deep only; 0 for double). */
  readonly bits: number;
  /** Tile unit exponent U for sampleDeep (0 for double). */
  readonly unitExponent: number;
}

const LOG2_10 = Math.log2(10);

/** log2 |value| of a decimal string (-Infinity for 0). */
export function log2Decimal(text: string, field: string): number {
  const d = parseDecimal(text, field);
  if (d.mantissa === 0n) return -Infinity;
  const digits = d.mantissa.toString();
  return Math.log2(Number(digits.slice(0, 15))) + (d.exponent + Math.max(0, digits.length - 15)) * LOG2_10;
}

/** The plan for a view with this centre, span (width in c units) and width in pixels. */
export function deepPlan(centre: { readonly re: string; readonly im: string }, span: string, pixels: number): DeepPlan {
  const log2Span = log2Decimal(span, 'span');
  const log2Spacing = log2Span - Math.log2(Math.max(1, pixels));
  const log2Centre = Math.max(0, log2Decimal(centre.re, 'centre'), log2Decimal(centre.im, 'centre'));
  if (log2Spacing >= log2Centre - 42) return { arithmetic: 'double', log2Spacing, bits: 0, unitExponent: 0 };
  const unitExponent = log2Span > -900 ? 0 : Math.floor(log2Span) - 8;
  return { arithmetic: 'deep', log2Spacing, bits: referenceBits(span, pixels), unitExponent };
}
