import { parabolicPetals, type ParabolicPetals } from './parabolic-petals.js';

/**
 * What the critical orbit of z -> z^2 + c settles on, found once per plate:
 *
 * - `attracting`: a cycle w_0 .. w_{p-1} (w_{j+1} = f(w_j)) confirmed by
 *   Newton on f^p(w) = w with |multiplier| < 1 (docs/methods.md A5), and a trap
 *   disk |z - w_0| < trapRadius that f^p maps into itself, so every orbit
 *   entering it converges to the cycle;
 * - `parabolic`: a cycle of period k whose multiplier is e^{2 pi i s/q}; its
 *   basin is reached through the k q attracting petals (parabolic-petals.ts);
 * - `siegel`: the fixed point alpha has multiplier e^{2 pi i theta} for a
 *   stated Brjuno number theta (the golden mean): f is conjugate to the
 *   rotation by theta near alpha on the Siegel disk (Siegel 1942; Brjuno;
 *   Milnor section 11), orbits there neither converge nor escape, and the
 *   kernel renders the disk by its orbits' recurrence;
 * - `none`: the critical orbit escapes (c outside the set: the Julia set is a
 *   Cantor set, no interior), or lands on a repelling cycle (Misiurewicz c,
 *   such as i or -2: a dendrite, no interior), or sits on an indifferent cycle
 *   with no rational rotation the numerics can name.
 *
 * By Fatou's theorem a polynomial's attracting or parabolic cycle attracts a
 * critical point, and z^2 + c has only one (J. Milnor, Dynamics in One Complex
 * Variable, 3rd ed., Thm. 8.6 and 10.15), so following the orbit of 0 finds
 * the only cycle there can be. Indexing: w_0 is the cycle point with
 * f^{kp}(0) -> w_0, so the critical point lies in class 0.
 */
export interface JuliaCycle {
  readonly kind: 'attracting' | 'parabolic' | 'siegel' | 'none';
  /** Period of the cycle (0 when there is none). */
  readonly period: number;
  /** Classes of the interior: p for an attracting cycle, k q for a parabolic one, 0 for none. */
  readonly basinPeriod: number;
  readonly pointsRe: readonly number[];
  readonly pointsIm: readonly number[];
  readonly multiplierRe: number;
  readonly multiplierIm: number;
  /** Attracting: radius of the trap disk about w_0 (0 otherwise). */
  readonly trapRadius: number;
  /** Attracting: the largest |f^p(w_0 + u) - w_0| / |u| found on the trap circle (the contraction). */
  readonly trapContraction: number;
  /** Parabolic: the rotation number s/q of the multiplier and the petals at w_0. */
  readonly rotation: { readonly s: number; readonly q: number } | null;
  readonly petals: ParabolicPetals | null;
  /** What the numerics showed, in one sentence. */
  readonly note: string;
}

export interface FindCycleOptions {
  /** Steps of the critical orbit before looking for its period (default 200 000; parabolic orbits converge like 1/n). */
  readonly transient?: number;
  /** Largest period looked for (default 1024). */
  readonly maxPeriod?: number;
  /** A known parabolic case (from --cardioid-angle): the cycle's period is 1 and its point is given exactly. */
  readonly parabolic?: { readonly wRe: number; readonly wIm: number; readonly s: number; readonly q: number };
  /** A known Siegel case (from --cardioid-angle golden): alpha and the name of its rotation number. */
  readonly siegel?: { readonly wRe: number; readonly wIm: number; readonly name: string };
}

/** |multiplier| within this of 1 counts as indifferent: the double-root Newton of a parabolic cycle only reaches about sqrt(ulp). */
export const INDIFFERENT_TOLERANCE = 1e-6;
/** Largest denominator q tried when naming the rotation of an indifferent multiplier. */
export const MAX_ROTATION_DENOMINATOR = 128;
/** Smallest trap radius tried before an attracting cycle is declared too weak to trap at this precision. */
const MIN_TRAP_RADIUS = 1e-9;
/** Points on the trap circle where the contraction is checked. */
const TRAP_SAMPLES = 128;
const ESCAPE2 = 1e8;

function none(note: string): JuliaCycle {
  return {
    kind: 'none',
    period: 0,
    basinPeriod: 0,
    pointsRe: [],
    pointsIm: [],
    multiplierRe: 0,
    multiplierIm: 0,
    trapRadius: 0,
    trapContraction: 0,
    rotation: null,
    petals: null,
    note,
  };
}

