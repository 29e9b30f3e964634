import { describe, expect, it } from 'vitest';
import { LOOP_CYCLE, LOOP_ESCAPED, LOOP_MAXED, createLoopOut, escapeLoop } from '../../src/plane/escape-loop.js';

/** One slot through escapeLoop, for the small cases. */
function one(cr: number, ci: number, maxIterations: number, escapeRadius2: number, tolerance2: number) {
  const out = createLoopOut(1);
  escapeLoop(Float64Array.of(cr), Float64Array.of(ci), 1, maxIterations, escapeRadius2, tolerance2, out);
  return { n: out.iterations[0]!, x: out.zRe[0]!, y: out.zIm[0]!, status: out.status[0]!, cycle: out.cycle[0]! };
}

describe('escapeLoop', () => {
  it('escapeLoop(grid W = N = 1000, R^2 = 4, no periodicity check) totals 247632971 iterations, as a plain loop written here', () => {
    // Reference: the plain scalar loop below (written only in this test, unfused IEEE doubles, the
    // same grid and escape rule), which also matches the C benchmark reference program of the
    // project's bench notes built with -ffp-contract=off (247632971). With fused multiply-adds that C
    // program prints 247633556 instead; JavaScript has no FMA and escapeLoop's contract forbids it.
    const W = 1000,
      N = 1000;
    const cr = new Float64Array(W),
      ci = new Float64Array(W);
    const out = createLoopOut(W);
    for (let i = 0; i < W; i++) cr[i] = -2.0 + (2.5 * (i + 0.5)) / W;
    let total = 0,
      plain = 0;
    for (let j = 0; j < W; j++) {
      const b = 1.25 - (2.5 * (j + 0.5)) / W;
      ci.fill(b);
      escapeLoop(cr, ci, W, N, 4, 0, out);
      for (let i = 0; i < W; i++) {
        total += out.iterations[i]!;
        const a = cr[i]!;
        let x = 0,
          y = 0,
          n = 0;
        while (n < N && x * x + y * y <= 4) {
          const t = x * x - y * y + a;
          y = 2 * x * y + b;
          x = t;
          n++;
        }
        plain += n;
      }
    }
    expect(total).toBe(plain);
    expect(total).toBe(247632971);
  });

  it('escapeLoop(c = 1) escapes at n = 2 with z_2 = 2 + 0i (exact arithmetic: 0 -> 1 -> 2)', () => {
    const r = one(1, 0, 100, 4, 0);
    // x2 + y2 = 4 is not > 4, so one more step: z_3 = 5.
    expect(r).toEqual({ n: 3, x: 5, y: 0, status: LOOP_ESCAPED, cycle: 0 });
    const s = one(1, 0, 100, 3.9, 0);
    expect(s).toEqual({ n: 2, x: 2, y: 0, status: LOOP_ESCAPED, cycle: 0 });
  });

  it('escapeLoop(c = -1, periodicity on) reports a cycle of candidate period 2 (orbit 0, -1, 0, -1 exactly)', () => {
    // z_1 = -1 is saved at n = 1; z_2 = 0 saved at n = 2; z_4 = 0 hits with n - saved = 2.
    const r = one(-1, 0, 100, 1e6, 1e-20);
    expect(r.status).toBe(LOOP_CYCLE);
    expect(r.cycle).toBe(2);
    expect(r.n).toBe(4);
  });

  it('escapeLoop(c = -1, periodicity off) runs to the limit and reports MAXED', () => {
    const r = one(-1, 0, 37, 1e6, 0);
    expect(r).toEqual({ n: 37, x: -1, y: 0, status: LOOP_MAXED, cycle: 0 });
  });

  it('escapeLoop(c = 2i) matches hand iteration: z_1 = 2i, z_2 = -4 + 2i escapes R^2 = 16', () => {
    // 0 -> 2i -> (2i)^2 + 2i = -4 + 2i; |z_2|^2 = 20 > 16.
    const r = one(0, 2, 100, 16, 0);
    expect(r).toEqual({ n: 2, x: -4, y: 2, status: LOOP_ESCAPED, cycle: 0 });
  });

  it('escapeLoop writes each slot independently of its neighbours', () => {
    const cr = Float64Array.of(0.3, -1, -0.1, 0.3),
      ci = Float64Array.of(0.5, 0, 0.65, 0.5);
    const out = createLoopOut(4);
    escapeLoop(cr, ci, 4, 500, 1e6, 1e-24, out);
    for (let k = 0; k < 4; k++) {
      const r = one(cr[k]!, ci[k]!, 500, 1e6, 1e-24);
      expect([out.iterations[k], out.zRe[k], out.zIm[k], out.status[k], out.cycle[k]]).toEqual([r.n, r.x, r.y, r.status, r.cycle]);
    }
    expect(out.iterations[0]).toBe(out.iterations[3]);
  });
});
