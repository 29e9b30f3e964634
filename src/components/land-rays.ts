/**
 * The census kernel: land the parameter rays of a list of period-p angles on
 * their components' nuclei.
 *
 * For each angle n/(2^p - 1): trace the ray inward to depth min(2p, p + 14) (docs/methods.md
 * D4), then run deflated Newton for the period-p nucleus from the ray's end
 * (docs/methods.md C2 and C5(c)). The trace is in double precision; when the
 * component is smaller than {@link DD_SIZE} (too few doubles across it to tell
 * neighbours apart), Newton is continued in double-double from the double
 * nucleus (from the ray end when double Newton failed): the double result lies
 * in the atom domain, which is much wider than the component (period 16: all
 * 4092 such rays reached the nucleus that a double-double trace reaches, in
 * 18 ms instead of 1.3 s). Only when the double trace or that Newton fails is
 * the ray traced again in double-double.
 * `careful` mode (used to re-land rays whose nucleus another pair also
 * reached, or that were lost) goes straight to double-double with depth 3p
 * and sharpness 8.
 *
 * Alternatives measured and dropped (period 16, one core): Newton from the
 * Hubbard-Schleicher-Sutherland start points (docs/methods.md C5(b)) needs about
 * d ln(R/2) steps per start to come in from radius R, i.e. tens of thousands
 * of steps each for d = 2^15; Aberth (C5(a)) is O(d^2) per sweep. Ray landing
 * costs about 2400 iterations of z -> z^2 + c per ray at period 18 (2 sub-steps
 * and 4.3 Newton evaluations per level). Also tried, December 2026: tracing
 * only to depth p + 6 for counting, re-landing the rays caught sharing a
 * nucleus: rays of neighbouring satellites of the main cardioid then land one
 * bulb along, in chains only the ends of which are caught (period 19 lost 6
 * components); a predictor step reusing the last derivative (22% fewer
 * evaluations, no faster), and tracing two rays in one loop for
 * instruction-level parallelism (bit-identical rays, about 10% faster; left out
 * for its bookkeeping).
 */
import { traceRayDD, traceRayDouble } from './trace-ray.js';
import { nucleusDD, nucleusDouble } from './fast-nucleus.js';
import type { FastNucleus } from './fast-nucleus.js';

/**
 * Components smaller than this (absolute size estimate) are landed in
 * double-double. At 1e-5 every census nucleus is good to about 1e-10 of its
 * component's size (a double nucleus near |c| = 2 is good to 4e-16); with the
 * earlier 1e-11 a period-7 nucleus near -2 was only good to 2e-9 of its size.
 */
export const DD_SIZE = 1e-5;

/**
 * Levels traced beyond the period in the double trace (at most 2p levels in
 * all). Measured on samples of about 10 000 rays at periods 16, 18 and 20: the
 * nucleus reached from depth p + a differed from the one reached from depth 2p
 * for a = 6, 8, 10 in about 2e-3, 1e-3, 2e-4 of rays, and for none at a = 12
 * and 14 (depth 2.5p agrees with 2p too). Depth p + 14 saves a quarter of the
 * work at period 20; a ray that still lands on another pair's nucleus is
 * caught by the census's distinctness check and re-landed in careful mode.
 */
export const RAY_MARGIN = 14;

/** Values per ray in the output array: reHi, reLo, imHi, imLo, size, ok (1/0). */
export const RAY_RECORD = 6;

/**
 * Lands the rays of angles nums[i] / (2^period - 1) and writes one record of
 * {@link RAY_RECORD} values per angle into `out` (length nums.length * RAY_RECORD).
 */
export function landRays(period: number, nums: Float64Array, careful: boolean, out: Float64Array): Float64Array {
  const den = 2 ** period - 1;
  const bigDen = BigInt(den);
  for (let i = 0; i < nums.length; i += 1) {
    const n = nums[i]!;
    let res: FastNucleus | null = null;
    if (!careful) {
      const end = traceRayDouble(n, den, Math.min(2 * period, period + RAY_MARGIN), 2);
      if (end.ok) {
        res = nucleusDouble(period, end.reHi, end.imHi);
        if (!res.ok) res = nucleusDD(period, end);
        else if (res.size < DD_SIZE) res = nucleusDD(period, res);
      }
    }
    if (res === null || !res.ok) {
      const depth = careful ? 3 * period : 2 * period;
      const end = traceRayDD(BigInt(n), bigDen, depth, careful ? 8 : 2);
      res = end.ok ? nucleusDD(period, end) : null;
    }
    const o = i * RAY_RECORD;
    if (res === null || !res.ok) {
      out.fill(0, o, o + RAY_RECORD);
      continue;
    }
    out[o] = res.reHi;
    out[o + 1] = res.reLo;
    out[o + 2] = res.imHi;
    out[o + 3] = res.imLo;
    out[o + 4] = res.size;
    out[o + 5] = 1;
  }
  return out;
}
