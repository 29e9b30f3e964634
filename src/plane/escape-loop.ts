/** Why the loop stopped for a slot (`LoopOut.status`). */
export const LOOP_MAXED = 0;
export const LOOP_ESCAPED = 1;
export const LOOP_CYCLE = 2;

/**
 * Where an escape loop leaves each slot k: the iteration count n, the last
 * iterate z_n, why it stopped, and (for LOOP_CYCLE) the candidate period.
 */
export interface LoopOut {
  readonly iterations: Int32Array;
  readonly zRe: Float64Array;
  readonly zIm: Float64Array;
  readonly status: Uint8Array;
  /**
   * Candidate period n - saved when the periodicity check fired (status
   * LOOP_CYCLE, or LOOP_ESCAPED if the same iterate escaped), else 0.
   */
  readonly cycle: Int32Array;
}

/** Allocates a LoopOut with room for `count` slots. */
export function createLoopOut(count: number): LoopOut {
  return {
    iterations: new Int32Array(count),
    zRe: new Float64Array(count),
    zIm: new Float64Array(count),
    status: new Uint8Array(count),
    cycle: new Int32Array(count),
  };
}

/**
 * The shape every escape loop has (this JS one and the WebAssembly SIMD twin
 * in escape-loop-wasm.ts): iterate slots 0..count-1 of (cr, ci) and write
 * into `out`. Implementations must give bit-identical results.
 */
export type EscapeLoop = (cr: Float64Array, ci: Float64Array, count: number, maxIterations: number, escapeRadius2: number, tolerance2: number, out: LoopOut) => void;

/**
 * The hot loop: escape time of z -> z^2 + c from z_0 = 0 with Brent-style
 * periodicity checking (docs/methods.md A4: R. Brent, BIT 20 (1980) 176-184).
 *
 * The operation order is part of the contract (the WebAssembly twin must
 * reproduce it bit for bit; every operation is an IEEE double operation, no
 * fused multiply-add). Per slot k, with c = (cr[k], ci[k]):
 *
 * ```
 * x = y = x2 = y2 = 0; n = 0; sx = sy = 0; saved = 0; next = 1; broke = false
 * while (n < maxIterations && x2 + y2 <= escapeRadius2) {
 *   y = 2 * x * y + ci          // (2 * x) * y, then + ci
 *   x = x2 - y2 + cr            // (x2 - y2), then + cr
 *   x2 = x * x; y2 = y * y; n++
 *   if (tolerance2 > 0) {
 *     ex = x - sx; ey = y - sy
 *     if (ex * ex + ey * ey < tolerance2) { cycle = n - saved; broke = true; break }
 *     if (n === next) { sx = x; sy = y; saved = n; next *= 2 }
 *   }
 * }
 * status = x2 + y2 > escapeRadius2 ? ESCAPED : broke ? CYCLE : MAXED
 * iterations = n; zRe = x; zIm = y; cycle = broke ? n - saved : 0
 * ```
 *
 * With escapeRadius2 = 4 and tolerance2 = 0 it counts iterations exactly like
 * the plain C reference loop that `npm run bench` compiles (bench/c-reference.ts). A cycle hit
 * whose iterate has also escaped reports ESCAPED (escape wins).
 */
export const escapeLoop: EscapeLoop = (cr, ci, count, maxIterations, escapeRadius2, tolerance2, out) => {
  const { iterations, zRe, zIm, status, cycle } = out;
  const checking = tolerance2 > 0;
  for (let k = 0; k < count; k++) {
    const a = cr[k]!;
    const b = ci[k]!;
    let x = 0,
      y = 0,
      x2 = 0,
      y2 = 0,
      n = 0;
    let sx = 0,
      sy = 0,
      saved = 0,
      next = 1,
      found = 0;
    while (n < maxIterations && x2 + y2 <= escapeRadius2) {
      y = 2 * x * y + b;
      x = x2 - y2 + a;
      x2 = x * x;
      y2 = y * y;
      n++;
      if (checking) {
        const ex = x - sx,
          ey = y - sy;
        if (ex * ex + ey * ey < tolerance2) {
          found = n - saved;
          break;
        }
        if (n === next) {
          sx = x;
          sy = y;
          saved = n;
          next *= 2;
        }
      }
    }
    status[k] = x2 + y2 > escapeRadius2 ? LOOP_ESCAPED : found > 0 ? LOOP_CYCLE : LOOP_MAXED;
    iterations[k] = n;
    zRe[k] = x;
    zIm[k] = y;
    cycle[k] = found;
  }
};
