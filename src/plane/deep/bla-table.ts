/**
 * Bivariate linear approximation table (docs/methods.md B5): skip l iterations of
 * the perturbation z -> 2 Z_m z + z^2 + c at once with z_{m+l} = A z_m + B c,
 * valid while |z_m| < R.
 *
 * Sources: C. Heiland-Allen, mathr.co.uk/web/deep-zoom.html section 3
 * (single steps, merging, table) and the mathr blog "Deep zoom theory and
 * practice (again)" (2022); Zhuoran, fractalforums.org t/4360; R. Munafo,
 * mrob.com/pub/muency/bivariatelinearapproximati.html.
 *
 * - single step at reference iteration m: A = 2 Z_m, B = 1,
 *   R = max(0, eps |A| - |B| |c|max / |A|) (the c-corrected radius of the
 *   earlier mathr revision; the plain R = eps |A| ignores c and was dropped
 *   because it is too generous at moderate depth).
 * - merge x (first) then y: A = A_y A_x, B = A_y B_x + B_y,
 *   R = max(0, min(R_x, (R_y - |B_x| |c|max) / |A_x|)).
 * - levels: level 0 holds single steps m = 1..M-1 (step 0 is never linear
 *   since Z_0 = 0); a level-j entry from m merges the level-(j-1) entries
 *   from m and from m + 2^(j-1) (or copies the first where the second would
 *   start at or past M), so it skips min(2^j, M - m) iterations.
 * - where entries start: the table of the sources starts level j only at
 *   m = 1 + i 2^j (about 2M entries in all), so that a pixel that had to stop
 *   at an odd m climbs back through skips of 1, 2, 4, ... iterations. Here
 *   level j starts at every m = 1 + i 2^max(0, j - g), the first g levels
 *   at every iteration ("denser" by g). Every level starts at every m
 *   (M entries a level) while that stays within DENSE_ENTRIES, else g = 0,
 *   the sources' table (see blaDensity): short orbits such as one cycle of a
 *   nucleus get a skip of every power-of-two length from every iteration, so
 *   the climb costs nothing; long orbits keep the aligned table and its
 *   memory.
 *
 * B (which grows like 1/|c|) is stored as a floatexp and R as log2 R, so
 * the table works at any depth, including the rescaled iterations below
 * 1e-300. Radii are computed in logarithms: log2(2^a - 2^b) for the
 * subtractions. The table is plain data (typed arrays) for workers, like
 * the reference orbit.
 * Each entry also records the smallest |Z| among the iterates it skips over
 * (`minNorm`, at offset `minAt`), so that atom-domain period candidates are
 * not lost inside a skip. The iterate a skip lands on is not among them: the
 * kernel tests it after the skip as after a single step, so a skip may end
 * at the reference's pass near 0 (for a nucleus reference, Z_p = 0 ends
 * every cycle) and one entry covers a whole cycle.
 */
import type { ReferenceOrbit } from '../../precise/reference-orbit.js';
import { exponentOf, ldexp } from '../../precise/floatexp.js';

export interface BlaTable {
  /** Number of levels; level j has counts[j] entries starting at offsets[j]. */
  readonly levels: number;
  /**
   * g: level j's entry i starts at m = 1 + i 2^max(0, j - g) (0: the
   * sources' aligned table; at least levels - 1: an entry at every m).
   */
  readonly dense: number;
  readonly offsets: Int32Array;
  readonly counts: Int32Array;
  readonly aRe: Float64Array;
  readonly aIm: Float64Array;
  /** B in c units as a floatexp: (bRe + i bIm) 2^bExp, max(|bRe|, |bIm|) in [0.5, 1). */
  readonly bRe: Float64Array;
  readonly bIm: Float64Array;
  readonly bExp: Int32Array;
  /**
   * B 2^unitExponent as plain doubles (0 or subnormal where that underflows),
   * for the kernel's plain mode, where |z| >= 2^-500 makes such terms
   * negligible; saves a power of two per skip.
   */
  readonly bTileRe: Float64Array;
  readonly bTileIm: Float64Array;
  /** R^2 as a plain double (0 where it underflows), for plain-mode lookups without a logarithm. */
  readonly radius2: Float64Array;
  /**
   * log2 of the validity radius R in c units (-Infinity: never valid).
   * Logarithms, because at spans below 1e-300 the radii of the skips that
   * matter most (the linear phase from |z| ~ |c|) are below the double range.
   */
  readonly logRadius: Float64Array;
  /** l: iterations skipped by the entry. */
  readonly skip: Int32Array;
  /**
   * min over t = 1..l-1 of |Z_{m+t}|^2 (the iterates passed over; Infinity
   * for a single step), and the t where it first occurs (0 for none).
   */
  readonly minNorm: Float64Array;
  readonly minAt: Int32Array;
  readonly epsilon: number;
  /** The unit the table was built for (offsets c = delta 2^unitExponent). */
  readonly unitExponent: number;
}

