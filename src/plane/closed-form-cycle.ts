import type { CycleResult } from './attracting-cycle.js';
import { hypot2 } from './hypot2.js';

/**
 * Closed-form interior test for the two components with exact formulas
 * (docs/methods.md A3, cheap tests from Wikipedia "Plotting algorithms for the
 * Mandelbrot set", cardioid / bulb checking; multipliers as in docs/checks.md):
 *
 * - main cardioid: inside iff q (q + (x - 1/4)) <= y^2 / 4 with
 *   q = (x - 1/4)^2 + y^2; the fixed point is w = m / 2 with multiplier
 *   m = 1 - sqrt(1 - 4c) (principal square root), so c = m/2 - m^2/4;
 * - period-2 disk: |c + 1| < 1/4; the 2-cycle solves w^2 + w + c + 1 = 0,
 *   w = (-1 + sqrt(-3 - 4c)) / 2, multiplier 4 (c + 1).
 *
 * The cheap polynomial tests pick the candidate; the multiplier must then
 * also satisfy |m| < 1 (a point the tests admit on the boundary by rounding
 * is left to the iteration). Writes w and the multiplier into `out` and
 * returns the period (1 or 2), or 0 when c is in neither component.
 */
export function closedFormCycle(cRe: number, cIm: number, out: CycleResult): number {
  const x = cRe - 0.25,
    y2 = cIm * cIm;
  const q = x * x + y2;
  if (q * (q + x) <= 0.25 * y2) {
    // sqrt(1 - 4c)
    const ar = 1 - 4 * cRe,
      ai = -4 * cIm;
    const sr = sqrtRe(ar, ai),
      si = sqrtIm(ar, ai, sr);
    const mr = 1 - sr,
      mi = -si;
    if (mr * mr + mi * mi < 1) {
      out.wRe = 0.5 * mr;
      out.wIm = 0.5 * mi;
      out.mulRe = mr;
      out.mulIm = mi;
      out.converged = true;
      out.ok = true;
      return 1;
    }
  }
  const u = cRe + 1;
  if (u * u + y2 < 0.0625) {
    const ar = -3 - 4 * cRe,
      ai = -4 * cIm;
    const sr = sqrtRe(ar, ai),
      si = sqrtIm(ar, ai, sr);
    out.wRe = 0.5 * (sr - 1);
    out.wIm = 0.5 * si;
    out.mulRe = 4 * u;
    out.mulIm = 4 * cIm;
    out.converged = true;
    out.ok = true;
    return 2;
  }
  return 0;
}

/**
 * Real part of the principal square root of a + bi, computed without
 * cancellation; sqrtIm gives the imaginary part from it. Both are odd in b
 * (for b != 0), so conjugate parameters give conjugate results bit for bit.
 */
function sqrtRe(a: number, b: number): number {
  const r = hypot2(a, b);
  if (a >= 0) return Math.sqrt(0.5 * (r + a));
  const t = Math.sqrt(0.5 * (r - a));
  return t > 0 ? Math.abs(b) / (2 * t) : 0;
}

function sqrtIm(a: number, b: number, re: number): number {
  if (a >= 0) return re > 0 ? b / (2 * re) : 0;
  const t = Math.sqrt(0.5 * (hypot2(a, b) - a));
  return b < 0 ? -t : t;
}

/**
 * Whether c lies outside the main cardioid by more than `margin` in the A3
 * polynomial q (q + (x - 1/4)) - y^2 / 4, which is 0 on its boundary: then no
 * fixed point of z^2 + c attracts, and a search for cycles can leave
 * period 1 out. The margin covers rounding of c and of the polynomial.
 */
export function outsideMainCardioid(cRe: number, cIm: number, margin: number): boolean {
  const x = cRe - 0.25,
    y2 = cIm * cIm;
  const q = x * x + y2;
  return q * (q + x) - 0.25 * y2 > margin;
}
