/**
 * Tracing a parameter ray of rational external angle inward, in double and in
 * double-double precision.
 *
 * Method (docs/methods.md D4): T. Kawahira, "An algorithm to draw external rays of
 * the Mandelbrot set" (2009); mathr.co.uk/web "External ray in". The k-th
 * level solves F^k(0, c) = rho * e^{2 pi i 2^{k-1} theta} by Newton in c, with
 * rho stepping down the potential, rho = R^{2^-u} for u in (0, 1]; after each
 * level the angle doubles and k grows by one. The angle stays exact (BigInt
 * or exact integer numerator); only e^{2 pi i theta_k} is rounded.
 *
 * Newton in double: the first step of each sub-step is taken on log F^k
 * (step F log(F/t) / D_c), exact for F ~ Phi^(2^(k-1)) far out, where plain
 * Newton on a polynomial of degree 2^(k-1) creeps in linearly; later steps are
 * plain Newton. Measured on period 16: 2532 iterations of z per ray instead of
 * 8509, the same 32640 nuclei. (Log steps after the first made rays jump to
 * neighbours.)
 *
 * Sub-steps: `sharpness` per level; when a Newton solve fails (no convergence
 * in 12 steps or a non-finite value), the sub-step is halved (adaptive, down
 * to 2^-20 of a level). Without the halving, rays near the tip c = -2 broke
 * off with NaN at period 16.
 *
 * Double-double: c is kept as hi + lo pairs and z as well; the derivative and
 * the Newton step need only double relative precision, so they stay doubles.
 * Used where components are too small for doubles (size below ~1e-11 next to
 * |c| ~ 2: the census measured 4224 such components at period 16).
 */
import { ddAdd, ddComplexSquareAdd } from './double-double.js';
import { orbitWithDerivative } from './orbit-derivative.js';

const orbit = new Float64Array(4);

/** Escape radius R of the potential steps (large: fewer levels mis-step near escape). */
export const RAY_RADIUS = 65536;

/**
 * A double-precision sub-step is settled when a Newton step after the first
 * is below 1/10 of the first (squared: 1e-2): the next sub-step starts from
 * this point and corrects what is left, so solving each point to 1e-12 (as
 * before December 2026: 8 to 9 Newton steps per sub-step) buys nothing.
 * Looser (1/3) made rays jump to neighbours at period 16.
 */
const STEP_SETTLED = 1e-2;

/** The end of a traced ray: c = (reHi + reLo) + i (imHi + imLo); ok false when the trace broke off. */
export interface RayEnd {
  ok: boolean;
  reHi: number;
  reLo: number;
  imHi: number;
  imLo: number;
}

/**
 * Traces the ray of angle num/den (0 <= num < den, integers below 2^52 so
 * that doubling is exact) to `depth` levels in double precision. With
 * `path`, every settled sub-step's c is appended to it (re, im, re, im, ...),
 * starting at the ray's point on the circle of radius RAY_RADIUS: the ray as
 * a polyline, for figures.
 */
export function traceRayDouble(num: number, den: number, depth: number, sharpness: number, path?: number[]): RayEnd {
  let n = num;
  const a0 = (2 * Math.PI * n) / den;
  const c = new Float64Array([RAY_RADIUS * Math.cos(a0), RAY_RADIUS * Math.sin(a0)]);
  path?.push(c[0]!, c[1]!);
  const radius = radiusTable(sharpness);
  for (let k = 1; k <= depth; k += 1) {
    if (!traceLevel(c, k, (2 * Math.PI * n) / den, sharpness, radius, path)) return { ok: false, reHi: c[0]!, reLo: 0, imHi: c[1]!, imLo: 0 };
    n = (n * 2) % den;
  }
  return { ok: true, reHi: c[0]!, reLo: 0, imHi: c[1]!, imLo: 0 };
}

/** Where traceRayToward stopped: the traced end, the levels traced, and why it stopped. */
export interface RayApproach {
  readonly re: number;
  readonly im: number;
  readonly depth: number;
  /** 'close': within the tolerance of the target; 'stalled': a level's Newton solve failed; 'depth': maxDepth reached; 'broken': the first `depth` levels failed. */
  readonly stop: 'close' | 'stalled' | 'depth' | 'broken';
}

