/**
 * The deep kernel: per-pixel perturbation around a reference orbit, with
 * rebasing, bilinear-approximation skips, rescaled iterations for tiny
 * deltas, exterior distance, and interior period detection confirmed by
 * the multiplier. Fills the same SampleSet as the shallow kernel, with the
 * same meanings, so deep plates colour like shallow ones.
 *
 * Methods (docs/methods.md):
 * - B1 perturbation, z_{n+1} = 2 Z_m z_n + z_n^2 + c (math.stackexchange
 *   q/939270; mathr.co.uk/web/deep-zoom.html section 2).
 * - B3 rebasing (Zhuoran, fractalforums.org t/4360; mathr deep-zoom 2.1):
 *   after a step, if |Z_m + z| < |z| or m = M, set z <- Z_m + z, m <- 0.
 *   No glitch detection and no second reference are needed.
 * - B5 bilinear approximation, see bla-table.ts.
 * - B6b rescaled iterations (fractalwiki.org/wiki/Rescaled_iterations): while
 *   |z| < 2^-500, z = 2^k w with w a double near 1, c = 2^k d, and the step
 *   is w <- 2 Z w + 2^k w^2 + d. Chosen over floatexp (B6a) for the hot loop
 *   because it stays in plain doubles and needs no renormalisation per
 *   operation; it only renormalises when w leaves [2^-64, 2^64]. The only
 *   full-range values are the rare reference iterates below 2^-500, which
 *   the reference orbit keeps as floatexp.
 * - B8 derivative for distance estimation: G_{n+1} = 2 (Z_m + z_n) G_n + u,
 *   with G = u dz/dc, the derivative with respect to the offset in tile
 *   units u = 2^unitExponent; rebasing leaves it unchanged, a skip applies
 *   G <- A G + B.
 * - A1 smooth count and A2 exterior distance b = 2|z| ln|z| / |dz/dc| from
 *   the full escaped value, exactly as the shallow kernel (smooth-count.ts,
 *   exterior-distance.ts); b is written in tile units (c units when
 *   unitExponent = 0).
 * - A4/A5 interior: candidate periods from atom domains (the iteration n at
 *   which |Z_m + z_n|^2 at least halves), checked at doubling intervals
 *   (arm at n_min + 2^t p, test one period later: the product of 2 (Z + z)
 *   over that period must be below 1), and confirmed by Newton on
 *   F^p(w) = w (itself run by perturbation, with skips) with
 *   |multiplier| < 1 (mathr "Practical interior distance rendering";
 *   "Interior coordinates"). Brent's saved-value test on full values was
 *   dropped: at depth the full values of neighbouring pixels agree to far
 *   more digits than a double holds, so its tolerance cannot be tied to the
 *   pixel spacing; the atom-domain candidate needs no tolerance.
 * - A6 interior distance along one period by perturbation (in tile units);
 *   below U = -900 with the derivatives carried as (re, im, exponent).
 *
 * How a plate uses it (all inputs are plain data; a worker receives them by
 * postMessage / structured clone, or once as SharedArrayBuffer copies):
 * 1. once per plate, on the main thread: bits = referenceBits(span, pixels);
 *    orbit = computeReferenceOrbit(reference, bits, maxIterations, { escapeRadius,
 *    period? }) (a nucleus in view gives a periodic reference, else the view
 *    centre); choose U (0 while the span is above ~1e-290, else about
 *    floor(log2(span)) - 10); geometry: origin = referenceOffset(orbit,
 *    pixel (0, 0) centre, U), steps = pixel spacing / 2^U (deep-offsets.ts);
 *    deltaMax = the plate's largest |offset| component (corners);
 *    table = buildBlaTable(orbit, U, deltaMax) (or null to switch skipping off).
 *    Share with shareReferenceOrbit / shareBlaTable.
 * 2. per tile, in a worker: fillDeepOffsets(geometry, x0, y0, w, h, dcRe, dcIm);
 *    sampleDeep(orbit, table, dcRe, dcIm, w * h, settings, out, stats).
 * Because orbit, table, U and geometry are per plate and each pixel's result
 * depends only on them and its own offset, output bytes do not depend on
 * tiling or worker count (tested).
 *
 * Data shapes: ReferenceOrbit = { centreRe, centreIm: string; bits, length,
 * escapeRadius, period: number; escaped: boolean; re, im: Float64Array(M+1);
 * tinyIndex: Int32Array, tinyRe, tinyIm: Float64Array, tinyExp: Int32Array }.
 * BlaTable = { levels, epsilon: number; offsets, counts, bExp, skip, minAt:
 * Int32Array; aRe, aIm, bRe, bIm, logRadius, minNorm: Float64Array } (about
 * 2M entries, 80 bytes each, for an orbit of length M). DeepSettings below.
 */
