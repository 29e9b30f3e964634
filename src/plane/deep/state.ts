/**
 * The deep kernel's per-pixel state and what every part of it shares: the
 * settings and counters, the state layout (one Float64Array per pixel, so
 * helpers share it without objects), the reference access, and the
 * rescaling helpers (docs/methods.md B6b). See sample-deep.ts for the method.
 */
import type { ReferenceOrbit } from '../../precise/reference-orbit.js';
import { exponentOf, ldexp } from '../../precise/floatexp.js';

/** Settings of {@link sampleDeep}; validated by the caller. */
export interface DeepSettings {
  /** Iteration limit N (>= 1). */
  readonly maxIterations: number;
  /** Escape radius R (large, e.g. 2^10), as for the shallow kernel. */
  readonly escapeRadius: number;
  /**
   * U: offsets are c - C = (dcRe[k] + i dcIm[k]) 2^U, and distances are
   * written in units of 2^U. Use 0 while spans are above ~1e-290 (then
   * distances are in c units as in the shallow kernel); below, pick U near
   * log2 of the span.
   */
  readonly unitExponent: number;
  /** Look for attracting cycles (default true). */
  readonly interior?: boolean;
  /** Newton attempts allowed per pixel (default 8). */
  readonly newtonBudget?: number;
}

/** Counters the kernel adds to (the caller owns and may sum them over tiles). */
export interface DeepStats {
  /** Iterations done one step at a time (perturbation or rescaled). */
  stepped: number;
  /** Iterations covered by bilinear-approximation skips. */
  skipped: number;
  /** Number of skips applied. */
  skips: number;
  /** Rebases (B3). */
  rebases: number;
  /** Iterations spent inside Newton's method and period reduction. */
  newtonIterations: number;
}

/** Zeroed counters. */
export function createDeepStats(): DeepStats {
  return { stepped: 0, skipped: 0, skips: 0, rebases: 0, newtonIterations: 0 };
}

// Pixel state layout (a Float64Array, so helpers share it without objects).
export const N = 0,
  M_ = 1,
  K = 2,
  WR = 3,
  WI = 4,
  GR = 5,
  GI = 6,
  PR = 7,
  PI = 8,
  PE = 9;
export const FR = 10,
  FI = 11,
  FK = 12,
  MINN = 13,
  MINK = 14,
  DLR = 15,
  DLI = 16;
export const STATE = 17;

export const EV_STOP = 0;
export const EV_ESCAPED = 1;
export const EV_NEWMIN = 2;

/** Enter rescaled mode when |z| (1-norm) falls below this. */
export const SCALED_BELOW = 2 ** -500;
/** Leave rescaled mode when 2^k |w| reaches this. */
export const PLAIN_FROM_EXP = -480;
/**
 * A new atom-domain minimum must at least halve |Z + z|^2. Near-ties (an
 * orbit shadowing a reference whose |Z_m| repeat, as near a Misiurewicz
 * point) would otherwise raise an event every few steps and cap every skip;
 * a genuine period candidate drops by orders of magnitude.
 */
export const MIN_DROP = 0.5;
export const W_HIGH = 2 ** 64;
export const W_LOW = 2 ** -64;
export const P_HIGH = 2 ** 256;
export const P_LOW = 2 ** -256;

/** Reference access the loop needs, precomputed once per call. */
export interface Orbit {
  readonly re: Float64Array;
  readonly im: Float64Array;
  readonly M: number;
  /** slot into tiny* for m, or -1 */
  readonly tinySlot: Int32Array | null;
  readonly tinyRe: Float64Array;
  readonly tinyIm: Float64Array;
  readonly tinyExp: Int32Array;
}

export function makeOrbit(ref: ReferenceOrbit): Orbit {
  let tinySlot: Int32Array | null = null;
  if (ref.tinyIndex.length > 0) {
    tinySlot = new Int32Array(ref.length + 1).fill(-1);
    for (let s = 0; s < ref.tinyIndex.length; s++) tinySlot[ref.tinyIndex[s]!] = s;
  }
  return { re: ref.re, im: ref.im, M: ref.length, tinySlot, tinyRe: ref.tinyRe, tinyIm: ref.tinyIm, tinyExp: ref.tinyExp };
}