/**
 * Traces the ray of angle num/den as traceRayDouble does to `depth` levels
 * at `sharpness`, then goes on inward one sub-step per level (each level
 * halves the potential) until the traced point is within `tolerance` of
 * `target` (the landing point, from Newton), until a level's Newton solve no
 * longer converges, or until `maxDepth` levels (docs/methods.md D4, "Closing
 * in on a parabolic root"). Near a parabolic root the ray closes in like
 * 1/depth (measured: 1/3 is 3.14/depth from c = -3/4, 1/7 1.8/depth from its
 * root), so a pixel of 0.0015 takes about 4000 levels; one sub-step per
 * level is enough there, as consecutive levels lie about 1/depth^2 apart
 * (sharpness 2 took 1.5 times as long for the same end). With `path`, the
 * first `depth` levels append every sub-step, the levels after them only
 * points at least `spacing` from the last one appended, and the end.
 */
export function traceRayToward(
  num: number,
  den: number,
  depth: number,
  sharpness: number,
  target: { readonly re: number; readonly im: number },
  tolerance: number,
  maxDepth: number,
  path?: number[],
  spacing = 0,
): RayApproach {
  const head = traceRayDouble(num, den, depth, sharpness, path);
  if (!head.ok) return { re: head.reHi, im: head.imHi, depth, stop: 'broken' };
  const c = new Float64Array([head.reHi, head.imHi]);
  const far = (): boolean => Math.hypot(c[0]! - target.re, c[1]! - target.im) >= tolerance;
  let n = num;
  for (let k = 0; k < depth; k += 1) n = (n * 2) % den;
  const radius = radiusTable(1);
  let k = depth;
  let lastRe = c[0]!;
  let lastIm = c[1]!;
  let stop: RayApproach['stop'] = 'close';
  while (far()) {
    if (k >= maxDepth) {
      stop = 'depth';
      break;
    }
    const before = Float64Array.from(c);
    if (!traceLevel(c, k + 1, (2 * Math.PI * n) / den, 1, radius)) {
      c.set(before);
      stop = 'stalled';
      break;
    }
    k += 1;
    n = (n * 2) % den;
    if (path !== undefined && Math.hypot(c[0]! - lastRe, c[1]! - lastIm) >= spacing) {
      lastRe = c[0]!;
      lastIm = c[1]!;
      path.push(lastRe, lastIm);
    }
  }
  if (path !== undefined && (c[0] !== lastRe || c[1] !== lastIm)) path.push(c[0]!, c[1]!);
  return { re: c[0]!, im: c[1]!, depth: k, stop };
}

/** R^(2^-u) at u = j / sharpness, j = 0..sharpness (two pow calls per sub-step were a third of the time). */
function radiusTable(sharpness: number): Float64Array {
  const radius = new Float64Array(sharpness + 1);
  for (let j = 0; j <= sharpness; j += 1) radius[j] = RAY_RADIUS ** (0.5 ** (j / sharpness));
  return radius;
}

/**
 * One level k of the inward trace: moves c = [re, im] (in place) along the
 * potential from R to R^(1/2) at argument `a` = 2 pi 2^(k-1) theta, in
 * `sharpness` sub-steps halved on failure; false when a sub-step fell below
 * 2^-20 of a level (c then holds the last settled point).
 */
