import { existsSync } from 'node:fs';
import { loadavg } from 'node:os';
import type { EscapeLoop } from '../src/plane/escape-loop.js';
import { createLoopOut, escapeLoop } from '../src/plane/escape-loop.js';
import { loadWasmEscapeLoop } from '../src/plane/escape-loop-wasm.js';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';
import type { CReport } from './c-reference.js';
import { cReferenceSource, haveCompiler, runCReference } from './c-reference.js';

/** The bench-ref grid (shared/bench-ref/README.md): W x W pixel centres over [-2, 0.5] x [-1.25, 1.25], N iterations, R^2 = 4. */
const W = 1000;
const N = 1000;

/**
 * Iterations on that grid with strict IEEE double operations: printed by
 * escape-ref.c itself when built with -ffp-contract=off (scalar and vector
 * loops alike). With gcc's default contraction into fused multiply-adds
 * under -march=native it prints 247633556 instead; our loops never fuse.
 */
const UNFUSED_TOTAL = 247632971;

/** The yardstick build, as shared/bench-ref/README.md gives it. */
const NATIVE_FLAGS = ['-O3', '-march=native'];
/** The same, with every operation rounded on its own, as in JavaScript. */
const UNFUSED_FLAGS = ['-O3', '-march=native', '-ffp-contract=off'];

/** Runs one loop over the whole grid, a row at a time; returns the iteration total. */
function gridTotal(loop: EscapeLoop): number {
  const cr = new Float64Array(W),
    ci = new Float64Array(W),
    out = createLoopOut(W);
  for (let i = 0; i < W; i++) cr[i] = -2.0 + (2.5 * (i + 0.5)) / W;
  let total = 0;
  for (let j = 0; j < W; j++) {
    ci.fill(1.25 - (2.5 * (j + 0.5)) / W);
    loop(cr, ci, W, N, 4, 0, out);
    for (let i = 0; i < W; i++) total += out.iterations[i]!;
  }
  return total;
}

/** One warm-up pass, then the best of three timed passes. */
function timeLoop(loop: EscapeLoop): { total: number; seconds: number } {
  const total = gridTotal(loop);
  let best = Infinity;
  for (let r = 0; r < 3; r++) {
    const t0 = process.hrtime.bigint();
    const t = gridTotal(loop);
    const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
    if (t !== total) throw new Error(`iteration total changed between passes: ${total} then ${t}`);
    best = Math.min(best, seconds);
  }
  return { total, seconds: best };
}

function row(label: string, iterations: number, seconds: number, yardstick: number | null, giga = iterations / seconds / 1e9): BenchRow {
  return {
    label,
    figures: {
      iterations,
      seconds,
      'G iter/s': giga,
      'x C vector': yardstick === null ? null : giga / yardstick,
    },
  };
}

function runC(context: BenchContext, flags: readonly string[], runs = 3): CReport | undefined {
  const source = cReferenceSource(context.root);
  if (!existsSync(source)) {
    context.note(`C reference skipped: ${source} not found`);
    return undefined;
  }
  if (!haveCompiler()) {
    context.note('C reference skipped: no C compiler (cc)');
    return undefined;
  }
  return runCReference(source, flags, W, N, runs);
}

/**
 * The escape-time kernel against the C yardstick (shared/bench-ref), all on
 * one thread ("per core"): C scalar and vector, our JS loop, our WebAssembly
 * SIMD loop, on the same 1000 x 1000 grid, 1000 iterations, R^2 = 4, no
 * periodicity check, each as iterations per second and as a ratio to the C
 * vector figure measured in the same run.
 */