/** a < b for nonnegative values a 4^ka, b 4^kb. */
export function lessNorm(a: number, ka: number, b: number, kb: number): boolean {
  if (ka === kb) return a < b;
  return Math.log2(a) + 2 * ka < Math.log2(b) + 2 * kb;
}

/**
 * Puts the pixel into rescaled or plain mode for its current z (full value
 * 2^k w) and refreshes nothing else; the loop recomputes its scale factors
 * from st[K] on entry.
 */
export function normalise(st: Float64Array): void {
  const k = st[K]!;
  const wr = st[WR]!,
    wi = st[WI]!;
  const aw = Math.abs(wr) + Math.abs(wi);
  if (aw === 0) return;
  const e = exponentOf(aw);
  if (k + e > PLAIN_FROM_EXP) {
    if (k !== 0) {
      st[WR] = ldexp(wr, k);
      st[WI] = ldexp(wi, k);
      st[GR] = ldexp(st[GR]!, k);
      st[GI] = ldexp(st[GI]!, k);
      st[K] = 0;
    }
    return;
  }
  st[WR] = ldexp(wr, -e);
  st[WI] = ldexp(wi, -e);
  st[GR] = ldexp(st[GR]!, -e);
  st[GI] = ldexp(st[GI]!, -e);
  st[K] = k + e;
}

/** Sets the state to z = (zr + i zi) 2^zk at reference iteration 0, n = 0. */
export function startState(st: Float64Array, zr: number, zi: number, zk: number, dlr: number, dli: number, unitExponent: number): void {
  st.fill(0);
  st[DLR] = dlr;
  st[DLI] = dli;
  st[PR] = 1;
  st[MINN] = Infinity;
  st[WR] = zr;
  st[WI] = zi;
  st[K] = zk;
  st[FR] = zr;
  st[FI] = zi;
  st[FK] = zk;
  if (zr === 0 && zi === 0) {
    // z_0 = 0: scale by the offset so that z_1 = c is O(1) in rescaled units
    const ad = Math.abs(dlr) + Math.abs(dli);
    const e = ad === 0 ? 0 : exponentOf(ad);
    st[K] = unitExponent + e <= PLAIN_FROM_EXP ? unitExponent + e : 0;
    st[FK] = 0;
    return;
  }
  normalise(st);
  if (st[K] === 0) {
    // plain mode reads the full value in c units
    st[FR] = st[WR]!;
    st[FI] = st[WI]!;
    st[FK] = 0;
  }
}

/** out = a - b for values (r, i) 2^k, as (r, i, k). */
export function diffScaled(ar: number, ai: number, ak: number, br: number, bi: number, bk: number, out: Float64Array): void {
  const k = Math.max(ak, bk);
  out[0] = ldexp(ar, ak - k) - ldexp(br, bk - k);
  out[1] = ldexp(ai, ak - k) - ldexp(bi, bk - k);
  out[2] = k;
}

/**
 * Scratch space of one sampleDeep call, allocated once and reused by every
 * pixel (no allocation inside per-pixel calls): a second pixel state for
 * Newton and period checks, a scaled difference, and the four derivatives
 * of the full-range interior distance with two temporaries, each (re, im, exp).
 */
export interface DeepWork {
  readonly state: Float64Array;
  readonly gap: Float64Array;
  readonly dz: Float64Array;
  readonly dzz: Float64Array;
  readonly dc: Float64Array;
  readonly dcz: Float64Array;
  readonly t: Float64Array;
  readonly t2: Float64Array;
}

export function createDeepWork(): DeepWork {
  const three = (): Float64Array => new Float64Array(3);
  return { state: new Float64Array(STATE), gap: three(), dz: three(), dzz: three(), dc: three(), dcz: three(), t: three(), t2: three() };
}
