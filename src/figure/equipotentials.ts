/**
 * Equipotentials for figures: the level curve G(c) = G of the Green's
 * function of the set's complement, traced through the Böttcher coordinate
 * Phi(c) = e^{G + 2 pi i theta}: with z_k = F^k(0, c) ~ Phi(c)^(2^(k-1)),
 * each point solves
 *   F^k(0, c) = e^{2^(k-1) (G + 2 pi i theta)}
 * for k chosen so that |z_k| lies between R and R^2 (R = RAY_RADIUS, the ray
 * tracer's radius, docs/methods.md D4, Kawahira 2009): then log|z_k| / 2^(k-1)
 * differs from G by about |c| / |z_k|^2, under 1e-9 of G. theta runs over
 * [0, 1) in STEPS_PER_TURN steps per turn of the target, i.e.
 * STEPS_PER_TURN * 2^(k-1) steps in all, each continuing from the last by
 * Newton on log F^k (the step F log(F / t) / D_c of trace-ray.ts), which is
 * nearly linear in log Phi far out; the start is the ray of angle 0 traced
 * down to the level above G. Only the target's argument is rounded
 * (2^(k-1) theta mod 1 is exact in integers), so the curve stays on its level
 * however many turns it takes.
 */
import { orbitWithDerivative } from '../components/orbit-derivative.js';
import { RAY_RADIUS, traceRayDouble } from '../components/trace-ray.js';
import type { DoubleGrid } from '../view/view.js';
import { pixelToC } from '../view/view.js';

/** Newton steps per turn of the target around the circle of radius e^(2^(k-1) G). */
export const STEPS_PER_TURN = 64;
/** Most Newton solves one curve may take (2^22: a few seconds). */
export const MAX_CURVE_STEPS = 2 ** 22;

const LOG_R = Math.log(RAY_RADIUS);

/**
 * The level k of F^k used for potential G (|z_k| = e^(2^(k-1) G) between R
 * and R^2, so that log|z_k| / 2^(k-1) is G to about 1/R^2), and the number
 * of steps of its curve.
 */
export function equipotentialLevel(G: number): { k: number; steps: number } {
  const d = Math.max(0, Math.floor(Math.log2((2 * LOG_R) / G)));
  return { k: d + 1, steps: STEPS_PER_TURN * 2 ** d };
}

/** The Green's function at c by iteration: log|z_n| / 2^(n-1) once |z_n| > 1e10 (0 inside within `limit`). */
export function potentialAt(cr: number, ci: number, limit: number): number {
  let zr = cr;
  let zi = ci;
  for (let n = 1; n <= limit; n += 1) {
    const m = zr * zr + zi * zi;
    if (m > 1e20) return (0.5 * Math.log(m)) / 2 ** (n - 1);
    const t = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = t;
  }
  return 0;
}

/** The largest potential on the frame of a view (sampled along its edges): the outermost level in view. */
export function largestPotential(grid: DoubleGrid, limit: number): number {
  let best = 0;
  const c = new Float64Array(2);
  const n = 256;
  for (let i = 0; i <= n; i += 1) {
    const x = (grid.width * i) / n;
    const y = (grid.height * i) / n;
    for (const [px, py] of [
      [x, 0],
      [x, grid.height],
      [0, y],
      [grid.width, y],
    ] as const) {
      pixelToC(grid, px, py, c);
      best = Math.max(best, potentialAt(c[0]!, c[1]!, limit));
    }
  }
  return best;
}

/**
 * The closed level curve of potential G as c values (re, im, ...), keeping a
 * point only when it is at least `minStep` (c units) from the last one kept;
 * null when Newton loses the curve.
 */
export function equipotential(G: number, minStep: number): Float64Array | null {
  const { k, steps } = equipotentialLevel(G);
  if (steps > MAX_CURVE_STEPS) return null;
  const radius = 2 ** (k - 1) * G; // log |target|
  let cr: number;
  let ci: number;
  // the angle-0 ray traced to the level above G (potential log R / 2^(k-2) >= G), or c = e^G itself at k = 1
  if (k === 1) {
    cr = Math.exp(G);
    ci = 0;
  } else {
    const start = traceRayDouble(0, 1, k - 2, 8);
    if (!start.ok) return null;
    cr = start.reHi;
    ci = start.imHi;
  }
  // Newton on log F^k(0, c) = logRadius + i arg from the current c.
  const orbit = new Float64Array(4);
  const solve = (logRadius: number, arg: number): boolean => {
    for (let it = 0; it < 30; it += 1) {
      orbitWithDerivative(cr, ci, k, orbit);
      const zr = orbit[0]!;
      const zi = orbit[1]!;
      const dr = orbit[2]!;
      const di = orbit[3]!;
      // log F - log t, the imaginary part taken to the nearest branch
      const lr = 0.5 * Math.log(zr * zr + zi * zi) - logRadius;
      let li = Math.atan2(zi, zr) - arg;
      li -= 2 * Math.PI * Math.round(li / (2 * Math.PI));
      // step = F (log F - log t) / D_c
      const er = lr * zr - li * zi;
      const ei = lr * zi + li * zr;
      const dm = dr * dr + di * di;
      const sr = (er * dr + ei * di) / dm;
      const si = (ei * dr - er * di) / dm;
      if (!Number.isFinite(sr) || !Number.isFinite(si)) return false;
      cr -= sr;
      ci -= si;
      if (sr * sr + si * si <= 1e-30 * (cr * cr + ci * ci) || Math.hypot(lr, li) < 1e-14) return true;
    }
    return false;
  };
  // From the ray's end down to the level, in sub-steps: one Newton on log F for a drop of up to log 2 / 2 per step stays in its basin.
  let zr = 0;
  let zi = 0;
  for (let q = 0; q < k; q += 1) [zr, zi] = [zr * zr - zi * zi + cr, 2 * zr * zi + ci];
  const from = 0.5 * Math.log(zr * zr + zi * zi);
  const down = Math.max(1, Math.ceil(((from - radius) / Math.LN2) * 2));
  for (let s = 1; s <= down; s += 1) if (!solve(from + ((radius - from) * s) / down, 0)) return null;
  const out: number[] = [];
  let lastR = Number.NaN;
  let lastI = Number.NaN;
  for (let j = 0; j <= steps; j += 1) {
    // 2^(k-1) * theta = 2^(k-1) * j / steps = j / STEPS_PER_TURN, mod 1
    if (!solve(radius, (2 * Math.PI * (j % STEPS_PER_TURN)) / STEPS_PER_TURN)) return null;
    if (j === steps || !(Math.hypot(cr - lastR, ci - lastI) < minStep)) {
      out.push(cr, ci);
      lastR = cr;
      lastI = ci;
    }
  }
  return Float64Array.from(out);
}
