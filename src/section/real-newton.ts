/**
 * Newton's method on the real parameter line of a unimodal family, at high
 * precision with decimal.js: superstable parameters (the critical point is
 * periodic, docs/methods.md C2 / E2 and E8) and parameters where a cycle has a
 * given real multiplier, +1 at a saddle-node onset and -1 at a period doubling
 * (the real form of docs/methods.md C3).
 *
 * Why this is not the complex BigInt Newton of src/components/: that one is
 * written for z -> z^2 + c only (its derivative recurrences are those of the
 * quadratic) and works in the plane. Here f is any family given by its jet
 * (f, f_x, f_r, f_xx, f_xr), including transcendental ones such as
 * r sin(pi x), which need decimal.js's sin; the unknowns stay real, so the
 * 2 x 2 system of the multiplier condition is real too. The quadratic family
 * is sent to the components code instead, which is faster.
 *
 * Chain rule along the orbit X_{k+1} = f(X_k, r) of length p:
 *   A = dX/dx0:      A' = f_x A
 *   B = dX/dr:       B' = f_x B + f_r
 *   AA = d2X/dx0^2:  AA' = f_xx A^2 + f_x AA
 *   AB = d2X/dx0 dr: AB' = f_xx A B + f_xr A + f_x AB
 */
import type { Decimal } from 'decimal.js';
import { decimalAt } from './conjugacy.js';
import type { DecimalCtor, UnimodalFamily } from './unimodal-family.js';

export interface RealNewtonResult {
  /** The parameter, a Decimal in the working precision. */
  r: Decimal;
  /** A point of the cycle (the critical point for superstable parameters). */
  x: Decimal;
  /** Newton steps taken. */
  steps: number;
  /** Whether the last step was below the tolerance. */
  converged: boolean;
}

const MAX_STEPS = 80;

/** The working constructor for `digits` significant digits (with guard digits). */
export function workingDecimal(digits: number): DecimalCtor {
  return decimalAt(digits + 8);
}

/**
 * Solves f_r^p(x_c) = x_c for r by Newton from `guess`, stopping when the
 * step is below 10^-(digits + 4).
 */
export function superstableParameter(family: UnimodalFamily, period: number, guess: string, digits: number): RealNewtonResult {
  const D = workingDecimal(digits);
  const xc = new D(family.critical);
  const tol = new D(10).pow(-(digits + 4));
  let r = new D(guess);
  for (let step = 1; step <= MAX_STEPS; step++) {
    let x = xc;
    let b = new D(0);
    for (let k = 0; k < period; k++) {
      const j = family.jet(x, r, D);
      b = j.fx.times(b).plus(j.fr);
      x = j.f;
    }
    if (b.isZero()) break;
    const dr = x.minus(xc).div(b);
    r = r.minus(dr);
    if (dr.abs().lte(tol)) return { r, x: xc, steps: step, converged: true };
  }
  return { r, x: xc, steps: MAX_STEPS, converged: false };
}

/**
 * Solves f_r^p(x) = x and (f_r^p)'(x) = multiplier for (x, r) by Newton on
 * the real 2 x 2 system, from (x0, r0).
 */
export function multiplierParameter(family: UnimodalFamily, period: number, multiplier: number, guessR: string, guessX: string, digits: number): RealNewtonResult {
  const D = workingDecimal(digits);
  const tol = new D(10).pow(-(digits + 4));
  const m = new D(multiplier);
  let r = new D(guessR);
  let x0 = new D(guessX);
  for (let step = 1; step <= MAX_STEPS; step++) {
    let x = x0;
    let a = new D(1);
    let b = new D(0);
    let aa = new D(0);
    let ab = new D(0);
    for (let k = 0; k < period; k++) {
      const j = family.jet(x, r, D);
      const nab = j.fxx.times(a).times(b).plus(j.fxr.times(a)).plus(j.fx.times(ab));
      aa = j.fxx.times(a).times(a).plus(j.fx.times(aa));
      b = j.fx.times(b).plus(j.fr);
      a = j.fx.times(a);
      ab = nab;
      x = j.f;
    }
    const g1 = x.minus(x0);
    const g2 = a.minus(m);
    // Jacobian [[a - 1, b], [aa, ab]] in the unknowns (x0, r).
    const j11 = a.minus(1);
    const det = j11.times(ab).minus(b.times(aa));
    if (det.isZero()) break;
    const dx = ab.times(g1).minus(b.times(g2)).div(det);
    const dr = j11.times(g2).minus(aa.times(g1)).div(det);
    x0 = x0.minus(dx);
    r = r.minus(dr);
    if (dr.abs().lte(tol) && dx.abs().lte(tol.times(1e3))) return { r, x: x0, steps: step, converged: true };
  }
  return { r, x: x0, steps: MAX_STEPS, converged: false };
}

/** f_r^n(x) at high precision. */
export function iterateFamily(family: UnimodalFamily, x: Decimal, r: Decimal, n: number, D: DecimalCtor): Decimal {
  let y = x;
  for (let k = 0; k < n; k++) y = family.value(y, r, D);
  return y;
}

/**
 * The local quadratic renormalisation at a superstable parameter r_s of
 * period p: with u = x - x_c and e = r - r_s, f^p(x_c + u) ~ x_c + K u^2 + L e,
 * and v = K u turns it into v -> v^2 + C with C = K L e (docs/methods.md C4, the
 * same renormalisation as the Hunt-Ott size estimate, read in the family's
 * own coordinates). Returns K, half the second x-derivative of the p-th
 * iterate at x_c, and L, the r-derivative of that iterate at x_c.
 */
export function localRenormalisation(family: UnimodalFamily, period: number, r: Decimal, D: DecimalCtor): { k: Decimal; l: Decimal } {
  let x = new D(family.critical);
  let a = new D(1);
  let b = new D(0);
  let aa = new D(0);
  for (let i = 0; i < period; i++) {
    const j = family.jet(x, r, D);
    aa = j.fxx.times(a).times(a).plus(j.fx.times(aa));
    b = j.fx.times(b).plus(j.fr);
    a = j.fx.times(a);
    x = j.f;
  }
  return { k: aa.div(2), l: b };
}

/**
 * Newton on h(r) = f_r^m(x_c) - f_r^n(x_c) (m > n) from `guess`, with
 * h' from the B recurrence. Used for the end of a window, where the
 * critical orbit lands on the repelling cycle (docs/methods.md E4).
 */
export function orbitCoincidence(family: UnimodalFamily, m: number, n: number, guess: string, digits: number): RealNewtonResult {
  const D = workingDecimal(digits);
  const tol = new D(10).pow(-(digits + 4));
  const xc = new D(family.critical);
  let r = new D(guess);
  for (let step = 1; step <= MAX_STEPS; step++) {
    let x = xc;
    let b = new D(0);
    let xn = xc;
    let bn = b;
    for (let k = 0; k < m; k++) {
      const j = family.jet(x, r, D);
      b = j.fx.times(b).plus(j.fr);
      x = j.f;
      if (k + 1 === n) {
        xn = x;
        bn = b;
      }
    }
    const h = x.minus(xn);
    const dh = b.minus(bn);
    if (dh.isZero()) break;
    const dr = h.div(dh);
    r = r.minus(dr);
    if (dr.abs().lte(tol)) return { r, x: xc, steps: step, converged: true };
  }
  return { r, x: xc, steps: MAX_STEPS, converged: false };
}
