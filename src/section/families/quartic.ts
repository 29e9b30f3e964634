/**
 * The quartic family x -> r - x^4: a maximum of order 4 at x = 0, so it sits
 * in a different universality class and its delta differs from the logistic
 * one: 7.2846862170733... (K. Briggs, Math. Comp. 57 (1991) 435-439, order-4
 * value; docs/methods.md E8, docs/checks.md).
 * Superstable fixed point r = 0; full chaos r = 2^(1/3), where the critical
 * value r lands on the fixed point r - r^4 = -r.
 */
import type { UnimodalFamily } from '../unimodal-family.js';

export const quartic: UnimodalFamily = {
  name: 'quartic',
  formula: 'x -> r - x^4',
  parameter: 'r',
  maximumOrder: 4,
  critical: '0',
  range: ['0', '1.2599210498948731647672106072782283505702514647015'],
  stateRange: [-1.26, 1.26],
  cascadeSeed: ['0', '1'],
  fixedPointOnset: '-0.47247039371057743678770397772933563146384429926307', // -(3/4) 4^(-1/3): saddle-node where -4x^3 = 1
  deltaGuess: '7.28', // Briggs (1991), 7.2846862...; only the start of the extrapolation (docs/methods.md E8)
  f: (x, r) => r - x * x * x * x,
  dfdx: (x) => -4 * x * x * x,
  jet(x, r, D) {
    const x2 = x.times(x);
    return {
      f: r.minus(x2.times(x2)),
      fx: x2.times(x).times(-4),
      fr: new D(1),
      fxx: x2.times(-12),
      fxr: new D(0),
    };
  },
  value: (x, r) => {
    const x2 = x.times(x);
    return r.minus(x2.times(x2));
  },
};
