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
 *
 * The same tracer follows the level curves of the dynamical plane's Green's
 * function G_c(z) = lim 2^-n ln|f_c^n(z)| (julia-equipotentials.ts): there
 * f_c^(k-1)(z) ~ phi_c(z)^(2^(k-1)), the same power, with Newton in z. A
 * `LevelMap` says which iterate is solved and where the angle-0 start is;
 * the rest (levels, steps, continuation) is written once, here.
 */
import { orbitWithDerivative } from '../components/orbit-derivative.js';
import { RAY_RADIUS, traceRayDouble } from '../components/trace-ray.js';
import type { DoubleGrid } from '../view/view.js';
import { pixelToC } from '../view/view.js';
import { Received, UserError } from '../check/user-error.js';

/** The iterate whose level curves are traced, as a function of the unknown x (c, or z in the dynamical plane). */
export interface LevelMap {
  /** Writes [Re w, Im w, Re dw/dx, Im dw/dx] into `out` for the k-th iterate w at x, w ~ Phi(x)^(2^(k-1)) far out; returns `out`. */
  iterate(xr: number, xi: number, k: number, out: Float64Array): Float64Array;
  /** A point on the angle-0 ray with potential between G and the level above (log R / 2^(k-2)); null when it cannot be traced. */
  start(G: number, k: number): [number, number] | null;
}

/** The parameter plane: w = F^k(0, c), started on the parameter ray of angle 0 (trace-ray.ts). */
export const PARAMETER_PLANE: LevelMap = {
  iterate: (cr, ci, k, out) => orbitWithDerivative(cr, ci, k, out),
  start: (G, k) => {
    if (k === 1) return [Math.exp(G), 0];
    const s = traceRayDouble(0, 1, k - 2, 8);
    return s.ok ? [s.reHi, s.imHi] : null;
  },
};

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

/** The largest potential on the frame of a view (sampled along its edges): the outermost level in view; `potential` defaults to the parameter plane's. */
export function largestPotential(grid: DoubleGrid, limit: number, potential: (re: number, im: number, limit: number) => number = potentialAt): number {
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
      best = Math.max(best, potential(c[0]!, c[1]!, limit));
    }
  }
  return best;
}

/**
 * The closed level curve of potential G as points x (re, im, ...) of `map`'s
 * plane (c by default), keeping a point only when it is at least `minStep`
 * from the last one kept; null when Newton loses the curve.
 */
export function equipotential(G: number, minStep: number, map: LevelMap = PARAMETER_PLANE): Float64Array | null {
  const { k, steps } = equipotentialLevel(G);
  if (steps > MAX_CURVE_STEPS) return null;
  const radius = 2 ** (k - 1) * G; // log |target|
  // the angle-0 ray traced to the level above G (potential log R / 2^(k-2) >= G), or x = e^G itself at k = 1
  const start = map.start(G, k);
  if (start === null) return null;
  let [cr, ci] = start;
  // Newton on log w(x) = logRadius + i arg from the current x.
  const orbit = new Float64Array(4);
  const solve = (logRadius: number, arg: number): boolean => {
    let last = Number.POSITIVE_INFINITY;
    for (let it = 0; it < 30; it += 1) {
      map.iterate(cr, ci, k, orbit);
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
      last = Math.hypot(sr, si);
    }
    // Where a level curve passes close to the critical point (c = -2 at small G: |z| ~ 2G), the rounding of
    // z^2 + c limits x to about eps |c| / |x|, and Newton steps to and fro by that much (1e-14 at |z| = 0.02):
    // settled all the same, the last step being the point's error. Only curves that failed before take this exit.
    return last <= 1e-12 * (1 + Math.hypot(cr, ci));
  };
  // From the ray's end down to the level, in sub-steps: one Newton on log F for a drop of up to log 2 / 2 per step stays in its basin.
  map.iterate(cr, ci, k, orbit);
  const from = 0.5 * Math.log(orbit[0]! * orbit[0]! + orbit[1]! * orbit[1]!);
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

/**
 * The `count` level curves G_k = G_0 / 2^k (k = 0..count-1) of a view, G_0
 * the largest potential on its frame, as points of the map's plane; levels
 * at or below `floor` (a disconnected Julia set's pinched levels) and levels
 * whose curve would take more than MAX_CURVE_STEPS Newton steps are refused
 * in one line naming `field`.
 */
export function equipotentialsInView(
  count: number,
  grid: DoubleGrid,
  field: string,
  options: { map?: LevelMap; potential?: (re: number, im: number, limit: number) => number; floor?: { level: number; why: string } } = {},
): { levels: number[]; curves: Float64Array[] } {
  const g0 = largestPotential(grid, 100_000, options.potential);
  if (!(g0 > 0)) throw new UserError(field, 'a view with points outside the set', new Received(`no escaping point on the frame of the view`));
  const levels: number[] = [];
  const curves: Float64Array[] = [];
  for (let k = 0; k < count; k += 1) {
    const g = g0 / 2 ** k;
    if (options.floor !== undefined && !(g > options.floor.level)) {
      throw new UserError(field, `at most ${k} levels in this view (${options.floor.why})`, count);
    }
    if (equipotentialLevel(g).steps > MAX_CURVE_STEPS) {
      throw new UserError(field, `at most ${k} levels in this view (level G_0 / 2^k takes about 2^(k+7) Newton steps; the limit is ${MAX_CURVE_STEPS})`, count);
    }
    const curve = equipotential(g, grid.spacing / 4, options.map);
    if (curve === null) throw new UserError(field, 'levels whose curve Newton follows in double precision', new Received(`G = ${g}`));
    levels.push(g);
    curves.push(curve);
  }
  return { levels, curves };
}