/** Options of {@link buildBlaTable}. */
export interface BlaOptions {
  /**
   * Relative tolerance eps of the dropped z^2 term (default 2^-40). Larger
   * skips more and changes more counts; see the measurements in the tests.
   */
  readonly epsilon?: number;
  /** The density g (default blaDensity(M): 0, the sources' aligned table, or every start). */
  readonly dense?: number;
}

/**
 * Entries a table with every start may hold (84 bytes each: 22 MB). One
 * cycle of a period-1012 nucleus needs 11 000, an orbit of 16 384 iterates
 * (the 1e-1000 view near c = i) 246 000; an orbit of 20 000 already 300 000.
 */
export const DENSE_ENTRIES = 2 ** 18;

/** Entries per level of a table over M iterates denser by g (level 0 first). */
function levelCounts(M: number, dense: number): number[] {
  const n0 = Math.max(0, M - 1);
  const counts: number[] = [];
  for (let j = 0; ; j++) {
    counts.push(Math.ceil(n0 / 2 ** Math.max(0, j - dense)));
    // the top level holds an entry that skips the whole orbit from m = 1
    if (2 ** j >= n0) break;
  }
  return counts;
}

/**
 * The density g of the table for M iterates: an entry at every start
 * (g = levels - 1) within DENSE_ENTRIES, else 0. Densities in between were
 * tried and dropped: from an odd m the longest entry is then at level g, and
 * its skip of 2^g lands on an odd m again, so the greedy lookup never climbs
 * (bench deep plate: 121.6 operations per pixel at g = 1, 93.6 at g = 0, 66.6
 * at every start).
 */
export function blaDensity(M: number): number {
  const top = levelCounts(M, 0).length - 1;
  return levelCounts(M, top).reduce((a, b) => a + b, 0) <= DENSE_ENTRIES ? top : 0;
}

/** Bytes an entry holds (the arrays of BlaTable: 9 doubles and 3 32-bit integers). */
export const BLA_ENTRY_BYTES = 84;

/**
 * The most entries the table of any orbit of at most M iterates holds: an
 * aligned table (about 2M), or a denser one within DENSE_ENTRIES and within
 * an entry at every start of M iterates.
 */
export function blaEntriesAtMost(M: number): number {
  const sum = (counts: number[]): number => counts.reduce((a, b) => a + b, 0);
  const aligned = levelCounts(M, 0);
  return Math.max(sum(aligned), Math.min(DENSE_ENTRIES, sum(levelCounts(M, aligned.length))));
}

/**
 * Builds the table for `orbit`, valid for offsets |c| <= deltaMax * 2^unitExponent
 * (deltaMax in tile units: the largest |offset| the plate will use).
 */