function traceLevel(c: Float64Array, k: number, a: number, sharpness: number, radius: Float64Array, path?: number[]): boolean {
  let cr = c[0]!;
  let ci = c[1]!;
  const ca = Math.cos(a);
  const sa = Math.sin(a);
  let u = 0;
  let du = 1 / sharpness;
  while (u < 1) {
    const un = Math.min(1, u + du);
    const j = un * sharpness;
    const r = Number.isInteger(j) ? radius[j]! : RAY_RADIUS ** (0.5 ** un);
    const tr = r * ca;
    const ti = r * sa;
    let xr = cr;
    let xi = ci;
    let ok = false;
    let first = 0;
    for (let it = 0; it < 12; it += 1) {
      orbitWithDerivative(xr, xi, k, orbit);
      const zr = orbit[0]!;
      const zi = orbit[1]!;
      const dr = orbit[2]!;
      const di = orbit[3]!;
      let er = zr - tr;
      let ei = zi - ti;
      if (it === 0) {
        // log step: solve log F = log t, i.e. step = F log(F / t) / D_c
        const tm = tr * tr + ti * ti;
        const qr = (zr * tr + zi * ti) / tm;
        const qi = (zi * tr - zr * ti) / tm;
        const lr = 0.5 * Math.log(qr * qr + qi * qi);
        const li = Math.atan2(qi, qr);
        er = lr * zr - li * zi;
        ei = lr * zi + li * zr;
      }
      const dm = dr * dr + di * di;
      const sr = (er * dr + ei * di) / dm;
      const si = (ei * dr - er * di) / dm;
      if (!Number.isFinite(sr) || !Number.isFinite(si)) break;
      xr -= sr;
      xi -= si;
      const st = sr * sr + si * si;
      if (it === 0) first = st;
      else if (st < STEP_SETTLED * first || st < 1e-24 * (xr * xr + xi * xi)) {
        ok = true;
        break;
      }
    }
    if (!ok) {
      du /= 2;
      if (du < 2 ** -20) {
        c[0] = cr;
        c[1] = ci;
        return false;
      }
      continue;
    }
    cr = xr;
    ci = xi;
    path?.push(cr, ci);
    u = un;
  }
  c[0] = cr;
  c[1] = ci;
  return true;
}

/**
 * Traces the ray of angle num/den (BigInt, 0 <= num < den) to `depth` levels
 * in double-double precision (about 106 bits).
 */
export function traceRayDD(num: bigint, den: bigint, depth: number, sharpness: number): RayEnd {
  let n = num % den;
  const angle = (m: bigint): number => Number((m << 53n) / den) / 2 ** 53;
  const a0 = 2 * Math.PI * angle(n);
  const c = new Float64Array(4); // reHi, reLo, imHi, imLo
  c[0] = RAY_RADIUS * Math.cos(a0);
  c[2] = RAY_RADIUS * Math.sin(a0);
  const x = new Float64Array(4);
  const z = new Float64Array(4);
  const t = new Float64Array(4);
  for (let k = 1; k <= depth; k += 1) {
    const a = 2 * Math.PI * angle(n);
    const ca = Math.cos(a);
    const sa = Math.sin(a);
    let u = 0;
    let du = 1 / sharpness;
    while (u < 1) {
      const un = Math.min(1, u + du);
      const r = RAY_RADIUS ** (0.5 ** un);
      const tr = r * ca;
      const ti = r * sa;
      x.set(c);
      let ok = false;
      for (let it = 0; it < 12; it += 1) {
        const d = iterateDD(x, k, z, t);
        const er = z[0]! - tr + z[1]!;
        const ei = z[2]! - ti + z[3]!;
        const dm = d[0] * d[0] + d[1] * d[1];
        const sr = (er * d[0] + ei * d[1]) / dm;
        const si = (ei * d[0] - er * d[1]) / dm;
        if (!Number.isFinite(sr) || !Number.isFinite(si)) break;
        ddAdd(x, 0, -sr, 0);
        ddAdd(x, 2, -si, 0);
        if (sr * sr + si * si < 1e-56 * (x[0]! * x[0]! + x[2]! * x[2]!)) {
          ok = true;
          break;
        }
      }
      if (!ok) {
        du /= 2;
        if (du < 2 ** -20) return { ok: false, reHi: c[0]!, reLo: c[1]!, imHi: c[2]!, imLo: c[3]! };
        continue;
      }
      c.set(x);
      u = un;
    }
    n = (n * 2n) % den;
  }
  return { ok: true, reHi: c[0]!, reLo: c[1]!, imHi: c[2]!, imLo: c[3]! };
}

/**
 * z = F^k(0, c) in double-double (written to z: reHi, reLo, imHi, imLo);
 * returns D_c F^k(0, c) in double. `t` is scratch.
 */
export function iterateDD(c: Float64Array, k: number, z: Float64Array, t: Float64Array): [number, number] {
  z.fill(0);
  let dr = 0;
  let di = 0;
  for (let q = 0; q < k; q += 1) {
    const zr = z[0]!;
    const zi = z[2]!;
    const ndr = 2 * (zr * dr - zi * di) + 1;
    di = 2 * (zr * di + zi * dr);
    dr = ndr;
    ddComplexSquareAdd(z, c, t);
    if (!(Math.abs(z[0]!) < 1e150)) return [Number.NaN, Number.NaN];
  }
  return [dr, di];
}
