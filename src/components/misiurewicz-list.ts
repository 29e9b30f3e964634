/**
 * Every Misiurewicz point of exact preperiod K and period P (docs/methods.md
 * D7), with the external angles that land on each.
 *
 * Points: all roots of the Hutz-Towsley polynomial H by Aberth-Ehrlich in
 * doubles (misiurewicz-points.ts), each refined by Newton in fixed point,
 * checked to have orbit type exactly (K, P), and kept once (distinct at the
 * working precision). The count is what survives these checks; it is set
 * beside the published count, not taken from it.
 *
 * Angles: every angle of preperiod exactly K and period q P (q = 1, 2, ...
 * while the rays number at most ANGLE_BUDGET) has its ray traced in (docs/methods.md
 * D4); Newton in doubles on z_{K+1+qP} - z_{K+1} from the ray's end lands
 * it, and it joins the listed point within LANDING_TOLERANCE. Tried first:
 * Newton on H itself from the ray's end, which also converges when the ray
 * lands on a point of a lower period, to a wrong (K, P) neighbour.
 */
import { angleText } from './external-angle.js';
import type { Angle } from './external-angle.js';
import { aberthMisiurewicz, misiurewiczCount, refineMisiurewicz } from './misiurewicz-points.js';
import type { MisiurewiczPoint } from './misiurewicz-points.js';
import { periodicNumerators } from './periodic-angles.js';
import { traceRayDD, traceRayDouble } from './trace-ray.js';
import { toNumber } from '../precise/fixed.js';

/** Rays traced per listing at most (all angles of the first periods q P that fit). */
export const ANGLE_BUDGET = 1 << 14;

/** A ray's landing joins a listed point this close (in doubles, relative to |c| + 1). */
const LANDING_TOLERANCE = 1e-9;

export interface ListedMisiurewicz extends MisiurewiczPoint {
  /** the landing angles found, ascending */
  angles: Angle[];
  re: number;
  im: number;
}

export interface MisiurewiczListing {
  preperiod: number;
  period: number;
  points: ListedMisiurewicz[];
  /** Hutz-Towsley Corollary 3.3 in our convention */
  expected: number;
  /** Aberth sweeps and whether every root settled */
  sweeps: number;
  converged: boolean;
  /** roots that failed the refinement or the type check, or repeated a point */
  rejected: number;
  /** the angle periods searched (multiples of P) and the rays traced */
  anglePeriods: number[];
  raysTraced: number;
}

/** The angles of preperiod exactly K and exact period p, ascending: (u + j m) / (2^K m), m = 2^p - 1, j of the parity that leaves u's cycle. */
export function preperiodicAngles(preperiod: number, period: number): Angle[] {
  const m = 2 ** period - 1;
  const out: Angle[] = [];
  const scale = BigInt(2 ** preperiod) * BigInt(m);
  for (const u of periodicNumerators(period, false)) {
    // the periodic preimage of u/m is v/m with v = u/2 (u even) or (u+m)/2 (u odd); the other one leaves the cycle
    const parity = u % 2 === 0 ? 1 : 0;
    for (let j = parity; j < 2 ** preperiod; j += 2) {
      const num = BigInt(u) + BigInt(j) * BigInt(m);
      out.push(reduce(num, scale));
    }
  }
  return out.sort((a, b) => (a.num * b.den < b.num * a.den ? -1 : 1));
}

function reduce(num: bigint, den: bigint): Angle {
  let a = num,
    b = den;
  while (b !== 0n) [a, b] = [b, a % b];
  return { num: num / a, den: den / a };
}

/** Newton in doubles on z_{k+1+p} - z_{k+1} (k = preperiod) from (cr, ci); null when it does not settle. */
function landDouble(preperiod: number, period: number, cr: number, ci: number): [number, number] | null {
  let xr = cr,
    xi = ci;
  const m = preperiod + 1;
  for (let it = 0; it < 60; it += 1) {
    let zr = 0,
      zi = 0,
      dr = 0,
      di = 0,
      ar = 0,
      ai = 0,
      br = 0,
      bi = 0;
    for (let n = 1; n <= m + period; n += 1) {
      const ndr = 2 * (zr * dr - zi * di) + 1;
      di = 2 * (zr * di + zi * dr);
      dr = ndr;
      const nzr = zr * zr - zi * zi + xr;
      zi = 2 * zr * zi + xi;
      zr = nzr;
      if (n === m) [ar, ai, br, bi] = [zr, zi, dr, di];
    }
    const gr = zr - ar,
      gi = zi - ai,
      hr = dr - br,
      hi = di - bi;
    const q = hr * hr + hi * hi;
    const sr = (gr * hr + gi * hi) / q;
    const si = (gi * hr - gr * hi) / q;
    if (!Number.isFinite(sr) || !Number.isFinite(si)) return null;
    xr -= sr;
    xi -= si;
    if (Math.hypot(sr, si) < 1e-15 * (1 + Math.hypot(xr, xi))) return [xr, xi];
  }
  return null;
}