export function buildBlaTable(orbit: ReferenceOrbit, unitExponent: number, deltaMax: number, options: BlaOptions = {}): BlaTable {
  const epsilon = options.epsilon ?? 2 ** -40;
  const logEps = Math.log2(epsilon);
  // log2 |c|max: never underflows, whatever the depth
  const logC = deltaMax > 0 ? Math.log2(deltaMax) + unitExponent : -Infinity;
  const M = orbit.length;
  const n0 = Math.max(0, M - 1);
  const dense = options.dense ?? blaDensity(M);
  const counts = levelCounts(M, dense);
  const offsets: number[] = [];
  let total = 0;
  for (const c of counts) {
    offsets.push(total);
    total += c;
  }
  const levels = counts.length;
  const aRe = new Float64Array(total);
  const aIm = new Float64Array(total);
  const bRe = new Float64Array(total);
  const bIm = new Float64Array(total);
  const bExp = new Int32Array(total);
  const logRadius = new Float64Array(total);
  const skip = new Int32Array(total);
  const minNorm = new Float64Array(total);
  const minAt = new Int32Array(total);
  const { re, im } = orbit;
  for (let i = 0; i < n0; i++) {
    const m = i + 1;
    const ar = 2 * re[m]!;
    const ai = 2 * im[m]!;
    aRe[i] = ar;
    aIm[i] = ai;
    bRe[i] = 0.5; // B = 1 = 0.5 * 2^1
    bIm[i] = 0;
    bExp[i] = 1;
    // R = eps |A| - |c| / |A| = eps |A| (1 - |c| / (eps |A|^2))
    const la = Math.log2(Math.hypot(ar, ai));
    logRadius[i] = logSubtract(logEps + la, logC - la);
    skip[i] = 1;
    minNorm[i] = Infinity;
    minAt[i] = 0;
  }
  for (let j = 1; j < levels; j++) {
    const src = offsets[j - 1]!;
    const dst = offsets[j]!;
    const cnt = counts[j]!;
    // starts of level j are 2^sj apart, of level j - 1 2^sx apart
    const sj = Math.max(0, j - dense),
      sx = Math.max(0, j - 1 - dense);
    const half = 2 ** (j - 1);
    for (let i = 0; i < cnt; i++) {
      const m = 1 + i * 2 ** sj;
      const x = src + ((m - 1) >> sx);
      const d = dst + i;
      if (m + half > n0) {
        aRe[d] = aRe[x]!;
        aIm[d] = aIm[x]!;
        bRe[d] = bRe[x]!;
        bIm[d] = bIm[x]!;
        bExp[d] = bExp[x]!;
        logRadius[d] = logRadius[x]!;
        skip[d] = skip[x]!;
        minNorm[d] = minNorm[x]!;
        minAt[d] = minAt[x]!;
        continue;
      }
      const y = src + ((m - 1 + half) >> sx);
      const axr = aRe[x]!,
        axi = aIm[x]!,
        ayr = aRe[y]!,
        ayi = aIm[y]!;
      aRe[d] = ayr * axr - ayi * axi;
      aIm[d] = ayr * axi + ayi * axr;
      // B = A_y B_x + B_y, aligned to the larger exponent
      const ex = bExp[x]!,
        ey = bExp[y]!;
      const bxr = bRe[x]!,
        bxi = bIm[x]!;
      let tr = ayr * bxr - ayi * bxi,
        ti = ayr * bxi + ayi * bxr;
      let byr = bRe[y]!,
        byi = bIm[y]!;
      let e = ex;
      if (ey > ex) {
        tr = ldexp(tr, ex - ey);
        ti = ldexp(ti, ex - ey);
        e = ey;
      } else {
        byr = ldexp(byr, ey - ex);
        byi = ldexp(byi, ey - ex);
      }
      let br = tr + byr,
        bi = ti + byi;
      const big = Math.max(Math.abs(br), Math.abs(bi));
      if (big !== 0 && Number.isFinite(big)) {
        const k = exponentOf(big);
        br = ldexp(br, -k);
        bi = ldexp(bi, -k);
        e += k;
      }
      bRe[d] = br;
      bIm[d] = bi;
      bExp[d] = e;
      // R = min(R_x, (R_y - |B_x| |c|) / |A_x|), in logarithms
      const lbx = Math.log2(Math.hypot(bxr, bxi)) + ex;
      const lax = Math.log2(Math.hypot(axr, axi));
      const r = logSubtract(logRadius[y]!, lbx + logC) - lax;
      const rx = logRadius[x]!;
      const lr = r < rx ? r : rx;
      // an A beyond the double range cannot be applied (the kernel moves a
      // large but finite A into its scale, step-loop.ts)
      logRadius[d] = Number.isNaN(lr) || !(Number.isFinite(aRe[d]!) && Number.isFinite(aIm[d]!)) ? -Infinity : lr;
      skip[d] = skip[x]! + skip[y]!;
      // passed over: those of x, the iterate x lands on (Z at m + l_x), those of y; the first minimum
      const land = m + skip[x]!;
      const nl = re[land]! * re[land]! + im[land]! * im[land]!;
      let mn = minNorm[x]!,
        at = minAt[x]!;
      if (nl < mn) {
        mn = nl;
        at = skip[x]!;
      }
      if (minNorm[y]! < mn) {
        mn = minNorm[y]!;
        at = skip[x]! + minAt[y]!;
      }
      minNorm[d] = mn;
      minAt[d] = at;
    }
  }
  const bTileRe = new Float64Array(total);
  const bTileIm = new Float64Array(total);
  const radius2 = new Float64Array(total);
  for (let e = 0; e < total; e++) {
    bTileRe[e] = ldexp(bRe[e]!, bExp[e]! + unitExponent);
    bTileIm[e] = ldexp(bIm[e]!, bExp[e]! + unitExponent);
    const lr = logRadius[e]!;
    radius2[e] = lr > -1000 ? 2 ** (2 * lr) : 0;
  }
  return {
    levels,
    dense,
    offsets: Int32Array.from(offsets),
    counts: Int32Array.from(counts),
    aRe,
    aIm,
    bRe,
    bIm,
    bExp,
    bTileRe,
    bTileIm,
    logRadius,
    radius2,
    skip,
    minNorm,
    minAt,
    epsilon,
    unitExponent,
  };
}

