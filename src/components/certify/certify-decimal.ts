/**
 * Certifies a nucleus given as printed decimal strings: the closed disk of
 * the returned radius about the printed point holds exactly one zero of
 * F_p, simple and of exact period p (certify-nucleus.ts).
 *
 * The printed point is rounded to the nearest multiple of 2^-bits (an error
 * of at most one unit in modulus, added to the radius), with bits enough to
 * resolve both the printed digits and the component (its size estimate,
 * docs/methods.md C4).
 */
import { bitsForDigits, fixedScale, fromDecimal } from '../../precise/fixed.js';
import { log2SizeAt } from '../nucleus.js';
import type { ComplexDecimal } from '../nucleus.js';
import { certifyNucleusFixed } from './certify-nucleus.js';
import { radiusText } from './radius-text.js';

export interface DecimalCertificate {
  readonly ok: boolean;
  /** Radius rounded up (two significant digits), or null when the test failed. */
  readonly radius: string | null;
  readonly reason: string | null;
  /** Bits of the fixed point the proof ran at. */
  readonly bits: number;
}

/** Digits after the decimal point of a decimal string (0 without a point). */
function fractionDigits(t: string): number {
  const m = /\.(\d*)/.exec(t.replace(/e.*$/i, ''));
  const exp = /e([+-]?\d+)$/i.exec(t);
  return Math.max(0, (m?.[1]?.length ?? 0) - (exp ? Number(exp[1]) : 0));
}

export function certifyNucleusDecimal(period: number, nucleus: ComplexDecimal): DecimalCertificate {
  const digits = Math.max(fractionDigits(nucleus.re), fractionDigits(nucleus.im));
  const rough = fixedScale(bitsForDigits(digits, 64));
  const log2size = log2SizeAt(period, { re: fromDecimal(nucleus.re, rough), im: fromDecimal(nucleus.im, rough) }, rough);
  const depth = Number.isFinite(log2size) ? Math.max(0, Math.ceil(-log2size)) : 0;
  const bits = Math.max(bitsForDigits(digits, 40), depth + 64, 96);
  const s = fixedScale(bits);
  const cr = fromDecimal(nucleus.re, s);
  const ci = fromDecimal(nucleus.im, s);
  const cert = certifyNucleusFixed(period, cr, ci, bits);
  if (!cert.ok) return { ok: false, radius: null, reason: cert.reason, bits };
  // the printed point is within 1 unit of (cr, ci): the zero is within radius + 1 of it,
  // and the only one within unique - 1.
  const text = radiusText(cert.radius + 1n, bits);
  if (fromDecimal(text, s) + 2n > cert.unique) return { ok: false, radius: null, reason: 'the rounded radius leaves the disk of uniqueness', bits };
  return { ok: true, radius: text, reason: null, bits };
}