/** Lists the (K, P) points to `digits` digits; progress on each stage through `onProgress`. */
export function listMisiurewicz(
  preperiod: number,
  period: number,
  digits: number,
  onProgress?: (stage: string, done: number, total: number) => void,
  withAngles = true,
): MisiurewiczListing {
  const expected = misiurewiczCount(preperiod, period);
  const aberth = aberthMisiurewicz(preperiod, period, onProgress === undefined ? undefined : (d, t) => onProgress('roots', d, t));
  const points: ListedMisiurewicz[] = [];
  let rejected = 0;
  for (let i = 0; i < expected; i += 1) {
    let p: MisiurewiczPoint;
    try {
      p = refineMisiurewicz(preperiod, period, { re: aberth.roots[2 * i]!, im: aberth.roots[2 * i + 1]! }, digits);
    } catch {
      rejected += 1;
      continue;
    }
    const re = toNumber(p.fixed.re, p.scale);
    const im = toNumber(p.fixed.im, p.scale);
    // distinct: two refinements of one point agree to half the working bits (every point is refined at the same scale)
    const half = p.scale.one >> BigInt(p.scale.bits >> 1);
    const near = (x: bigint, y: bigint): boolean => (x > y ? x - y : y - x) <= half;
    if (points.some((q) => near(q.fixed.re, p.fixed.re) && near(q.fixed.im, p.fixed.im))) {
      rejected += 1;
      continue;
    }
    points.push({ ...p, re, im, angles: [] });
    onProgress?.('refine', i + 1, expected);
  }
  const { anglePeriods, raysTraced } = withAngles ? attachAngles(preperiod, period, points, onProgress) : { anglePeriods: [], raysTraced: 0 };
  for (const p of points) p.angles.sort((a, b) => (a.num * b.den < b.num * a.den ? -1 : 1));
  // rows by their lowest angle (counter-clockwise from the cusp), points without a found angle last, by re then im
  points.sort((a, b) => {
    const x = a.angles[0];
    const y = b.angles[0];
    if (x !== undefined && y !== undefined) return x.num * y.den < y.num * x.den ? -1 : 1;
    if (x !== undefined) return -1;
    if (y !== undefined) return 1;
    return a.re - b.re || a.im - b.im;
  });
  return { preperiod, period, points, expected, sweeps: aberth.sweeps, converged: aberth.converged, rejected, anglePeriods, raysTraced };
}

/**
 * Finds the landing angles of `points` (all of type (K, P)): every angle of
 * preperiod K and period q P for q = 1, 2, ... while the rays number at most
 * ANGLE_BUDGET and q P <= 48; each joins the point its ray lands on.
 */
export function attachAngles(
  preperiod: number,
  period: number,
  points: { re: number; im: number; angles: Angle[] }[],
  onProgress?: (stage: string, done: number, total: number) => void,
): { anglePeriods: number[]; raysTraced: number } {
  const anglePeriods: number[] = [];
  let raysTraced = 0;
  for (let q = 1; ; q += 1) {
    const p = q * period;
    const rays = 2 ** (preperiod - 1) * (2 ** p - 1);
    if (raysTraced + rays > ANGLE_BUDGET || p > 48 || preperiod > 40) break;
    anglePeriods.push(p);
    const angles = preperiodicAngles(preperiod, p);
    for (const a of angles) {
      const depth = 2 * (preperiod + p) + 8;
      const end = a.den < 2n ** 52n ? traceRayDouble(Number(a.num), Number(a.den), depth, 8) : traceRayDD(a.num, a.den, depth, 8);
      raysTraced += 1;
      if (!end.ok) continue;
      const land = landDouble(preperiod, p, end.reHi + end.reLo, end.imHi + end.imLo);
      if (land === null) continue;
      let best = -1;
      let bestDist = Infinity;
      for (let k = 0; k < points.length; k += 1) {
        const d = Math.hypot(points[k]!.re - land[0], points[k]!.im - land[1]);
        if (d < bestDist) [best, bestDist] = [k, d];
      }
      if (best >= 0 && bestDist <= LANDING_TOLERANCE * (1 + Math.hypot(land[0], land[1]))) points[best]!.angles.push(a);
    }
    onProgress?.('angles', raysTraced, raysTraced);
  }
  for (const p of points) p.angles.sort((a, b) => (a.num * b.den < b.num * a.den ? -1 : 1));
  return { anglePeriods, raysTraced };
}

/** Angles as text. */
export function angleTexts(angles: readonly Angle[]): string[] {
  return angles.map(angleText);
}
