/**
 * Picks the cascade solver of a family: the generic real Newton of
 * ./real-newton.ts in the family's own parameter, and the r <-> c conversion
 * for the table when the family is the logistic one.
 */
import type { Decimal } from 'decimal.js';
import { familySolver, type CascadeSolver } from './cascade-solver.js';
import type { UnimodalFamily } from './unimodal-family.js';

export interface ChosenSolver {
  solver: CascadeSolver;
  /** Parameter -> c as a decimal string (logistic family only). */
  toC?: (p: Decimal, digits: number) => string;
}

export function cascadeSolverFor(family: UnimodalFamily, digits: number): ChosenSolver {
  const toC = family.toC;
  const solver = familySolver(family, digits);
  return toC === undefined ? { solver } : { solver, toC: (p, d) => toC(p.toString(), d) };
}
