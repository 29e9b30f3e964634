/**
 * The parameter values of a scan from `from` to `to` (decimal strings) in
 * `steps` evenly spaced points, both ends included, written as decimal
 * strings with as many places as the spacing needs: two more than the
 * decimal order of the spacing, and at least as many as either end has. Each
 * point is rounded (half-even) to those places, so a point is exactly the
 * decimal it prints, and the double the scan computes with is the double
 * nearest that decimal. Plain r = 2.8 + 1.2 k / 1999 in doubles would print
 * as 3.1999999999999997 and the like.
 */
import { Decimal } from 'decimal.js';
import { toPlaces } from './decimal-text.js';

function placesOf(s: string): number {
  const d = new Decimal(s).decimalPlaces();
  return d;
}

/** The number of decimal places of the grid's points. */
export function gridPlaces(from: string, to: string, steps: number): number {
  const span = new Decimal(to).minus(from).abs();
  const spacing = steps > 1 ? span.div(steps - 1) : span;
  const order = spacing.isZero() ? 0 : Math.max(0, -Math.floor(spacing.log(10).toNumber()));
  return Math.max(placesOf(from), placesOf(to), order + 2);
}

export function parameterGrid(from: string, to: string, steps: number): string[] {
  const places = gridPlaces(from, to, steps);
  const D = Decimal.clone({ precision: Math.max(40, places + 20) });
  const a = new D(from);
  const span = new D(to).minus(a);
  const out: string[] = [];
  for (let k = 0; k < steps; k++) out.push(toPlaces(steps === 1 ? a : a.plus(span.times(k).div(steps - 1)), places));
  return out;
}
