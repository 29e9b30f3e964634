/**
 * What the cascade needs from a family, so that the quadratic family can use
 * the complex BigInt Newton of src/components/ and every other family the
 * generic real Newton of ./real-newton.ts, behind one interface.
 */
import type { Decimal } from 'decimal.js';
import { iterateFamily, multiplierParameter, superstableParameter, workingDecimal } from './real-newton.js';
import type { DecimalCtor, UnimodalFamily } from './unimodal-family.js';
import { ConvergenceError } from '../check/fields.js';

export interface SolvedParameter {
  value: Decimal;
  steps: number;
}

export interface CascadeSolver {
  readonly D: DecimalCtor;
  /** Superstable parameters of periods 1 and 2. */
  readonly seed: readonly [string, string];
  /** A first guess of delta. */
  readonly deltaGuess: string;
  /** The superstable parameter of `period` near `guess`. */
  superstable(period: number, guess: Decimal): SolvedParameter;
  /** Where the cycle of `period` has multiplier -1, near `guess`; `nucleus` is its superstable parameter. */
  doubling(period: number, guess: Decimal, nucleus: Decimal): SolvedParameter;
  /** f^half(x_c) - x_c at parameter p (signed distance to the nearest cycle point). */
  gap(half: number, p: Decimal): Decimal;
}

/** The generic solver for any family, in the family's own parameter. */
export function familySolver(family: UnimodalFamily, digits: number): CascadeSolver {
  const D = workingDecimal(digits);
  return {
    D,
    seed: family.cascadeSeed,
    deltaGuess: family.deltaGuess,
    superstable(period, guess) {
      const res = superstableParameter(family, period, guess.toString(), digits);
      if (!res.converged) throw new ConvergenceError(`superstable parameter of period ${period} did not converge from ${guess.toString()}`);
      return { value: new D(res.r), steps: res.steps };
    },
    doubling(period, guess) {
      // Start x on the critical orbit one period on: near the cycle, and off the
      // critical point itself, where the Jacobian of a flat maximum (x^4) vanishes.
      const x0 = iterateFamily(family, new D(family.critical), guess, period, D);
      const res = multiplierParameter(family, period, -1, guess.toString(), x0.toString(), digits);
      if (!res.converged) throw new ConvergenceError(`period doubling of period ${period} did not converge from ${guess.toString()}`);
      return { value: new D(res.r), steps: res.steps };
    },
    gap(half, p) {
      const xc = new D(family.critical);
      return iterateFamily(family, xc, p, half, D).minus(xc);
    },
  };
}
