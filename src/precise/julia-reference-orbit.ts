/**
 * A reference orbit in the dynamical plane for perturbation (docs/methods.md B1,
 * B7, transposed to fixed c): Z_0 = a start point z, Z_{m+1} = Z_m^2 + c,
 * iterated in BigInt fixed point at `bits` fractional bits from the exact
 * decimal strings, each iterate rounded once to a double. Two are used per
 * deep Julia plate: the orbit of the view centre, and the critical orbit
 * (start 0), onto which pixels rebase (see src/dynamic/sample-julia-deep.ts).
 */
import { bigToNumberScaled, fixedScale, fromDecimal } from './fixed.js';

export interface JuliaReference {
  readonly startRe: string;
  readonly startIm: string;
  readonly bits: number;
  /** Iterates Z_0..Z_M (length M + 1). */
  readonly re: Float64Array;
  readonly im: Float64Array;
  /** True when |Z_M| exceeded the escape radius. */
  readonly escaped: boolean;
}

/** Z_0 .. Z_M for Z_0 = start, stopping at escape or after maxIterations steps. Decimal strings never pass through a double. */
export function computeJuliaReference(
  start: { readonly re: string; readonly im: string },
  c: { readonly re: string; readonly im: string },
  bits: number,
  maxIterations: number,
  escapeRadius: number,
): JuliaReference {
  const s = fixedScale(bits);
  const cr = fromDecimal(c.re, s, 'c');
  const ci = fromDecimal(c.im, s, 'c');
  let zr = fromDecimal(start.re, s, 'centre');
  let zi = fromDecimal(start.im, s, 'centre');
  const shift = s.shift;
  const half = s.half;
  const r2 = BigInt(Math.ceil(escapeRadius * escapeRadius)) << (2n * shift);
  const re: number[] = [bigToNumberScaled(zr, -bits)];
  const im: number[] = [bigToNumberScaled(zi, -bits)];
  let escaped = zr * zr + zi * zi > r2;
  for (let m = 0; m < maxIterations && !escaped; m++) {
    const rr = zr * zr;
    const ii = zi * zi;
    const ri = zr * zi;
    zr = ((rr - ii + half) >> shift) + cr;
    zi = ((ri + (half >> 1n)) >> (shift - 1n)) + ci;
    re.push(bigToNumberScaled(zr, -bits));
    im.push(bigToNumberScaled(zi, -bits));
    escaped = zr * zr + zi * zi > r2;
  }
  return { startRe: start.re, startIm: start.im, bits, re: Float64Array.from(re), im: Float64Array.from(im), escaped };
}
