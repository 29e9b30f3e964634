/**
 * An internal ray of a hyperbolic component: the parameters where the
 * attracting cycle's multiplier is t = r e^{2 pi i theta}, r from 0 (the
 * nucleus, t = 0) to 1 (the boundary point of internal angle theta), as in
 * the multiplier map of Douady and Hubbard (the multiplier is a conformal
 * isomorphism from the component to the unit disk).
 *
 * Method (docs/methods.md C3): Newton on F^p(w, b) = w, D_z F^p(w, b) = t in
 * doubles (boundaryNewton), r raised in equal steps and each step started
 * from the last solution, halved where Newton fails. The end (r = 1) is the
 * boundary point solved at full precision by boundary-point.ts at the
 * multiplier e^{2 pi i theta} taken exactly (for theta = 0 the root, found
 * through the parent where a satellite's system is singular; the walk in
 * doubles may then stop short, and the ray is finished by a straight
 * segment to the root).
 */
import { findBoundaryPointAtAngle } from './boundary-point.js';
import { boundaryNewton } from './component-outline.js';
import type { ComplexDecimal } from './nucleus.js';

export interface InternalRay {
  /** c values (re, im, ...) from the nucleus outwards; the last is `end`. */
  readonly points: Float64Array;
  /** The boundary point the ray ends at, to 20 digits after the point. */
  readonly end: ComplexDecimal;
  /** The largest r the walk in doubles reached (1 unless Newton gave out near a singular root). */
  readonly reached: number;
}

/** The internal angle num/den as a fraction of a turn. */
export interface InternalAngle {
  readonly num: number;
  readonly den: number;
}

/**
 * The internal ray of angle `angle` of the period-`period` component with
 * nucleus (nr, ni), walked in `steps` equal steps of r; null when Newton
 * fails before r = 1/2.
 */
export function internalRay(period: number, nr: number, ni: number, angle: InternalAngle, steps: number): InternalRay | null {
  const a = (2 * Math.PI * angle.num) / angle.den;
  const cos = angle.num === 0 ? 1 : Math.cos(a);
  const sin = angle.num === 0 ? 0 : Math.sin(a);
  const state = new Float64Array([0, 0, nr, ni]);
  const next = new Float64Array(4);
  const pts: number[] = [nr, ni];
  let r = 0;
  let step = 1 / steps;
  // the walk stops one step short of the boundary: the end comes from the precise solver
  const last = 1 - 1 / steps;
  while (r < last) {
    const to = Math.min(last, r + step);
    if (!boundaryNewton(period, state, to * cos, to * sin, next)) {
      step /= 2;
      if (step < 1 / (steps * 1024)) break;
      continue;
    }
    state.set(next);
    r = to;
    if (Math.abs(r * steps - Math.round(r * steps)) < 1e-9) {
      pts.push(state[2]!, state[3]!);
      step = 1 / steps;
    }
  }
  if (r < 0.5) return null;
  const nucleus = { re: String(nr), im: String(ni) };
  const end = findBoundaryPointAtAngle(period, nucleus, angle.num, angle.den, 20);
  pts.push(Number(end.re), Number(end.im));
  return { points: Float64Array.from(pts), end, reached: r };
}
