/**
 * The logistic family x -> r x (1 - x), conjugate to z -> z^2 + c on the real
 * axis by z = r (1/2 - x), c = r/2 - r^2/4 (docs/methods.md E1).
 * Superstable fixed point r = 2 (c = 0); full chaos r = 4 (c = -2).
 */
import type { UnimodalFamily } from '../unimodal-family.js';
import { cToR, rToC } from '../conjugacy.js';

export const logistic: UnimodalFamily = {
  name: 'logistic',
  formula: 'x -> r x (1 - x)',
  parameter: 'r',
  maximumOrder: 2,
  critical: '0.5',
  range: ['2', '4'],
  stateRange: [0, 1],
  // r = 2 (period 1) and r = 1 + sqrt 5 (period 2), exact.
  cascadeSeed: ['2', '3.2360679774997896964091736687312762354406'],
  fixedPointOnset: '1', // exact: f'(0) = r = 1, transcritical at x = 0
  deltaGuess: '4.669', // Feigenbaum 1978
  f: (x, r) => r * x * (1 - x),
  dfdx: (x, r) => r * (1 - 2 * x),
  jet(x, r) {
    const u = x.neg().plus(1);
    return {
      f: r.times(x).times(u),
      fx: r.times(u.minus(x)),
      fr: x.times(u),
      fxx: r.times(-2),
      fxr: u.minus(x),
    };
  },
  value: (x, r) => r.times(x).times(x.neg().plus(1)),
  toC: rToC,
  fromC: cToR,
};
