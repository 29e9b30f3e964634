/**
 * The period-doubling cascade of a unimodal family: for each level n the
 * parameter where the cycle of period 2^(n-1) doubles (multiplier -1) and the
 * superstable parameter of period 2^n; Feigenbaum's ratio estimates
 *   delta_n = (s_{n-1} - s_{n-2}) / (s_n - s_{n-1}),
 *   alpha_n = -d_{n-1} / d_n,  d_n = f^(2^(n-1))(x_c) - x_c at s_n
 * (the distance from the critical point to its nearest cycle point), their
 * accelerated limits and the accumulation point (docs/methods.md E2, E3; M.
 * Feigenbaum, J. Stat. Phys. 19 (1978) 25-52).
 *
 * Each new superstable parameter starts from the delta extrapolation
 * s_n ~ s_{n-1} + (s_{n-1} - s_{n-2}) / delta_{n-1}; each doubling point
 * from the same fraction of [s_{n-1}, s_n] as the level before.
 */
import type { Decimal } from 'decimal.js';
import { accelerate, type Accelerated } from './accelerate.js';
import type { CascadeSolver } from './cascade-solver.js';
import type { DecimalCtor } from './unimodal-family.js';
import { ConvergenceError } from '../check/fields.js';

export interface CascadeLevel {
  /** Level n: the cycle of period 2^n. */
  level: number;
  period: number;
  /** Superstable parameter of period 2^n. */
  superstable: Decimal;
  /** Where period 2^(n-1) doubles to 2^n (undefined at level 0). */
  doubling?: Decimal;
  /** delta_n from superstable parameters (n >= 2). */
  delta?: Decimal;
  /** alpha_n (n >= 2). */
  alpha?: Decimal;
  /** Distance d_n from the critical point to its nearest cycle point (n >= 1). */
  gap?: Decimal;
  /** Newton steps spent on this level. */
  steps: number;
}

export interface Cascade {
  levels: CascadeLevel[];
  delta: Accelerated;
  alpha: Accelerated;
  accumulation: Accelerated;
  /** Working significant digits. */
  digits: number;
  D: DecimalCtor;
}

/** Computes levels 0..maxLevel of the cascade at `digits` significant digits. */
export function computeCascade(solver: CascadeSolver, maxLevel: number, digits: number, onLevel?: (level: CascadeLevel) => void): Cascade {
  const D = solver.D;
  const levels: CascadeLevel[] = [];
  const [seed0, seed1] = solver.seed;
  let fraction = new D('0.8');
  let lastDelta = new D(solver.deltaGuess);
  for (let n = 0; n <= maxLevel; n++) {
    const period = 2 ** n;
    let guess: Decimal;
    if (n === 0) guess = new D(seed0);
    else if (n === 1) guess = new D(seed1);
    else {
      const s1 = levels[n - 1]!.superstable;
      const s2 = levels[n - 2]!.superstable;
      guess = s1.plus(s1.minus(s2).div(lastDelta));
    }
    const sup = solver.superstable(period, guess);
    if (n >= 2) {
      // Newton may fall back onto the previous superstable parameter (a root of
      // f^(2^n) too); the new one must lie beyond it, closer than the last gap.
      const s1 = levels[n - 1]!.superstable;
      const s2 = levels[n - 2]!.superstable;
      const ratio = sup.value.minus(s1).div(s1.minus(s2));
      if (!(ratio.gt(0.01) && ratio.lt(0.9))) {
        throw new ConvergenceError(`superstable parameter of period ${period} fell outside the cascade (at ${sup.value.toSignificantDigits(20).toString()})`);
      }
    }
    const level: CascadeLevel = { level: n, period, superstable: sup.value, steps: sup.steps };
    if (n >= 1) {
      const prev = levels[n - 1]!;
      const dGuess = prev.superstable.plus(sup.value.minus(prev.superstable).times(fraction));
      const dbl = solver.doubling(period / 2, dGuess, prev.superstable);
      level.doubling = dbl.value;
      level.steps += dbl.steps;
      fraction = dbl.value.minus(prev.superstable).div(sup.value.minus(prev.superstable));
      level.gap = solver.gap(period / 2, sup.value);
    }
    if (n >= 2) {
      const s1 = levels[n - 1]!.superstable;
      const s2 = levels[n - 2]!.superstable;
      level.delta = s1.minus(s2).div(sup.value.minus(s1));
      lastDelta = level.delta;
      const g1 = levels[n - 1]!.gap!;
      level.alpha = g1.div(level.gap!).neg();
    }
    levels.push(level);
    onLevel?.(level);
  }
  const cap = digits;
  const deltas = levels.filter((l) => l.delta !== undefined).map((l) => l.delta!);
  const alphas = levels.filter((l) => l.alpha !== undefined).map((l) => l.alpha!);
  const sups = levels.map((l) => l.superstable);
  const none = (v: Decimal): Accelerated => ({ value: v, digits: 0, passes: 0 });
  return {
    levels,
    delta: deltas.length > 0 ? accelerate(deltas, cap) : none(new D(NaN)),
    alpha: alphas.length > 0 ? accelerate(alphas, cap) : none(new D(NaN)),
    accumulation: accelerate(sups, cap),
    digits,
    D,
  };
}
