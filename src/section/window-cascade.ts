/**
 * The period-doubling cascade inside a periodic window: the window of MSS
 * word W (period p) doubles to periods 2p, 4p, ..., and by renormalisation
 * (the first return map near the critical point is again unimodal with a
 * quadratic maximum) its ratios converge to the same Feigenbaum delta and
 * alpha as the main cascade (Feigenbaum, J. Stat. Phys. 19 (1978) 25-52;
 * docs/methods.md E2, E4, E11).
 *
 * The cascade runs through the solver of the family at periods p 2^n: level
 * n of this cascade is the superstable parameter of the word obtained from W
 * by n doublings (W -> W x W, x = R after an even number of R's in W, L
 * after an odd number; Metropolis-Stein-Stein 1973), and the seeds are the
 * superstable parameters of W and of its first doubling, found by bisection
 * on the kneading order.
 */
import { UserError } from '../check/user-error.js';
import type { CascadeSolver } from './cascade-solver.js';
import { isAdmissibleWord } from './kneading.js';
import type { UnimodalFamily } from './unimodal-family.js';
import { bisectWord } from './windows.js';

/** The word of the doubled orbit: W x W with x = R when W holds an even number of R's, else L. */
export function doubledWord(word: string): string {
  const rs = [...word].filter((ch) => ch === 'R').length;
  return `${word}${rs % 2 === 0 ? 'R' : 'L'}${word}`;
}

/** Reads a window word as written on the command line: letters R and L, with runs allowed as R^3 (compact form). */
export function parseWindowWord(text: unknown, field = '--window'): string {
  const expected = 'an admissible MSS word of R and L (e.g. RL for the period-3 window, RLR^2 for a period-5 window; see `section windows`)';
  if (typeof text !== 'string') throw new UserError(field, expected, text);
  const compact = text.trim().toUpperCase();
  if (!/^([RL](\^\d+)?)+$/.test(compact)) throw new UserError(field, expected, text);
  const word = compact.replace(/([RL])\^(\d+)/g, (_, ch: string, n: string) => ch.repeat(Number(n)));
  if (word.length > 63 || word[0] !== 'R' || !isAdmissibleWord(word)) throw new UserError(field, expected, text);
  return word;
}

/** The cascade solver of the window of `word`: periods p 2^n of the family's own solver, seeded inside the window. */
export function windowSolver(family: UnimodalFamily, word: string, base: CascadeSolver): CascadeSolver {
  const p = word.length + 1;
  const seed0 = bisectWord(family, word);
  const seed1 = bisectWord(family, doubledWord(word));
  return {
    D: base.D,
    seed: [seed0.toPrecision(17), seed1.toPrecision(17)],
    deltaGuess: base.deltaGuess,
    superstable: (period, guess) => base.superstable(p * period, guess),
    doubling: (period, guess, nucleus) => base.doubling(p * period, guess, nucleus),
    gap: (half, r) => base.gap(p * half, r),
  };
}
