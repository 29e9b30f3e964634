/**
 * Lyapunov exponent of a unimodal family along its parameter line:
 * lambda = (1/N) sum ln |f'(x_n)| over N iterates after T transient steps
 * (docs/methods.md E6). Superstable orbits pass through f' = 0, so each log is
 * clamped below at ln(1e-300) rather than taken at -infinity; the result is
 * then very negative but finite there. The spread over `starts` initial
 * points (evenly spaced inside the state interval) is returned beside the
 * mean so that a caller can see how well the average has settled.
 */
import type { UnimodalFamily } from './unimodal-family.js';

const LOG_FLOOR = Math.log(1e-300);

export interface LyapunovSettings {
  transient: number;
  iterations: number;
  /** Initial points averaged (>= 1). */
  starts: number;
}

/**
 * For each parameter params[k], writes the mean exponent into out[k] and
 * the largest minus smallest over the starts into spread[k].
 */
export function lyapunovExponents(family: UnimodalFamily, params: Float64Array, settings: LyapunovSettings, out: Float64Array, spread: Float64Array): void {
  const [lo, hi] = family.stateRange;
  const { transient, iterations, starts } = settings;
  for (let k = 0; k < params.length; k++) {
    const r = params[k]!;
    let sum = 0;
    let min = Infinity;
    let max = -Infinity;
    for (let s = 0; s < starts; s++) {
      // Irrational fractions of the state interval keep starts off periodic points.
      let x = lo + (hi - lo) * ((0.1 + 0.6180339887498949 * (s + 1)) % 1);
      for (let i = 0; i < transient; i++) x = family.f(x, r);
      let acc = 0;
      for (let i = 0; i < iterations; i++) {
        const d = Math.abs(family.dfdx(x, r));
        acc += d > 0 ? Math.max(Math.log(d), LOG_FLOOR) : LOG_FLOOR;
        x = family.f(x, r);
      }
      const l = acc / iterations;
      sum += l;
      if (l < min) min = l;
      if (l > max) max = l;
    }
    out[k] = sum / starts;
    spread[k] = max - min;
  }
}