/** f^p(w) and its derivative, written into out = [re, im, dRe, dIm]. */
function iterate(cr: number, ci: number, wr: number, wi: number, p: number, out: Float64Array): Float64Array {
  let zr = wr,
    zi = wi,
    dr = 1,
    di = 0;
  for (let j = 0; j < p; j++) {
    const t = 2 * (zr * dr - zi * di);
    di = 2 * (zr * di + zi * dr);
    dr = t;
    const u = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = u;
  }
  out[0] = zr;
  out[1] = zi;
  out[2] = dr;
  out[3] = di;
  return out;
}

/**
 * Newton on f^p(w) = w from a guess (docs/methods.md A5), keeping the iterate with
 * the smallest residual: near a parabolic cycle the root is multiple and
 * Newton converges only linearly, down to about the square root of the
 * rounding error, so no step tolerance is demanded.
 */
export function newtonCycle(cr: number, ci: number, p: number, guessRe: number, guessIm: number): { wRe: number; wIm: number; residual: number; mulRe: number; mulIm: number } {
  const f = new Float64Array(4);
  let wr = guessRe,
    wi = guessIm;
  let best = { wRe: wr, wIm: wi, residual: Infinity, mulRe: 0, mulIm: 0 };
  for (let step = 0; step < 200; step++) {
    iterate(cr, ci, wr, wi, p, f);
    const er = f[0]! - wr,
      ei = f[1]! - wi;
    const residual = Math.hypot(er, ei);
    if (!Number.isFinite(residual)) break;
    if (residual < best.residual) best = { wRe: wr, wIm: wi, residual, mulRe: f[2]!, mulIm: f[3]! };
    if (residual === 0) break;
    const gr = f[2]! - 1,
      gi = f[3]!;
    const den = gr * gr + gi * gi;
    if (!(den > 0)) break;
    const sr = (er * gr + ei * gi) / den;
    const si = (ei * gr - er * gi) / den;
    wr -= sr;
    wi -= si;
    if (Math.hypot(sr, si) < 1e-17 * (1 + Math.hypot(wr, wi))) break;
  }
  return best;
}

/** The rational s/q (q <= maxQ, smallest q) within tol of t in [0, 1), or null. */
export function nearestRational(t: number, tol: number, maxQ: number): { s: number; q: number } | null {
  for (let q = 1; q <= maxQ; q++) {
    const s = Math.round(t * q);
    if (Math.abs(t - s / q) <= tol) return { s: s % q, q };
  }
  return null;
}

function cyclePoints(cr: number, ci: number, wr: number, wi: number, p: number): { re: number[]; im: number[] } {
  const re: number[] = [];
  const im: number[] = [];
  let zr = wr,
    zi = wi;
  for (let j = 0; j < p; j++) {
    re.push(zr);
    im.push(zi);
    const u = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = u;
  }
  return { re, im };
}

/**
 * Rotates the cycle so that w_0 is the point with f^{m p}(0) -> w_0: the
 * critical orbit z_n is near w_i for large n, so 0 is in class (i - n) mod p.
 */
