import { LOOP_MAXED, type EscapeLoop } from './escape-loop.js';
import { instantiateWasm } from './instantiate-wasm.js';
import { WASM_BASE64 } from './wasm/escape-loop-simd-bytes.js';

/** What the compiled module (wasm/escape-loop-simd.as) exports. */
interface SimdExports {
  readonly memory: { readonly buffer: ArrayBuffer };
  capacity(): number;
  crPointer(): number;
  ciPointer(): number;
  iterationsPointer(): number;
  zRePointer(): number;
  zImPointer(): number;
  cyclePointer(): number;
  statusPointer(): number;
  run(count: number, start: number, maxIterations: number, escapeRadius2: number, tolerance2: number): void;
}

/** The first round's length and the growth of the rounds (both powers of two, so every round ends at a save point of Brent's schedule). */
const ROUND_FIRST = 64;
const ROUND_GROWTH = 4;

/** The largest iteration limit the module's 32-bit counter holds. */
const MAX_LIMIT = 0x7fffffff;

/**
 * The WebAssembly SIMD twin of `escapeLoop` (escape-loop.ts): the same loop,
 * with the same operation order and results bit for bit, run on 8 samples
 * at a time as 4 vectors of f64x2 in lock-step (wasm/escape-loop-simd.as).
 * Brent's periodicity check (BIT 20 (1980) 176-184; docs/methods.md A4) keeps one
 * save schedule per group of 8, which is every lane's own schedule because
 * the lanes' counters advance together.
 *
 * Compiles and instantiates synchronously; returns undefined when this
 * runtime has no WebAssembly or no SIMD. Each call makes a fresh instance
 * with its own scratch memory (fixed: inputs are copied in and results out
 * in chunks of the module's capacity, so a call allocates nothing), to be
 * used by one thread. `maxIterations` is clamped to [0, 2^31 - 1].
 */
export function loadWasmEscapeLoop(): EscapeLoop | undefined {
  const exports = instantiateWasm(WASM_BASE64);
  if (exports === undefined) return undefined;
  const simd = exports as SimdExports;
  const capacity = simd.capacity();
  const buffer = simd.memory.buffer;
  const inRe = new Float64Array(buffer, simd.crPointer(), capacity);
  const inIm = new Float64Array(buffer, simd.ciPointer(), capacity);
  const iterations = new Int32Array(buffer, simd.iterationsPointer(), capacity);
  const zRe = new Float64Array(buffer, simd.zRePointer(), capacity);
  const zIm = new Float64Array(buffer, simd.zImPointer(), capacity);
  const cycle = new Int32Array(buffer, simd.cyclePointer(), capacity);
  const status = new Uint8Array(buffer, simd.statusPointer(), capacity);

  // Orbits still running at the end of a round are gathered at the front and
  // run on from where they stopped (wasm/escape-loop-simd.as, run): ROUND_FIRST
  // iterations, then rounds ROUND_GROWTH times longer, all ending at powers of
  // two. Lanes of a group advance together until all 8 are done, so without
  // regrouping one slow orbit holds 7 finished ones (measured on plates: 44%
  // of lane steps useful in refinement batches, 50% in centre batches).
  const slot = new Int32Array(capacity);
  return (cr, ci, count, maxIterations, escapeRadius2, tolerance2, out) => {
    // n < limit for integer n is n < ceil(limit); NaN gives 0, as in the JS loop.
    const limit = Math.min(MAX_LIMIT, Math.max(0, Math.ceil(maxIterations))) | 0;
    for (let first = 0; first < count; first += capacity) {
      let m = Math.min(capacity, count - first);
      // Inputs are copied in before results are written, so `out` may alias cr or ci.
      inRe.set(cr.subarray(first, first + m));
      inIm.set(ci.subarray(first, first + m));
      zRe.fill(0, 0, m);
      zIm.fill(0, 0, m);
      for (let k = 0; k < m; k++) slot[k] = first + k;
      let start = 0;
      let end = Math.min(limit, ROUND_FIRST);
      for (;;) {
        simd.run(m, start, end, escapeRadius2, tolerance2);
        const last = end >= limit;
        let kept = 0;
        for (let k = 0; k < m; k++) {
          if (!last && status[k] === LOOP_MAXED && iterations[k] === end) {
            // Still running at `end` (an orbit that met NaN stops earlier, also as MAXED): move it (c and z) to the front for the next round.
            inRe[kept] = inRe[k]!;
            inIm[kept] = inIm[k]!;
            zRe[kept] = zRe[k]!;
            zIm[kept] = zIm[k]!;
            slot[kept] = slot[k]!;
            kept++;
            continue;
          }
          const j = slot[k]!;
          out.iterations[j] = iterations[k]!;
          out.zRe[j] = zRe[k]!;
          out.zIm[j] = zIm[k]!;
          out.cycle[j] = cycle[k]!;
          out.status[j] = status[k]!;
        }
        if (last || kept === 0) break;
        m = kept;
        start = end;
        end = Math.min(limit, end * ROUND_GROWTH);
      }
    }
  };
}