/** log2(2^a - 2^b), -Infinity when b >= a (or either is NaN). */
function logSubtract(a: number, b: number): number {
  if (!(a > b)) return -Infinity;
  if (b === -Infinity) return a;
  return a + Math.log2(1 - 2 ** (b - a));
}

/**
 * The index of the entry to apply at reference iteration m for a delta with
 * log2 |z| = logZ (c units), skipping at most maxSkip iterations; -1 if none
 * is valid. Tries the longest entry that starts at m first and halves.
 */
export function findBla(table: BlaTable, m: number, logZ: number, maxSkip: number): number {
  if (m < 1) return -1;
  const k = m - 1;
  const g = table.dense;
  // highest level at which an entry starts at m: g + the trailing zero bits of k
  let j = k === 0 ? table.levels - 1 : Math.min(table.levels - 1, g + 31 - Math.clz32(k & -k));
  for (; j >= 0; j--) {
    const i = k >> (j > g ? j - g : 0);
    if (i >= table.counts[j]!) continue;
    const e = table.offsets[j]! + i;
    if (logZ < table.logRadius[e]! && table.skip[e]! <= maxSkip) return e;
  }
  return -1;
}

/**
 * Copies a table's arrays into SharedArrayBuffers, so that every worker of a
 * plate reads one copy (see shareReferenceOrbit).
 */
export function shareBlaTable(table: BlaTable): BlaTable {
  const share = <T extends Float64Array | Int32Array>(a: T): T => {
    const buffer = new SharedArrayBuffer(Math.max(8, a.byteLength));
    const out = (a instanceof Float64Array ? new Float64Array(buffer, 0, a.length) : new Int32Array(buffer, 0, a.length)) as T;
    out.set(a as never);
    return out;
  };
  return {
    ...table,
    offsets: share(table.offsets),
    counts: share(table.counts),
    aRe: share(table.aRe),
    aIm: share(table.aIm),
    bRe: share(table.bRe),
    bIm: share(table.bIm),
    bExp: share(table.bExp),
    bTileRe: share(table.bTileRe),
    bTileIm: share(table.bTileIm),
    logRadius: share(table.logRadius),
    radius2: share(table.radius2),
    skip: share(table.skip),
    minNorm: share(table.minNorm),
    minAt: share(table.minAt),
  };
}