function alignToCritical(re: number[], im: number[], zr: number, zi: number, n: number): void {
  const p = re.length;
  let best = 0;
  let bestD = Infinity;
  for (let i = 0; i < p; i++) {
    const d = Math.hypot(zr - re[i]!, zi - im[i]!);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  const shift = (((best - n) % p) + p) % p;
  const r = re.slice(),
    m = im.slice();
  for (let j = 0; j < p; j++) {
    re[j] = r[(j + shift) % p]!;
    im[j] = m[(j + shift) % p]!;
  }
}

/**
 * The radius r of a disk about w_0 that f^p maps into itself: the largest
 * r = r0 / 2^k with max |g(u)| / |u| < (1 + |lambda|) / 2 on TRAP_SAMPLES
 * points of |u| = r, g(u) = f^p(w_0 + u) - w_0. Since g(0) = 0, g(u)/u is
 * holomorphic on the disk, so by the maximum modulus principle the bound on
 * the circle holds inside: the disk is mapped into a smaller concentric
 * disk and every orbit entering it converges to w_0 (sampling the circle is
 * the one numerical step; 128 points resolve g at these radii).
 */
function trapDisk(cr: number, ci: number, wr: number, wi: number, p: number, lambda: number, r0: number): { radius: number; contraction: number } {
  const limit = (1 + lambda) / 2;
  const f = new Float64Array(4);
  for (let r = r0; r >= MIN_TRAP_RADIUS; r /= 2) {
    let worst = 0;
    for (let s = 0; s < TRAP_SAMPLES && worst < limit; s++) {
      const a = (2 * Math.PI * (s + 0.5)) / TRAP_SAMPLES;
      const ur = r * Math.cos(a),
        ui = r * Math.sin(a);
      iterate(cr, ci, wr + ur, wi + ui, p, f);
      worst = Math.max(worst, Math.hypot(f[0]! - wr, f[1]! - wi) / r);
    }
    if (worst < limit) return { radius: r, contraction: worst };
  }
  return { radius: 0, contraction: 1 };
}

/** Finds the cycle the critical orbit of z^2 + c settles on (see JuliaCycle). Pure; a function of c and the options only. */
export function findJuliaCycle(cr: number, ci: number, options: FindCycleOptions = {}): JuliaCycle {
  const maxPeriod = options.maxPeriod ?? 1024;
  if (options.parabolic !== undefined) {
    const { wRe, wIm, s, q } = options.parabolic;
    const petals = parabolicPetals(cr, ci, [wRe], [wIm], q, s);
    const mRe = 2 * wRe,
      mIm = 2 * wIm;
    return {
      kind: 'parabolic',
      period: 1,
      basinPeriod: q,
      pointsRe: [wRe],
      pointsIm: [wIm],
      multiplierRe: mRe,
      multiplierIm: mIm,
      trapRadius: 0,
      trapContraction: 0,
      rotation: { s, q },
      petals,
      note: `parabolic fixed point alpha with multiplier e^(2 pi i ${s}/${q}) (given by the cardioid angle)`,
    };
  }
  if (options.siegel !== undefined) {
    const { wRe, wIm, name } = options.siegel;
    return {
      kind: 'siegel',
      period: 1,
      basinPeriod: 1,
      pointsRe: [wRe],
      pointsIm: [wIm],
      multiplierRe: 2 * wRe,
      multiplierIm: 2 * wIm,
      trapRadius: 0,
      trapContraction: 0,
      rotation: null,
      petals: null,
      note: `Siegel disk about alpha: multiplier e^(2 pi i theta), theta the ${name} (a Brjuno number), rendered by its orbits' recurrence`,
    };
  }
  const transient = options.transient ?? 200_000;
  let zr = 0,
    zi = 0;
  let n = 0;
  for (; n < transient; n++) {
    const u = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = u;
    if (!(zr * zr + zi * zi <= ESCAPE2)) return none(`the critical orbit escapes after ${n + 1} steps: c lies outside the set and the Julia set is a Cantor set (no interior)`);
  }
  // The smallest p with |z_{n+p} - z_n| far below the nearer returns is the candidate period.
  const orbitRe = new Float64Array(maxPeriod + 1);
  const orbitIm = new Float64Array(maxPeriod + 1);
  orbitRe[0] = zr;
  orbitIm[0] = zi;
  for (let j = 1; j <= maxPeriod; j++) {
    const a = orbitRe[j - 1]!,
      b = orbitIm[j - 1]!;
    orbitRe[j] = a * a - b * b + cr;
    orbitIm[j] = 2 * a * b + ci;
  }
  let candidate = 0;
  const scale = 1 + Math.hypot(zr, zi);
  let nearest = scale;
  for (let p = 1; p <= maxPeriod; p++) {
    const d = Math.hypot(orbitRe[p]! - zr, orbitIm[p]! - zi);
    if (d <= 1e-12 * scale || d < 1e-3 * nearest) {
      candidate = p;
      break;
    }
    nearest = Math.min(nearest, d);
  }
  if (candidate === 0) return none(`no cycle of period <= ${maxPeriod} found on the critical orbit after ${transient} steps`);
  // A proper divisor d of the candidate is the cycle's period only for a parabolic cycle, whose petals
  // return with period d q: then Newton on f^d closes near z_n with multiplier^(candidate/d) = 1.
  let period = 0;
  let fit = { wRe: zr, wIm: zi, residual: Infinity, mulRe: 0, mulIm: 0 };
  for (let d = 1; d < candidate && period === 0; d++) {
    if (candidate % d !== 0) continue;
    const r = newtonCycle(cr, ci, d, zr, zi);
    if (!(r.residual <= 1e-7 * scale)) continue;
    const lam = Math.hypot(r.mulRe, r.mulIm);
    const turns = (candidate / d) * (Math.atan2(r.mulIm, r.mulRe) / (2 * Math.PI));
    if (Math.abs(lam - 1) <= 1e-4 && Math.abs(turns - Math.round(turns)) <= 1e-4) {
      period = d;
      fit = r;
    }
  }
  if (period === 0) {
    const r = newtonCycle(cr, ci, candidate, zr, zi);
    if (r.residual <= 1e-7 * scale && Math.hypot(r.wRe - zr, r.wIm - zi) < 1e-2 * scale) {
      period = candidate;
      fit = r;
    }
  }
  if (period === 0) return none(`the critical orbit nearly returns with period ${candidate}, but Newton finds no cycle there`);
  const lambda = Math.hypot(fit.mulRe, fit.mulIm);
  const pts = cyclePoints(cr, ci, fit.wRe, fit.wIm, period);
  alignToCritical(pts.re, pts.im, zr, zi, n);
  const w0r = pts.re[0]!,
    w0i = pts.im[0]!;
  const shown = `|multiplier| = ${lambda.toPrecision(6)}`;
  if (lambda > 1 + INDIFFERENT_TOLERANCE) {
    return {
      ...none(`the critical orbit lands on a repelling cycle of period ${period} (${shown}): c is a Misiurewicz parameter, the Julia set a dendrite with no interior`),
      period,
      pointsRe: pts.re,
      pointsIm: pts.im,
      multiplierRe: fit.mulRe,
      multiplierIm: fit.mulIm,
    };
  }
  if (lambda >= 1 - INDIFFERENT_TOLERANCE) {
    let t = Math.atan2(fit.mulIm, fit.mulRe) / (2 * Math.PI);
    if (t < 0) t += 1;
    const rot = nearestRational(t, 1e-6, MAX_ROTATION_DENOMINATOR);
    if (rot === null) {
      return {
        ...none(`indifferent cycle of period ${period} (${shown}) with no rotation s/q, q <= ${MAX_ROTATION_DENOMINATOR}: Siegel or Cremer, not rendered as interior`),
        period,
        pointsRe: pts.re,
        pointsIm: pts.im,
        multiplierRe: fit.mulRe,
        multiplierIm: fit.mulIm,
      };
    }
    const petals = parabolicPetals(cr, ci, pts.re, pts.im, rot.q, rot.s);
    return {
      kind: 'parabolic',
      period,
      basinPeriod: period * rot.q,
      pointsRe: pts.re,
      pointsIm: pts.im,
      multiplierRe: fit.mulRe,
      multiplierIm: fit.mulIm,
      trapRadius: 0,
      trapContraction: 0,
      rotation: rot,
      petals,
      note: `parabolic: a cycle of period ${period} with multiplier within ${INDIFFERENT_TOLERANCE} of e^(2 pi i ${rot.s}/${rot.q}) (${shown})`,
    };
  }
  let gap = 1;
  for (let j = 1; j < period; j++) gap = Math.min(gap, Math.hypot(pts.re[j]! - w0r, pts.im[j]! - w0i));
  const trap = trapDisk(cr, ci, w0r, w0i, period, lambda, Math.min(0.5, gap / 2));
  if (trap.radius === 0) {
    return {
      ...none(`attracting cycle of period ${period} (${shown}) too weak to trap in double precision`),
      period,
      pointsRe: pts.re,
      pointsIm: pts.im,
      multiplierRe: fit.mulRe,
      multiplierIm: fit.mulIm,
    };
  }
  return {
    kind: 'attracting',
    period,
    basinPeriod: period,
    pointsRe: pts.re,
    pointsIm: pts.im,
    multiplierRe: fit.mulRe,
    multiplierIm: fit.mulIm,
    trapRadius: trap.radius,
    trapContraction: trap.contraction,
    rotation: null,
    petals: null,
    note: `attracting cycle of period ${period} (${shown}), confirmed by Newton`,
  };
}