import type { ReferenceOrbit } from '../precise/reference-orbit.js';
import type { BlaTable } from './bla-table.js';
import type { SampleSet } from './sample-set.js';
import { PERIOD_ESCAPED, PERIOD_UNDECIDED } from './sample-set.js';
import { smoothCount } from './smooth-count.js';
import { exponentOf, ldexp } from '../precise/floatexp.js';

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
const N = 0, M_ = 1, K = 2, WR = 3, WI = 4, GR = 5, GI = 6, PR = 7, PI = 8, PE = 9;
const FR = 10, FI = 11, FK = 12, MINN = 13, MINK = 14, DLR = 15, DLI = 16;
const STATE = 17;

const EV_STOP = 0;
const EV_ESCAPED = 1;
const EV_NEWMIN = 2;

/** Enter rescaled mode when |z| (1-norm) falls below this. */
const SCALED_BELOW = 2 ** -500;
/** Leave rescaled mode when 2^k |w| reaches this. */
const PLAIN_FROM_EXP = -480;
/**
 * A new atom-domain minimum must at least halve |Z + z|^2. Near-ties (an
 * orbit shadowing a reference whose |Z_m| repeat, as near a Misiurewicz
 * point) would otherwise raise an event every few steps and cap every skip;
 * a genuine period candidate drops by orders of magnitude.
 */
const MIN_DROP = 0.5;
const W_HIGH = 2 ** 64;
const W_LOW = 2 ** -64;
const P_HIGH = 2 ** 256;
const P_LOW = 2 ** -256;

/** Reference access the loop needs, precomputed once per call. */
interface Orbit {
  readonly re: Float64Array;
  readonly im: Float64Array;
  readonly M: number;
  /** slot into tiny* for m, or -1 */
  readonly tinySlot: Int32Array | null;
  readonly tinyRe: Float64Array;
  readonly tinyIm: Float64Array;
  readonly tinyExp: Int32Array;
}

function makeOrbit(ref: ReferenceOrbit): Orbit {
  let tinySlot: Int32Array | null = null;
  if (ref.tinyIndex.length > 0) {
    tinySlot = new Int32Array(ref.length + 1).fill(-1);
    for (let s = 0; s < ref.tinyIndex.length; s++) tinySlot[ref.tinyIndex[s]!] = s;
  }
  return { re: ref.re, im: ref.im, M: ref.length, tinySlot, tinyRe: ref.tinyRe, tinyIm: ref.tinyIm, tinyExp: ref.tinyExp };
}

/** a < b for nonnegative values a 4^ka, b 4^kb. */
function lessNorm(a: number, ka: number, b: number, kb: number): boolean {
  if (ka === kb) return a < b;
  return Math.log2(a) + 2 * ka < Math.log2(b) + 2 * kb;
}

/**
 * Puts the pixel into rescaled or plain mode for its current z (full value
 * 2^k w) and refreshes nothing else; the loop recomputes its scale factors
 * from st[K] on entry.
 */