export const kernelSection: BenchSection = {
  name: 'kernel',
  title: 'escape-time loop, one thread, 1000 x 1000 grid, N = 1000, R^2 = 4 (ratios to C vector, -O3 -march=native)',
  run(context) {
    const rows: BenchRow[] = [];
    const native = runC(context, NATIVE_FLAGS);
    const unfused = native === undefined ? undefined : runC(context, UNFUSED_FLAGS);
    const yardstick = native?.vector.gigaPerSecond ?? null;
    if (native !== undefined) {
      rows.push(row('C scalar (-O3 -march=native)', native.scalar.iterations, native.scalar.seconds, yardstick, native.scalar.gigaPerSecond));
      rows.push(row('C vector, 8 in flight (-O3 -march=native)', native.vector.iterations, native.vector.seconds, yardstick, native.vector.gigaPerSecond));
    }
    if (unfused !== undefined) {
      rows.push(row('C scalar (+ -ffp-contract=off)', unfused.scalar.iterations, unfused.scalar.seconds, yardstick, unfused.scalar.gigaPerSecond));
      rows.push(row('C vector (+ -ffp-contract=off)', unfused.vector.iterations, unfused.vector.seconds, yardstick, unfused.vector.gigaPerSecond));
      if (unfused.vector.iterations !== UNFUSED_TOTAL || unfused.scalar.iterations !== UNFUSED_TOTAL) {
        context.note(`C reference without FMA counted ${unfused.scalar.iterations} / ${unfused.vector.iterations}, not ${UNFUSED_TOTAL}`);
      }
      if (native !== undefined && native.vector.iterations !== UNFUSED_TOTAL) {
        context.note(`C with fused multiply-adds counts ${native.vector.iterations}; strict IEEE (JS, WASM, C -ffp-contract=off) counts ${UNFUSED_TOTAL}`);
      }
    }

    const js = timeLoop(escapeLoop);
    if (js.total !== UNFUSED_TOTAL) throw new Error(`JS escapeLoop counted ${js.total}, expected ${UNFUSED_TOTAL}`);
    rows.push(row('JS escapeLoop', js.total, js.seconds, yardstick));

    const wasmLoop = loadWasmEscapeLoop();
    if (wasmLoop === undefined) {
      context.note('WebAssembly SIMD loop skipped: this runtime has no WebAssembly SIMD');
    } else {
      const wasm = timeLoop(wasmLoop);
      if (wasm.total !== UNFUSED_TOTAL) throw new Error(`WASM loop counted ${wasm.total}, expected ${UNFUSED_TOTAL}`);
      rows.push(row('WASM SIMD loop (4 x f64x2)', wasm.total, wasm.seconds, yardstick));
      context.note(`WASM / JS = ${(js.seconds / wasm.seconds).toFixed(2)}`);
      if (unfused !== undefined && native !== undefined) {
        // Paired runs, each one pass of every loop in turn, so load drifts alike: the ratios, median of 5 with min and max.
        const toUnfused: number[] = [];
        const toFused: number[] = [];
        for (let r = 0; r < 5; r++) {
          const u = runC(context, UNFUSED_FLAGS, 1)!;
          const f = runC(context, NATIVE_FLAGS, 1)!;
          const t0 = process.hrtime.bigint();
          gridTotal(wasmLoop);
          const w = Number(process.hrtime.bigint() - t0) / 1e9;
          toUnfused.push(u.vector.seconds / w);
          toFused.push(f.vector.seconds / w);
        }
        const spread = (v: number[]): { median: number; min: number; max: number } => {
          const x = [...v].sort((a, b) => a - b);
          return { median: x[2]!, min: x[0]!, max: x[4]! };
        };
        const a = spread(toUnfused);
        const b = spread(toFused);
        rows.push({ label: 'WASM / C vector -ffp-contract=off, 5 paired runs', figures: { median: a.median, min: a.min, max: a.max } });
        rows.push({ label: 'WASM / C vector with FMA, 5 paired runs', figures: { median: b.median, min: b.min, max: b.max } });
      }
    }
    context.note('JS and WASM: warm-up pass, then best of 3; C: best of 3 runs of escape-ref (each one pass per loop); all wall-clock time on one thread');
    context.note(`load average at the end: ${loadavg()[0]!.toFixed(2)} (figures from a busy machine are low and noisy)`);
    return rows;
  },
};
