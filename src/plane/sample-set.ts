/**
 * What the per-pixel kernels compute for a batch of parameters c, as a
 * structure of typed arrays (one slot per sample). Kernels write into a
 * caller's SampleSet; colouring and the NPY writers read from it.
 *
 * Meaning of the fields for slot k:
 * - `period[k]`: 0 if the orbit of 0 escaped; p > 0 if an attracting cycle of
 *   exact period p was found and confirmed (|multiplier| < 1); -1 if the
 *   iteration limit was reached without a decision ("undecided").
 * - `smooth[k]`: smooth (continuous) escape count mu in (n-1, n] for escaped
 *   samples (docs/methods.md A1); for interior samples the iteration at which the
 *   cycle was confirmed (0 when a closed-form test for the main cardioid or
 *   the period-2 disk decided it without iterating); for undecided samples
 *   the iteration limit.
 * - `distance[k]`: for escaped samples the exterior distance estimate
 *   b = 2|z| ln|z| / |dz/dc| in c units (A2); for interior samples the interior
 *   distance estimate (A6) in c units; NaN where it cannot be computed.
 * - `mulRe[k]`, `mulIm[k]`: the multiplier of the attracting cycle (interior
 *   samples only; 0 elsewhere).
 */
export interface SampleSet {
  readonly period: Int32Array;
  readonly smooth: Float64Array;
  readonly distance: Float64Array;
  readonly mulRe: Float64Array;
  readonly mulIm: Float64Array;
}

/** Allocates a SampleSet with room for `count` samples. */
export function createSampleSet(count: number): SampleSet {
  return {
    period: new Int32Array(count),
    smooth: new Float64Array(count),
    distance: new Float64Array(count),
    mulRe: new Float64Array(count),
    mulIm: new Float64Array(count),
  };
}

/** Kernel settings, validated at the boundary so kernels can trust them. */
export interface EscapeSettings {
  /** Iteration limit N (>= 1). */
  readonly maxIterations: number;
  /** Escape radius R (large, e.g. 2^10, so that A1 and A2 are accurate). */
  readonly escapeRadius: number;
  /**
   * Periodicity tolerance in c-plane units scale: a cycle is suspected when
   * |z_n - saved| < periodTolerance (docs/methods.md A4); tie it to pixel spacing.
   */
  readonly periodTolerance: number;
}

export const PERIOD_ESCAPED = 0;
export const PERIOD_UNDECIDED = -1;
