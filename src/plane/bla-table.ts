/**
 * Bivariate linear approximation table (methods.md B5): skip l iterations of
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
 *   since Z_0 = 0); level j entry i merges level j-1 entries 2i and 2i+1 and
 *   starts at m = 1 + i 2^j.
 *
 * B is stored in tile units (B * 2^unitExponent, the same unit as the
 * kernel's offsets), so it stays in double range at any depth. The table is
 * plain data (typed arrays) for workers, like the reference orbit.
 * Each entry also records the smallest |Z| among the iterates it skips
 * (`minNorm`, at offset `minAt`), so that atom-domain period candidates are
 * not lost inside a skip.
 */
import type { ReferenceOrbit } from '../precise/reference-orbit.js';

export interface BlaTable {
  /** Number of levels; level j has count(j) entries starting at offsets[j]. */
  readonly levels: number;
  readonly offsets: Int32Array;
  readonly counts: Int32Array;
  readonly aRe: Float64Array;
  readonly aIm: Float64Array;
  /** B in tile units (times 2^unitExponent). */
  readonly bRe: Float64Array;
  readonly bIm: Float64Array;
  /** R^2 in c units (z of the kernel in plain mode is in c units). */
  readonly radius2: Float64Array;
  /** l: iterations skipped by the entry. */
  readonly skip: Int32Array;
  /** min over t = 1..l of |Z_{m+t}|^2, and the t where it occurs. */
  readonly minNorm: Float64Array;
  readonly minAt: Int32Array;
  readonly unitExponent: number;
  readonly epsilon: number;
}

/** Options of {@link buildBlaTable}. */
export interface BlaOptions {
  /**
   * Relative tolerance eps of the dropped z^2 term (default 2^-40). Larger
   * skips more and changes more counts; see the measurements in the tests.
   */
  readonly epsilon?: number;
}

/**
 * Builds the table for `orbit`, for offsets |c| <= deltaMax * 2^unitExponent
 * (deltaMax in tile units: the largest |offset| the plate will use).
 */
export function buildBlaTable(orbit: ReferenceOrbit, unitExponent: number, deltaMax: number, options: BlaOptions = {}): BlaTable {
  const epsilon = options.epsilon ?? 2 ** -40;
  const M = orbit.length;
  const n0 = Math.max(0, M - 1);
  const counts: number[] = [];
  const offsets: number[] = [];
  let total = 0;
  for (let c = n0; ; c = Math.ceil(c / 2)) {
    counts.push(c);
    offsets.push(total);
    total += c;
    if (c <= 1) break;
  }
  const levels = counts.length;
  const aRe = new Float64Array(total);
  const aIm = new Float64Array(total);
  const bRe = new Float64Array(total);
  const bIm = new Float64Array(total);
  const radius2 = new Float64Array(total);
  const skip = new Int32Array(total);
  const minNorm = new Float64Array(total);
  const minAt = new Int32Array(total);
  const unit = 2 ** Math.max(-1074, Math.min(1023, unitExponent)); // may round to 0 at extreme depth (harmless: see below)
  const cMax = deltaMax * unit; // c units; 0 when it underflows, a negligible loss next to eps |A|
  const { re, im } = orbit;
  for (let i = 0; i < n0; i++) {
    const m = i + 1;
    const zr = re[m]!;
    const zi = im[m]!;
    const ar = 2 * zr;
    const ai = 2 * zi;
    const a = Math.hypot(ar, ai);
    aRe[i] = ar;
    aIm[i] = ai;
    bRe[i] = unit;
    bIm[i] = 0;
    const r = a === 0 ? 0 : epsilon * a - cMax / a;
    radius2[i] = r > 0 ? r * r : 0;
    skip[i] = 1;
    minNorm[i] = re[m + 1]! * re[m + 1]! + im[m + 1]! * im[m + 1]!;
    minAt[i] = 1;
  }
  for (let j = 1; j < levels; j++) {
    const src = offsets[j - 1]!;
    const dst = offsets[j]!;
    const cnt = counts[j]!;
    const srcCount = counts[j - 1]!;
    for (let i = 0; i < cnt; i++) {
      const x = src + 2 * i;
      const d = dst + i;
      if (2 * i + 1 >= srcCount) {
        aRe[d] = aRe[x]!;
        aIm[d] = aIm[x]!;
        bRe[d] = bRe[x]!;
        bIm[d] = bIm[x]!;
        radius2[d] = radius2[x]!;
        skip[d] = skip[x]!;
        minNorm[d] = minNorm[x]!;
        minAt[d] = minAt[x]!;
        continue;
      }
      const y = x + 1;
      const axr = aRe[x]!, axi = aIm[x]!, ayr = aRe[y]!, ayi = aIm[y]!;
      aRe[d] = ayr * axr - ayi * axi;
      aIm[d] = ayr * axi + ayi * axr;
      const bxr = bRe[x]!, bxi = bIm[x]!;
      bRe[d] = ayr * bxr - ayi * bxi + bRe[y]!;
      bIm[d] = ayr * bxi + ayi * bxr + bIm[y]!;
      const rx = Math.sqrt(radius2[x]!);
      const ry = Math.sqrt(radius2[y]!);
      const ax = Math.hypot(axr, axi);
      const bx = Math.hypot(bxr, bxi) * deltaMax; // |B_x| |c|max, tile units cancel
      const r = ax === 0 ? 0 : Math.min(rx, (ry - bx) / ax);
      // long products overflow: Infinity - Infinity gives NaN, which must read as "never valid"
      radius2[d] = r > 0 ? r * r : 0;
      skip[d] = skip[x]! + skip[y]!;
      if (minNorm[y]! < minNorm[x]!) {
        minNorm[d] = minNorm[y]!;
        minAt[d] = skip[x]! + minAt[y]!;
      } else {
        minNorm[d] = minNorm[x]!;
        minAt[d] = minAt[x]!;
      }
    }
  }
  return {
    levels,
    offsets: Int32Array.from(offsets),
    counts: Int32Array.from(counts),
    aRe, aIm, bRe, bIm, radius2, skip, minNorm, minAt,
    unitExponent,
    epsilon,
  };
}

/**
 * The index of the entry to apply at reference iteration m for a delta of
 * squared size z2 (c units), skipping at most maxSkip iterations; -1 if
 * none is valid. Tries the longest aligned entry first and halves.
 */
export function findBla(table: BlaTable, m: number, z2: number, maxSkip: number): number {
  if (m < 1) return -1;
  const k = m - 1;
  // highest level at which an entry starts at m: the trailing zero bits of k
  let j = k === 0 ? table.levels - 1 : Math.min(table.levels - 1, 31 - Math.clz32(k & -k));
  for (; j >= 0; j--) {
    const i = k >> j;
    if (i >= table.counts[j]!) continue;
    const e = table.offsets[j]! + i;
    if (z2 < table.radius2[e]! && table.skip[e]! <= maxSkip) return e;
  }
  return -1;
}
