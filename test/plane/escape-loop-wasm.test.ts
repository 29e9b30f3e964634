import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { EscapeLoop, LoopOut } from '../../src/plane/escape-loop.js';
import { LOOP_CYCLE, LOOP_ESCAPED, LOOP_MAXED, createLoopOut, escapeLoop } from '../../src/plane/escape-loop.js';
import { loadWasmEscapeLoop } from '../../src/plane/escape-loop-wasm.js';
import { BUILD_KEY } from '../../src/plane/wasm/escape-loop-simd-bytes.js';

/**
 * The loop of the contract, written out again independently of
 * src/plane/escape-loop.ts, so that the WebAssembly twin is held to the
 * specification and not only to the other implementation.
 */
const contractLoop: EscapeLoop = (cr, ci, count, maxIterations, escapeRadius2, tolerance2, out) => {
  for (let k = 0; k < count; k++) {
    let x = 0,
      y = 0,
      x2 = 0,
      y2 = 0,
      n = 0,
      sx = 0,
      sy = 0,
      saved = 0,
      next = 1;
    let broke = false,
      cycle = 0;
    while (n < maxIterations && x2 + y2 <= escapeRadius2) {
      y = 2 * x * y + ci[k]!;
      x = x2 - y2 + cr[k]!;
      x2 = x * x;
      y2 = y * y;
      n++;
      if (tolerance2 > 0) {
        const ex = x - sx,
          ey = y - sy;
        if (ex * ex + ey * ey < tolerance2) {
          broke = true;
          cycle = n - saved;
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
    out.status[k] = x2 + y2 > escapeRadius2 ? LOOP_ESCAPED : broke ? LOOP_CYCLE : LOOP_MAXED;
    out.iterations[k] = n;
    out.zRe[k] = x;
    out.zIm[k] = y;
    out.cycle[k] = cycle;
  }
};

/** Deterministic pseudo-random numbers in [0, 1) (mulberry32, common practice). */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Slots where two outputs differ in any field, compared bit for bit (Object.is). */
function differences(a: LoopOut, b: LoopOut, count: number): number[] {
  const bad: number[] = [];
  for (let k = 0; k < count; k++) {
    if (a.iterations[k] !== b.iterations[k] || !Object.is(a.zRe[k], b.zRe[k]) || !Object.is(a.zIm[k], b.zIm[k]) || a.status[k] !== b.status[k] || a.cycle[k] !== b.cycle[k]) {
      bad.push(k);
    }
  }
  return bad;
}

const wasmLoop = loadWasmEscapeLoop();

/** Runs the WebAssembly loop, the contract loop and escapeLoop; returns the WebAssembly output and the mismatches. */
function compare(cr: Float64Array, ci: Float64Array, count: number, maxIterations: number, escapeRadius2: number, tolerance2: number) {
  const wasmOut = createLoopOut(count),
    contractOut = createLoopOut(count),
    jsOut = createLoopOut(count);
  // Poison the output, so a slot the kernel forgets to write cannot pass.
  wasmOut.iterations.fill(-7);
  wasmOut.zRe.fill(Number.NaN);
  wasmOut.status.fill(99);
  wasmOut.cycle.fill(-7);
  wasmLoop!(cr, ci, count, maxIterations, escapeRadius2, tolerance2, wasmOut);
  contractLoop(cr, ci, count, maxIterations, escapeRadius2, tolerance2, contractOut);
  escapeLoop(cr, ci, count, maxIterations, escapeRadius2, tolerance2, jsOut);
  return { out: wasmOut, vsContract: differences(wasmOut, contractOut, count), vsJs: differences(wasmOut, jsOut, count) };
}

describe('loadWasmEscapeLoop', () => {
  it('loadWasmEscapeLoop() returns a loop on Node 20 (WebAssembly SIMD is available there)', () => {
    expect(typeof wasmLoop).toBe('function');
  });

  it('the embedded bytes were built from the current escape-loop-simd.as', () => {
    // Run `node scripts/build-wasm.mjs` after editing the source.
    const source = readFileSync(new URL('../../src/plane/wasm/escape-loop-simd.as', import.meta.url));
    const hash = createHash('sha256').update(source).digest('hex');
    expect(BUILD_KEY.startsWith(`sha256:${hash} `)).toBe(true);
  });

  it('wasm loop(grid W = N = 1000, R^2 = 4, no periodicity check) totals 247632971 iterations, as the plain loop of escape-loop.test.ts', () => {
    // Reference: the plain unfused scalar loop written in test/plane/escape-loop.test.ts, which totals
    // 247632971 on this grid (fused multiply-adds would give 247633556; the loop's contract forbids FMA).
    const W = 1000,
      N = 1000;
    const cr = new Float64Array(W),
      ci = new Float64Array(W),
      out = createLoopOut(W);
    for (let i = 0; i < W; i++) cr[i] = -2.0 + (2.5 * (i + 0.5)) / W;
    let total = 0;
    for (let j = 0; j < W; j++) {
      ci.fill(1.25 - (2.5 * (j + 0.5)) / W);
      wasmLoop!(cr, ci, W, N, 4, 0, out);
      for (let i = 0; i < W; i++) total += out.iterations[i]!;
    }
    expect(total).toBe(247632971);
  });

  it('wasm loop(random c, every count 0..41, limits 1..5000, R^2 4 and 1e6, tolerance 0 and > 0) equals the JS loop bit for bit', () => {
    const next = random(20240601);
    let slots = 0,
      cycles = 0,
      escaped = 0,
      maxed = 0;
    for (let count = 0; count <= 41; count++) {
      for (const [maxIterations, escapeRadius2, tolerance2] of [
        [1, 4, 0],
        [2, 4, 1e-12],
        [7, 1e6, 0],
        [64, 4, 1e-9],
        [300, 1e6, 1e-18],
        [5000, 4, 0],
        [5000, 1e6, 1e-24],
      ] as const) {
        const cr = new Float64Array(count),
          ci = new Float64Array(count);
        for (let k = 0; k < count; k++) {
          cr[k] = -2.2 + 2.8 * next();
          ci[k] = -1.3 + 2.6 * next();
        }
        const r = compare(cr, ci, count, maxIterations, escapeRadius2, tolerance2);
        expect(r.vsContract).toEqual([]);
        expect(r.vsJs).toEqual([]);
        slots += count;
        for (let k = 0; k < count; k++) {
          const s = r.out.status[k];
          if (s === LOOP_CYCLE) cycles++;
          else if (s === LOOP_ESCAPED) escaped++;
          else maxed++;
        }
      }
    }
    // The inputs must exercise all three outcomes, or the comparison proves little.
    expect(slots).toBe(7 * ((41 * 42) / 2));
    expect(Math.min(cycles, escaped, maxed)).toBeGreaterThan(50);
  });

  it('wasm loop(a 331 x 173 grid around the main cardioid and period-2 disk, many settings) equals the JS loop bit for bit', () => {
    const w = 331,
      h = 173,
      count = w * h;
    const cr = new Float64Array(count),
      ci = new Float64Array(count);
    for (let j = 0; j < h; j++) {
      for (let i = 0; i < w; i++) {
        cr[j * w + i] = -1.6 + (2.1 * i) / (w - 1);
        ci[j * w + i] = -1.0 + (2.0 * j) / (h - 1);
      }
    }
    for (const [maxIterations, escapeRadius2, tolerance2] of [
      [200, 4, 0],
      [200, 4, 1e-20],
      [1000, 1e6, 1e-12],
      [50, 0.5, 0],
      [50, 0.5, 1e-3],
      [3, 1e6, 2],
    ] as const) {
      const r = compare(cr, ci, count, maxIterations, escapeRadius2, tolerance2);
      expect(r.vsContract).toEqual([]);
      expect(r.vsJs).toEqual([]);
    }
  });

  it('wasm loop(special values: 0, -2, 1/4, -3/4, c with NaN or infinite parts, R^2 0 and infinite, limit 0) equals the JS loop bit for bit', () => {
    const values = [0, -0, -2, 0.25, -0.75, -1, 1, 2, 1e300, -1e-300, Number.NaN, Infinity, -Infinity, 5e-324];
    const cr = new Float64Array(values.length ** 2),
      ci = new Float64Array(values.length ** 2);
    values.forEach((a, i) =>
      values.forEach((b, j) => {
        cr[i * values.length + j] = a;
        ci[i * values.length + j] = b;
      }),
    );
    for (const [maxIterations, escapeRadius2, tolerance2] of [
      [0, 4, 0],
      [1, 0, 0],
      [100, Infinity, 0],
      [100, Infinity, 1e-30],
      [100, 4, 1e300],
      [100, 4, 1],
      [100, -1, 0],
      [100, 4, Number.NaN],
    ] as const) {
      // Tolerance 1 puts c = -1 on an exact tie: z_1 = -1 is saved, z_2 = 0, |z_2 - z_1|^2 = 1, not < 1.
      const r = compare(cr, ci, cr.length, maxIterations, escapeRadius2, tolerance2);
      expect(r.vsContract).toEqual([]);
      expect(r.vsJs).toEqual([]);
    }
  });

  it('wasm loop(count 10007, more than one chunk of the module) equals the JS loop, and writes nothing past count', () => {
    const next = random(7);
    const count = 10007;
    const cr = new Float64Array(count + 5),
      ci = new Float64Array(count + 5);
    for (let k = 0; k < cr.length; k++) {
      cr[k] = -2 + 2.5 * next();
      ci[k] = -1.25 + 2.5 * next();
    }
    const r = compare(cr, ci, count, 500, 4, 1e-16);
    expect(r.vsContract).toEqual([]);
    expect(r.vsJs).toEqual([]);
    const out = createLoopOut(count + 5);
    out.iterations.fill(-3);
    wasmLoop!(cr, ci, count, 500, 4, 1e-16, out);
    expect(Array.from(out.iterations.subarray(count))).toEqual([-3, -3, -3, -3, -3]);
  });

  it('wasm loop(out.zRe aliasing cr, out.zIm aliasing ci) gives the same results as with separate buffers', () => {
    const next = random(99);
    const count = 5000;
    const cr = new Float64Array(count),
      ci = new Float64Array(count);
    for (let k = 0; k < count; k++) {
      cr[k] = -2 + 2.5 * next();
      ci[k] = -1.25 + 2.5 * next();
    }
    const separate = createLoopOut(count);
    wasmLoop!(cr, ci, count, 300, 4, 1e-14, separate);
    const aliased: LoopOut = { ...createLoopOut(count), zRe: cr, zIm: ci };
    wasmLoop!(cr, ci, count, 300, 4, 1e-14, aliased);
    expect(differences(aliased, separate, count)).toEqual([]);
  });
});
