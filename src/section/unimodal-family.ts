/**
 * A one-parameter family of unimodal interval maps x -> f(x, r) with a single
 * maximum at the critical point. The real slice of z -> z^2 + c is the
 * logistic member; others show which constants are universal (docs/methods.md E8).
 *
 * Each family is one small module in ./families/ exporting one value of this
 * type, listed in ./families/index.ts. Conventions every family keeps:
 * - the critical point is a maximum, and the kneading letter of a point is
 *   R when x > critical, L when x < critical (docs/methods.md E5);
 * - `range` runs from the parameter where the critical point is a
 *   superstable fixed point to the parameter of full chaos (the critical
 *   orbit lands on the repelling fixed point), so it holds the whole cascade
 *   and every periodic window, and the kneading sequence increases with r.
 */
import type { Decimal } from 'decimal.js';

/** A decimal.js constructor configured at some precision (from Decimal.clone). */
export type DecimalCtor = typeof Decimal;

/** The values of f and its first and second partial derivatives at one point. */
export interface FamilyJet {
  f: Decimal;
  fx: Decimal;
  fr: Decimal;
  fxx: Decimal;
  fxr: Decimal;
}

export interface UnimodalFamily {
  /** Plain name used on the command line. */
  readonly name: string;
  /** The formula, for tables and plot captions. */
  readonly formula: string;
  /** Name of the parameter. */
  readonly parameter: string;
  /** Order of the maximum (2 for a quadratic maximum, 4 for quartic). */
  readonly maximumOrder: number;
  /** Critical point, exact decimal string. */
  readonly critical: string;
  /** Parameter range [superstable fixed point, full chaos], decimal strings. */
  readonly range: readonly [string, string];
  /** The state interval shown by the bifurcation diagram. */
  readonly stateRange: readonly [number, number];
  /** Superstable parameters of periods 1 and 2, the seed of the cascade (decimal strings, approximate). */
  readonly cascadeSeed: readonly [string, string];
  /** Where the fixed point is born or becomes attracting (multiplier +1): the onset of the period-1 window. */
  readonly fixedPointOnset: string;
  /** A first guess of delta for the seed of the cascade (4.669 for a quadratic maximum). */
  readonly deltaGuess: string;
  /** f in double precision. */
  f(x: number, r: number): number;
  /** df/dx in double precision. */
  dfdx(x: number, r: number): number;
  /** f, f_x, f_r, f_xx, f_xr at high precision, in the constructor's precision. */
  jet(x: Decimal, r: Decimal, D: DecimalCtor): FamilyJet;
  /** f alone at high precision. */
  value(x: Decimal, r: Decimal, D: DecimalCtor): Decimal;
  /** The c of z -> z^2 + c matching r, when the family is conjugate to it (the logistic family only). */
  readonly toC?: (r: string, digits: number) => string;
  /** The inverse of toC. */
  readonly fromC?: (c: string, digits: number) => string;
}
