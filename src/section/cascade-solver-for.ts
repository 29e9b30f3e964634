/**
 * Picks the cascade solver of a family. The logistic family is the real
 * slice of z -> z^2 + c, so its superstable parameters are nuclei of the
 * plane: they come from the components code's BigInt Newton (findNucleus,
 * docs/methods.md C2) in c and are converted to r (docs/methods.md E1); that is far
 * faster than decimal.js at periods 2^14 and beyond. Likewise the
 * doubling points of the logistic family come from findBoundaryPoint
 * (multiplier -1, docs/methods.md C3). Every other family uses the generic real Newton of
 * ./real-newton.ts in the family's own parameter.
 */
import type { Decimal } from 'decimal.js';
import { findBoundaryPoint } from '../components/boundary-point.js';
import { findNucleus } from '../components/nucleus.js';
import { familySolver, type CascadeSolver } from './cascade-solver.js';
import type { UnimodalFamily } from './unimodal-family.js';
import { ConvergenceError } from '../check/fields.js';

export interface ChosenSolver {
  solver: CascadeSolver;
  /** Parameter -> c as a decimal string (logistic family only). */
  toC?: (p: Decimal, digits: number) => string;
}

export function cascadeSolverFor(family: UnimodalFamily, digits: number): ChosenSolver {
  const toC = family.toC;
  const fromC = family.fromC;
  const generic = familySolver(family, digits);
  if (toC === undefined || fromC === undefined) return { solver: generic };
  const D = generic.D;
  const solver: CascadeSolver = {
    ...generic,
    superstable(period, guess) {
      if (period === 1) return generic.superstable(period, guess);
      let found: { nucleus: { re: string }; steps: number };
      try {
        found = findNucleus(period, { re: toC(guess.toString(), digits + 8), im: '0' }, digits + 8);
      } catch (err) {
        throw new ConvergenceError(`nucleus of period ${period} near r = ${guess.toString()}: ${(err as Error).message}`);
      }
      return { value: new D(fromC(found.nucleus.re, digits + 8)), steps: found.steps };
    },
    doubling(period, guess, nucleus) {
      let point: { re: string };
      try {
        point = findBoundaryPoint(period, { re: toC(nucleus.toString(), digits + 8), im: '0' }, { re: -1, im: 0 }, digits + 8);
      } catch (err) {
        throw new ConvergenceError(`doubling point of period ${period} near r = ${guess.toString()}: ${(err as Error).message}`);
      }
      return { value: new D(fromC(point.re, digits + 8)), steps: 0 };
    },
  };
  return { solver, toC: (p, d) => toC(p.toString(), d) };
}
