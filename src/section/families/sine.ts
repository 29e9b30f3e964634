/**
 * The sine family x -> r sin(pi x) on [0, 1]: a quadratic maximum at x = 1/2
 * that is not a polynomial, so its Feigenbaum delta and alpha must equal the
 * logistic ones (universality; docs/methods.md E8).
 * Superstable fixed point r = 1/2; full chaos r = 1.
 */
import type { UnimodalFamily } from '../unimodal-family.js';

export const sine: UnimodalFamily = {
  name: 'sine',
  formula: 'x -> r sin(pi x)',
  parameter: 'r',
  maximumOrder: 2,
  critical: '0.5',
  range: ['0.5', '1'],
  stateRange: [0, 1],
  cascadeSeed: ['0.5', '0.7777'],
  fixedPointOnset: '0.31830988618379067153776752674502872406891929148091', // 1/pi: f'(0) = r pi = 1, transcritical at x = 0
  deltaGuess: '4.669', // universality, Feigenbaum 1978
  f: (x, r) => r * Math.sin(Math.PI * x),
  dfdx: (x, r) => r * Math.PI * Math.cos(Math.PI * x),
  jet(x, r, D) {
    const pi = D.acos(-1);
    const a = pi.times(x);
    const s = D.sin(a);
    // cos(pi x) = sin(pi (1/2 - x)): keeps full relative precision near the critical point.
    const c = D.sin(pi.times(new D('0.5').minus(x)));
    return {
      f: r.times(s),
      fx: r.times(pi).times(c),
      fr: s,
      fxx: r.times(pi).times(pi).times(s).neg(),
      fxr: pi.times(c),
    };
  },
  value: (x, r, D) => r.times(D.sin(D.acos(-1).times(x))),
};