function normalise(st: Float64Array): void {
  const k = st[K]!;
  const wr = st[WR]!, wi = st[WI]!;
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

/**
 * Advances the pixel until n = stopAt, escape, or (when `track`) a new
 * atom-domain minimum. Returns EV_*. The running product of 2 (Z_m + z_n)
 * (D_z of the orbit since the last reset) is kept in st[PR, PI] * 2^st[PE].
 */
function run(
  o: Orbit,
  bla: BlaTable | null,
  st: Float64Array,
  stopAt: number,
  track: boolean,
  escapeRadius2: number,
  unitExponent: number,
  stats: DeepStats,
): number {
  const re = o.re, im = o.im, M = o.M;
  let n = st[N]! | 0, m = st[M_]! | 0, k = st[K]! | 0;
  let wr = st[WR]!, wi = st[WI]!, gr = st[GR]!, gi = st[GI]!;
  let pr = st[PR]!, pi = st[PI]!, pe = st[PE]!;
  let fr = st[FR]!, fi = st[FI]!, fk = st[FK]!;
  let minN = st[MINN]!, minK = st[MINK]!;
  const dlr = st[DLR]!, dli = st[DLI]!;
  // plain mode holds |z| >= 2^-500, next to which u and c below 2^-1000 are
  // negligible; flushing them avoids slow subnormal arithmetic
  const u = unitExponent < -1000 ? 0 : ldexp(1, unitExponent);
  const pdr = dlr * u, pdi = dli * u;
  // rescaled-mode constants, refreshed whenever k changes
  // (no closure here: captured locals would live on the heap and slow the loop)
  let s = 1, sdr = pdr, sdi = pdi, hs = u, lim = 0;
  if (k !== 0) {
    s = k < -1000 ? 0 : ldexp(1, k); sdr = ldexp(dlr, unitExponent - k); sdi = ldexp(dli, unitExponent - k); hs = ldexp(1, unitExponent - k); lim = ldexp(1, k + 66);
  }
  let event = EV_STOP;
  let stepped = 0;
  while (n < stopAt) {
    // ------------------------------------------------------------ bilinear skip (B5), both modes
    let skipped = false;
    if (bla !== null && m >= 1) {
      // plain mode compares squares (radius2 is 0 where R^2 underflows, and
      // such radii are below the plain-mode |z| >= 2^-500); rescaled mode
      // compares logarithms
      const w2 = wr * wr + wi * wi;
      const logZ = k === 0 ? 0 : 0.5 * Math.log2(w2) + k;
      const maxSkip = stopAt - n;
      const minLimit = track && minK === 0 ? MIN_DROP * minN : 0;
      const kk = m - 1;
      let j = kk === 0 ? bla.levels - 1 : Math.min(bla.levels - 1, 31 - Math.clz32(kk & -kk));
      for (; j >= 0; j--) {
        const i = kk >> j;
        if (i >= bla.counts[j]!) continue;
        const e = bla.offsets[j]! + i;
        const l = bla.skip[e]!;
        if ((k === 0 ? w2 < bla.radius2[e]! : logZ < bla.logRadius[e]!) && l <= maxSkip && bla.minNorm[e]! >= minLimit) {
          const ar = bla.aRe[e]!, ai = bla.aIm[e]!;
          // B c and B u in the units of w: B 2^(U - k)
          let cr: number, ci: number, ur: number, ui: number;
          if (k === 0) {
            ur = bla.bTileRe[e]!;
            ui = bla.bTileIm[e]!;
            cr = ur * dlr - ui * dli;
            ci = ur * dli + ui * dlr;
          } else {
            const br = bla.bRe[e]!, bi = bla.bIm[e]!;
            const fe = bla.bExp[e]! + unitExponent - k;
            cr = br * dlr - bi * dli;
            ci = br * dli + bi * dlr;
            ur = br;
            ui = bi;
            if (fe >= -1022 && fe <= 1023) {
              const f = 2 ** fe;
              cr *= f; ci *= f; ur *= f; ui *= f;
            } else {
              cr = ldexp(cr, fe); ci = ldexp(ci, fe); ur = ldexp(ur, fe); ui = ldexp(ui, fe);
            }
          }
          const nwr = ar * wr - ai * wi + cr;
          wi = ar * wi + ai * wr + ci;
          wr = nwr;
          const ngr = ar * gr - ai * gi + ur;
          gi = ar * gi + ai * gr + ui;
          gr = ngr;
          const npr = ar * pr - ai * pi;
          pi = ar * pi + ai * pr;
          pr = npr;
          n += l;
          m += l;
          stats.skipped += l;
          stats.skips += 1;
          skipped = true;
          break;
        }
      }
    }
    if (k === 0) {
      // ---------------------------------------------------------------- plain mode
      if (!skipped) {
        const zr = re[m]!, zi = im[m]!;
        // derivative before z (A2): G <- 2 (Z + z) G + u, with Z + z = f
        const ngr = 2 * (fr * gr - fi * gi) + u;
        gi = 2 * (fr * gi + fi * gr);
        gr = ngr;
        const npr = 2 * (fr * pr - fi * pi);
        pi = 2 * (fr * pi + fi * pr);
        pr = npr;
        const nwr = 2 * (zr * wr - zi * wi) + (wr * wr - wi * wi) + pdr;
        wi = 2 * (zr * wi + zi * wr) + 2 * wr * wi + pdi;
        wr = nwr;
        n += 1;
        m += 1;
        stepped += 1;
      }
      const ar = Math.abs(pr) + Math.abs(pi);
      if (ar > P_HIGH || (ar < P_LOW && ar !== 0)) {
        const e = exponentOf(ar);
        pr = ldexp(pr, -e);
        pi = ldexp(pi, -e);
        pe += e;
      }
      fr = re[m]! + wr;
      fi = im[m]! + wi;
      fk = 0;
      const nf = fr * fr + fi * fi;
      if (nf > escapeRadius2) {
        event = EV_ESCAPED;
        break;
      }
      const nz = wr * wr + wi * wi;
      if (nf < nz || m === M) {
        wr = fr;
        wi = fi;
        m = 0;
        stats.rebases += 1;
        if (Math.abs(wr) + Math.abs(wi) < SCALED_BELOW) {
          st[K] = 0;
          st[WR] = wr;
          st[WI] = wi;
          st[GR] = gr;
          st[GI] = gi;
          normalise(st);
          k = st[K]! | 0;
          wr = st[WR]!;
          wi = st[WI]!;
          gr = st[GR]!;
          gi = st[GI]!;
          if (k !== 0) {
            s = k < -1000 ? 0 : ldexp(1, k); sdr = ldexp(dlr, unitExponent - k); sdi = ldexp(dli, unitExponent - k); hs = ldexp(1, unitExponent - k); lim = ldexp(1, k + 66);
          }
        }
      } else if (nz < 1e-300 && nz !== 0 && unitExponent < -400) {
        // |z| < 2^-498 without a rebase (the reference passes near 0): rescale
        st[K] = 0;
        st[WR] = wr;
        st[WI] = wi;
        st[GR] = gr;
        st[GI] = gi;
        normalise(st);
        k = st[K]! | 0;
        wr = st[WR]!;
        wi = st[WI]!;
        gr = st[GR]!;
        gi = st[GI]!;
        if (k !== 0) {
          s = k < -1000 ? 0 : ldexp(1, k); sdr = ldexp(dlr, unitExponent - k); sdi = ldexp(dli, unitExponent - k); hs = ldexp(1, unitExponent - k); lim = ldexp(1, k + 66);
        }
      }
      if (track && (minK !== 0 ? false : nf < MIN_DROP * minN)) {
        minN = nf;
        minK = 0;
        event = EV_NEWMIN;
        break;
      }
    } else {
      // ---------------------------------------------------------------- rescaled mode (B6b)
      if (!skipped) {
        const zr = re[m]!, zi = im[m]!;
        let tiny = -1;
        if (o.tinySlot !== null) tiny = o.tinySlot[m]!;
        if (tiny >= 0 || (zr === 0 && zi === 0)) {
          // Z is as small as z (m = 0 after a rebase, or a tiny reference
          // iterate): work in units of 2^k, z' = 2^k w (2 Zs + w) + c
          let zsr = 0, zsi = 0;
          if (tiny >= 0) {
            zsr = ldexp(o.tinyRe[tiny]!, o.tinyExp[tiny]! - k);
            zsi = ldexp(o.tinyIm[tiny]!, o.tinyExp[tiny]! - k);
          }
          const tr = 2 * zsr + wr, ti = 2 * zsi + wi; // 2 Zs + w
          const ur = 2 * (zsr + wr), ui = 2 * (zsi + wi); // 2 (Z + z) / 2^k
          // G <- 2 (Z + z) G + u; the factor may underflow only where the term is negligible
          const fcr = ldexp(ur, k), fci = ldexp(ui, k);
          const ngr = fcr * gr - fci * gi + hs;
          gi = fcr * gi + fci * gr;
          gr = ngr;
          const npr = ur * pr - ui * pi;
          pi = ur * pi + ui * pr;
          pr = npr;
          pe += k;
          const qr = wr * tr - wi * ti, qi = wr * ti + wi * tr;
          wr = ldexp(qr, k) + sdr;
          wi = ldexp(qi, k) + sdi;
        } else {
          // |Z| >= 2^-500 >> |z|: s = 2^k is flushed to 0 below 2^-1000, where
          // s w is below 2^-436 |Z| (and subnormal products would be slow)
          const fcr = 2 * (zr + s * wr), fci = 2 * (zi + s * wi);
          const ngr = fcr * gr - fci * gi + hs;
          gi = fcr * gi + fci * gr;
          gr = ngr;
          const npr = fcr * pr - fci * pi;
          pi = fcr * pi + fci * pr;
          pr = npr;
          const nwr = 2 * (zr * wr - zi * wi) + s * (wr * wr - wi * wi) + sdr;
          wi = 2 * (zr * wi + zi * wr) + s * (2 * wr * wi) + sdi;
          wr = nwr;
        }
        n += 1;
        m += 1;
        stepped += 1;
      }
      const ap = Math.abs(pr) + Math.abs(pi);
      if (ap > P_HIGH || (ap < P_LOW && ap !== 0)) {
        const e = exponentOf(ap);
        pr = ldexp(pr, -e);
        pi = ldexp(pi, -e);
        pe += e;
      }
      // full value and rebasing: only possible when |Z_m| < 2^(k+66)
      const nzr = re[m]!, nzi = im[m]!;
      const az = Math.abs(nzr) + Math.abs(nzi);
      let rebased = false;
      let tiny2 = -1;
      if (o.tinySlot !== null) tiny2 = o.tinySlot[m]!;
      if (tiny2 >= 0 || az < lim) {
        let xr: number, xi: number;
        if (tiny2 >= 0) {
          xr = ldexp(o.tinyRe[tiny2]!, o.tinyExp[tiny2]! - k);
          xi = ldexp(o.tinyIm[tiny2]!, o.tinyExp[tiny2]! - k);
        } else {
          xr = ldexp(nzr, -k);
          xi = ldexp(nzi, -k);
        }
        fr = xr + wr;
        fi = xi + wi;
        fk = k;
        const nf = fr * fr + fi * fi;
        if (nf < wr * wr + wi * wi || m === M) {
          wr = fr;
          wi = fi;
          m = 0;
          rebased = true;
          stats.rebases += 1;
        }
        if (track && lessNorm(nf, k, MIN_DROP * minN, minK)) {
          minN = nf;
          minK = k;
          event = EV_NEWMIN;
        }
      } else {
        fr = nzr;
        fi = nzi;
        fk = 0;
        if (m === M) {
          // exhausted on an escaped reference: the full value is Z_M
          wr = nzr + ldexp(wr, k);
          wi = nzi + ldexp(wi, k);
          gr = ldexp(gr, k);
          gi = ldexp(gi, k);
          k = 0;
          m = 0;
          rebased = true;
          stats.rebases += 1;
          fr = wr;
          fi = wi;
          if (fr * fr + fi * fi > escapeRadius2) {
            event = EV_ESCAPED;
            break;
          }
        }
        const nf = nzr * nzr + nzi * nzi;
        if (track && minK === 0 && nf < MIN_DROP * minN) {
          minN = nf;
          event = EV_NEWMIN;
        }
      }
      const aw = Math.abs(wr) + Math.abs(wi);
      if (k !== 0 && (aw > W_HIGH || (aw < W_LOW && aw !== 0) || rebased)) {
        st[K] = k;
        st[WR] = wr;
        st[WI] = wi;
        st[GR] = gr;
        st[GI] = gi;
        normalise(st);
        k = st[K]! | 0;
        wr = st[WR]!;
        wi = st[WI]!;
        gr = st[GR]!;
        gi = st[GI]!;
        if (k !== 0) {
          s = k < -1000 ? 0 : ldexp(1, k); sdr = ldexp(dlr, unitExponent - k); sdi = ldexp(dli, unitExponent - k); hs = ldexp(1, unitExponent - k); lim = ldexp(1, k + 66);
        }
        else {
          fr = re[m]! + wr;
          fi = im[m]! + wi;
          fk = 0;
        }
      }
      if (event === EV_NEWMIN) break;
    }
  }
  stats.stepped += stepped;
  st[N] = n;
  st[M_] = m;
  st[K] = k;
  st[WR] = wr;
  st[WI] = wi;
  st[GR] = gr;
  st[GI] = gi;
  st[PR] = pr;
  st[PI] = pi;
  st[PE] = pe;
  st[FR] = fr;
  st[FI] = fi;
  st[FK] = fk;
  st[MINN] = minN;
  st[MINK] = minK;
  return event;
}

/** Sets the state to z = (zr + i zi) 2^zk at reference iteration 0, n = 0. */
function startState(st: Float64Array, zr: number, zi: number, zk: number, dlr: number, dli: number, unitExponent: number): void {
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
function diffScaled(ar: number, ai: number, ak: number, br: number, bi: number, bk: number, out: Float64Array): void {
  const k = Math.max(ak, bk);
  out[0] = ldexp(ar, ak - k) - ldexp(br, bk - k);
  out[1] = ldexp(ai, ak - k) - ldexp(bi, bk - k);
  out[2] = k;
}

const NEWTON_STEPS = 24;
/**
 * Relative Newton step at which w counts as converged. With skipping, F^p is
 * evaluated with relative error about eps per skip (2^-40 ~ 1e-12), so the
 * steps stall near 1e-12; 1e-9 still leaves the multiplier good to ~1e-9.
 */
const NEWTON_TOLERANCE = 1e-12;
const NEWTON_TOLERANCE_SKIPPING = 1e-9;

/**
 * Newton on F^p(w, c) = w by perturbation from w0 = (r, i) 2^k (methods.md
 * A5). On success writes w (r, i, k) and the multiplier (re, im) into
 * `res` = [wr, wi, wk, mulRe, mulIm] and returns true (|multiplier| < 1).
 */
function confirmCycle(
  o: Orbit,
  bla: BlaTable | null,
  scratch: Float64Array,
  p: number,
  w0r: number,
  w0i: number,
  w0k: number,
  dlr: number,
  dli: number,
  settings: DeepSettings,
  stats: DeepStats,
  res: Float64Array,
): boolean {
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const U = settings.unitExponent;
  let wr = w0r, wi = w0i, wk = w0k;
  const d = new Float64Array(3);
  let converged = false;
  let lr = 0, li = 0;
  for (let it = 0; it < NEWTON_STEPS; it++) {
    startState(scratch, wr, wi, wk, dlr, dli, U);
    const ev = run(o, bla, scratch, p, false, R2, U, stats);
    stats.newtonIterations += p;
    if (ev === EV_ESCAPED) return false;
    // multiplier D_z F^p = P 2^PE
    lr = ldexp(scratch[PR]!, scratch[PE]!);
    li = ldexp(scratch[PI]!, scratch[PE]!);
    // residual F^p(w) - w
    diffScaled(scratch[FR]!, scratch[FI]!, scratch[FK]!, wr, wi, wk, d);
    const gr = lr - 1, gi = li;
    const g2 = gr * gr + gi * gi;
    if (!(g2 > 0) || !Number.isFinite(g2)) return false;
    // step = residual / (D_z - 1), in units of 2^d[2]
    const sr = (d[0]! * gr + d[1]! * gi) / g2;
    const si = (d[1]! * gr - d[0]! * gi) / g2;
    diffScaled(wr, wi, wk, sr, si, d[2]!, d);
    const dk = d[2]!;
    wr = d[0]!;
    wi = d[1]!;
    wk = dk;
    const aw = Math.abs(wr) + Math.abs(wi);
    if (aw !== 0) {
      const e = exponentOf(aw);
      wr = ldexp(wr, -e);
      wi = ldexp(wi, -e);
      wk += e;
    }
    if (sr === 0 && si === 0) {
      converged = true;
      break;
    }
    const wn = Math.hypot(wr, wi);
    const stepExp = exponentOf(Math.hypot(sr, si)) + dk;
    // relative step small, or w so close to 0 that nothing at this depth resolves it
    const rel = wn === 0 ? Infinity : (Math.hypot(sr, si) / wn) * 2 ** Math.max(-1000, Math.min(1000, dk - wk));
    if (!Number.isFinite(rel) && wn !== 0) return false;
    if (rel <= (bla === null ? NEWTON_TOLERANCE : NEWTON_TOLERANCE_SKIPPING) || ((wn === 0 || wk < U - 1100) && stepExp < U - 1100)) {
      converged = true;
      break;
    }
  }
  if (!converged) return false;
  // multiplier at the converged point
  startState(scratch, wr, wi, wk, dlr, dli, U);
  if (run(o, bla, scratch, p, false, R2, U, stats) === EV_ESCAPED) return false;
  stats.newtonIterations += p;
  lr = ldexp(scratch[PR]!, scratch[PE]!);
  li = ldexp(scratch[PI]!, scratch[PE]!);
  if (!(lr * lr + li * li < 1)) return false;
  res[0] = wr;
  res[1] = wi;
  res[2] = wk;
  res[3] = lr;
  res[4] = li;
  return true;
}

/**
 * The exact period of the attracting cycle through w = (r, i) 2^k found for
 * period p: the least divisor d of p with F^d(w) = w to 1e-6 relative.
 * A quadratic polynomial has at most one attracting cycle (Fatou), so
 * the exact period divides p.
 */
function exactPeriod(
  o: Orbit,
  bla: BlaTable | null,
  scratch: Float64Array,
  p: number,
  wr: number,
  wi: number,
  wk: number,
  dlr: number,
  dli: number,
  settings: DeepSettings,
  stats: DeepStats,
  res: Float64Array,
): number {
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const U = settings.unitExponent;
  const d = new Float64Array(3);
  for (let q = 1; q < p; q++) {
    if (p % q !== 0) continue;
    startState(scratch, wr, wi, wk, dlr, dli, U);
    if (run(o, bla, scratch, q, false, R2, U, stats) === EV_ESCAPED) continue;
    stats.newtonIterations += q;
    diffScaled(scratch[FR]!, scratch[FI]!, scratch[FK]!, wr, wi, wk, d);
    const err = Math.hypot(d[0]!, d[1]!) * 2 ** Math.max(-1000, Math.min(1000, d[2]! - wk));
    if (err <= 1e-6 * Math.hypot(wr, wi)) {
      res[3] = ldexp(scratch[PR]!, scratch[PE]!);
      res[4] = ldexp(scratch[PI]!, scratch[PE]!);
      return q;
    }
  }
  return p;
}

/**
 * Interior distance estimate (methods.md A6) along one period from the
 * cycle point w = (r, i) 2^k by plain perturbation, in tile units; NaN when
 * the values leave the double range (very deep tiles).
 */
function interiorDistanceDeep(o: Orbit, p: number, wr: number, wi: number, wk: number, dlr: number, dli: number, U: number): number {
  if (U < -900 || wk < -900) return NaN;
  const u = ldexp(1, U);
  const cr = dlr * u, ci = dli * u;
  let zr = ldexp(wr, wk), zi = ldexp(wi, wk);
  let m = 0;
  let dzr = 1, dzi = 0, dcr = 0, dci = 0, dzzr = 0, dzzi = 0, dczr = 0, dczi = 0;
  const re = o.re, im = o.im;
  for (let j = 0; j < p; j++) {
    const xr = re[m]! + zr, xi = im[m]! + zi; // full value
    const czr = 2 * (xr * dczr - xi * dczi + (dcr * dzr - dci * dzi));
    const czi = 2 * (xr * dczi + xi * dczr + (dcr * dzi + dci * dzr));
    const zzr = 2 * (xr * dzzr - xi * dzzi + (dzr * dzr - dzi * dzi));
    const zzi = 2 * (xr * dzzi + xi * dzzr + 2 * dzr * dzi);
    const ncr = 2 * (xr * dcr - xi * dci) + u;
    const nci = 2 * (xr * dci + xi * dcr);
    const nzr = 2 * (xr * dzr - xi * dzi);
    const nzi = 2 * (xr * dzi + xi * dzr);
    dczr = czr; dczi = czi; dzzr = zzr; dzzi = zzi; dcr = ncr; dci = nci; dzr = nzr; dzi = nzi;
    const Zr = re[m]!, Zi = im[m]!;
    const tr = 2 * (Zr * zr - Zi * zi) + (zr * zr - zi * zi) + cr;
    zi = 2 * (Zr * zi + Zi * zr) + 2 * zr * zi + ci;
    zr = tr;
    m += 1;
    const fr = re[m]! + zr, fi = im[m]! + zi;
    if (fr * fr + fi * fi < zr * zr + zi * zi || m === o.M) {
      zr = fr;
      zi = fi;
      m = 0;
    }
  }
  const mod2 = dzr * dzr + dzi * dzi;
  if (!(mod2 < 1)) return NaN;
  const pr = dzzr * dcr - dzzi * dci, pi = dzzr * dci + dzzi * dcr;
  const gr = 1 - dzr, gi = -dzi;
  const g2 = gr * gr + gi * gi;
  const qr = (pr * gr + pi * gi) / g2, qi = (pi * gr - pr * gi) / g2;
  const den = Math.hypot(dczr + qr, dczi + qi);
  const b = (1 - mod2) / den;
  return Number.isFinite(b) && b > 0 ? b : NaN;
}

/** out = (a 2^ae) (b 2^be) + (c 2^ce) (d 2^de) as (re, im, exp), normalised. */
function mulAdd(
  ar: number, ai: number, ae: number, br: number, bi: number, be: number,
  cr: number, ci: number, ce: number, dr: number, di: number, de: number,
  out: Float64Array,
): void {
  let xr = ar * br - ai * bi, xi = ar * bi + ai * br;
  let yr = cr * dr - ci * di, yi = cr * di + ci * dr;
  const xe = ae + be, ye = ce + de;
  const xz = xr === 0 && xi === 0, yz = yr === 0 && yi === 0;
  let e: number;
  if (xz && yz) {
    out[0] = 0; out[1] = 0; out[2] = 0;
    return;
  } else if (yz || (!xz && xe >= ye)) {
    e = xe;
    yr = ldexp(yr, ye - xe);
    yi = ldexp(yi, ye - xe);
  } else {
    e = ye;
    xr = ldexp(xr, xe - ye);
    xi = ldexp(xi, xe - ye);
  }
  let r = xr + yr, i = xi + yi;
  const big = Math.max(Math.abs(r), Math.abs(i));
  if (big !== 0) {
    const k = exponentOf(big);
    r = ldexp(r, -k);
    i = ldexp(i, -k);
    e += k;
  }
  out[0] = r; out[1] = i; out[2] = e;
}

/**
 * Interior distance estimate (methods.md A6) in full range, for tiles whose
 * unit is below the double range: the pixel is single-stepped by the same
 * perturbation loop (rescaled where tiny) and the four derivatives carried
 * as (re, im, exponent). Slower than interiorDistanceDeep (a call and a few
 * power-of-two scalings per step), so only used below U = -900.
 */
function interiorDistanceScaled(
  o: Orbit, scratch: Float64Array, p: number, wr: number, wi: number, wk: number,
  dlr: number, dli: number, settings: DeepSettings, stats: DeepStats,
): number {
  const U = settings.unitExponent;
  const R2 = settings.escapeRadius * settings.escapeRadius;
  startState(scratch, wr, wi, wk, dlr, dli, U);
  // derivatives as (re, im, exp): D_z = 1, D_zz = D_c = D_cz = 0 (c units)
  const dz = Float64Array.of(1, 0, 0), dzz = new Float64Array(3), dc = new Float64Array(3), dcz = new Float64Array(3);
  const t = new Float64Array(3), t2 = new Float64Array(3);
  for (let j = 0; j < p; j++) {
    // 2 z at the current point
    const zr = 2 * scratch[FR]!, zi = 2 * scratch[FI]!, ze = scratch[FK]!;
    // D_cz <- 2 z D_cz + 2 D_c D_z
    mulAdd(zr, zi, ze, dcz[0]!, dcz[1]!, dcz[2]!, 2 * dc[0]!, 2 * dc[1]!, dc[2]!, dz[0]!, dz[1]!, dz[2]!, t);
    // D_zz <- 2 z D_zz + 2 D_z^2
    mulAdd(zr, zi, ze, dzz[0]!, dzz[1]!, dzz[2]!, 2 * dz[0]!, 2 * dz[1]!, dz[2]!, dz[0]!, dz[1]!, dz[2]!, t2);
    dcz.set(t);
    dzz.set(t2);
    // D_c <- 2 z D_c + 1
    mulAdd(zr, zi, ze, dc[0]!, dc[1]!, dc[2]!, 1, 0, 0, 1, 0, 0, t);
    dc.set(t);
    // D_z <- 2 z D_z
    mulAdd(zr, zi, ze, dz[0]!, dz[1]!, dz[2]!, 0, 0, 0, 0, 0, 0, t);
    dz.set(t);
    if (run(o, null, scratch, j + 1, false, R2, U, stats) === EV_ESCAPED) return NaN;
  }
  stats.newtonIterations += p;
  const lr = ldexp(dz[0]!, dz[2]!), li = ldexp(dz[1]!, dz[2]!);
  const mod2 = lr * lr + li * li;
  if (!(mod2 < 1)) return NaN;
  // Y = D_cz + D_zz D_c / (1 - D_z)
  const gr = 1 - lr, gi = -li, g2 = gr * gr + gi * gi;
  mulAdd(dzz[0]!, dzz[1]!, dzz[2]!, dc[0]!, dc[1]!, dc[2]!, 0, 0, 0, 0, 0, 0, t);
  const qr = (t[0]! * gr + t[1]! * gi) / g2, qi = (t[1]! * gr - t[0]! * gi) / g2;
  mulAdd(qr, qi, t[2]!, 1, 0, 0, dcz[0]!, dcz[1]!, dcz[2]!, 1, 0, 0, t2);
  const y = Math.hypot(t2[0]!, t2[1]!);
  // b = (1 - |D_z|^2) / |Y| in c units; in tile units divide by 2^U
  const b = ldexp((1 - mod2) / y, -t2[2]! - U);
  return Number.isFinite(b) && b > 0 ? b : NaN;
}

/**
 * Samples `count` parameters c = C + (dcRe[k] + i dcIm[k]) 2^U around the
 * reference C of `reference`, writing slot k of `out` with the meanings of
 * sample-set.ts (distance in units of 2^U). `bla` may be null (no skipping);
 * a table must have been built for the same orbit and unitExponent and for
 * offsets at least as large as these (a different unit is a RangeError).
 * Adds to `stats`. Pure: no I/O, no module state; the result depends only
 * on the arguments.
 */
export function sampleDeep(
  reference: ReferenceOrbit,
  bla: BlaTable | null,
  dcRe: Float64Array,
  dcIm: Float64Array,
  count: number,
  settings: DeepSettings,
  out: SampleSet,
  stats: DeepStats,
): SampleSet {
  if (bla !== null && bla.unitExponent !== settings.unitExponent) {
    throw new RangeError(`sampleDeep: table built for unit 2^${bla.unitExponent}, settings use 2^${settings.unitExponent}`);
  }
  const o = makeOrbit(reference);
  const maxIterations = settings.maxIterations;
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const logR = Math.log(settings.escapeRadius);
  const U = settings.unitExponent;
  const interior = settings.interior ?? true;
  const budget = settings.newtonBudget ?? 8;
  const st = new Float64Array(STATE);
  const scratch = new Float64Array(STATE);
  const res = new Float64Array(5);
  const d = new Float64Array(3);
  const { period, smooth, distance, mulRe, mulIm } = out;
  for (let idx = 0; idx < count; idx++) {
    const dlr = dcRe[idx]!, dli = dcIm[idx]!;
    startState(st, 0, 0, 0, dlr, dli, U);
    // Checks come in pairs: arm (save the full value, reset the product) and,
    // one candidate period later, test. Arms sit at n_min + 2^t p (doubling,
    // as in Brent's method), so skips are capped only inside the armed period.
    let candidate = 0;
    let minAt = 0;
    let doubling = 1;
    let armed = false;
    let nextCheck = Infinity;
    let savedR = 0, savedI = 0, savedK = 0;
    let newtonLeft = budget;
    let result = PERIOD_UNDECIDED;
    period[idx] = PERIOD_UNDECIDED;
    smooth[idx] = maxIterations;
    distance[idx] = NaN;
    mulRe[idx] = 0;
    mulIm[idx] = 0;
    for (;;) {
      const stop = Math.min(maxIterations, nextCheck);
      const ev = run(o, bla, st, stop, interior, R2, U, stats);
      if (ev === EV_ESCAPED) {
        const fr = st[FR]!, fi = st[FI]!;
        period[idx] = PERIOD_ESCAPED;
        smooth[idx] = smoothCount(st[N]!, fr, fi, logR);
        const mod2 = fr * fr + fi * fi;
        const g = Math.hypot(st[GR]!, st[GI]!);
        distance[idx] = g < Infinity ? (Math.sqrt(mod2) * Math.log(mod2)) / g : 0;
        result = PERIOD_ESCAPED;
        break;
      }
      if (ev === EV_STOP && st[N]! >= maxIterations) break;
      if (ev === EV_NEWMIN) {
        candidate = st[N]!;
        minAt = st[N]!;
        doubling = 1;
        armed = false; // arm right here
      } else if (armed) {
        // test: one candidate period after the arm
        const lr = ldexp(st[PR]!, st[PE]!), li = ldexp(st[PI]!, st[PE]!);
        diffScaled(st[FR]!, st[FI]!, st[FK]!, savedR, savedI, savedK, d);
        const gap = Math.hypot(d[0]!, d[1]!) * 2 ** Math.max(-1000, Math.min(1000, d[2]! - savedK));
        // Gate for Newton: the orbit contracted over the last period. The
        // return gap is not required to be small: Newton's basin is wide, and
        // slowly converging orbits (|multiplier| near 1) would wait too long.
        if (lr * lr + li * li < 1 && gap < Infinity && newtonLeft > 0) {
          newtonLeft -= 1;
          if (confirmCycle(o, bla, scratch, candidate, st[FR]!, st[FI]!, st[FK]!, dlr, dli, settings, stats, res)) {
            const p = exactPeriod(o, bla, scratch, candidate, res[0]!, res[1]!, res[2]!, dlr, dli, settings, stats, res);
            period[idx] = p;
            smooth[idx] = st[N]!;
            mulRe[idx] = res[3]!;
            mulIm[idx] = res[4]!;
            distance[idx] = U < -900
              ? interiorDistanceScaled(o, scratch, p, res[0]!, res[1]!, res[2]!, dlr, dli, settings, stats)
              : interiorDistanceDeep(o, p, res[0]!, res[1]!, res[2]!, dlr, dli, U);
            result = p;
            break;
          }
        }
        armed = false;
        doubling *= 2;
        nextCheck = minAt + doubling * candidate;
        continue;
      }
      // arm
      savedR = st[FR]!;
      savedI = st[FI]!;
      savedK = st[FK]!;
      st[PR] = 1;
      st[PI] = 0;
      st[PE] = 0;
      armed = true;
      nextCheck = st[N]! + candidate;
    }
    if (result === PERIOD_UNDECIDED) {
      period[idx] = PERIOD_UNDECIDED;
      smooth[idx] = maxIterations;
    }
  }
  return out;
}

