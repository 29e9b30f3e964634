import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit } from '../../../src/precise/reference-orbit.js';
import { blaDensity, buildBlaTable, DENSE_ENTRIES, findBla, type BlaTable } from '../../../src/plane/deep/bla-table.js';

// The Misiurewicz point c = i stays bounded (0 -> i -> -1+i -> -i -> -1+i, exact
// algebra), so the table has 2999 single steps and 13 levels; |2 Z| is 2 or 2.83.
const orbit = computeReferenceOrbit({ re: '0', im: '1' }, 128, 3000);
const UNIT = -200; // offsets in units of 2^-200
const DELTA_MAX = 4; // |c| <= 4 * 2^-200
// the sources' aligned table (level j starts at m = 1 + i 2^j) and the default, an entry at every m
const aligned = buildBlaTable(orbit, UNIT, DELTA_MAX, { dense: 0 });
const table = buildBlaTable(orbit, UNIT, DELTA_MAX);
const u = 2 ** UNIT;

/** The entry of level j that starts at reference iteration m, or -1 where the table has none. */
function entryAt(t: BlaTable, j: number, m: number): number {
  const shift = Math.max(0, j - t.dense);
  if ((m - 1) % 2 ** shift !== 0) return -1;
  const i = (m - 1) >> shift;
  return i < t.counts[j]! ? t.offsets[j]! + i : -1;
}

/** Entry (level j, index i) of the aligned table covers reference iterations m = 1 + i 2^j .. m + skip. */
function entry(j: number, i: number): number {
  return aligned.offsets[j]! + i;
}

describe('buildBlaTable', () => {
  it('has M-1 single steps and halves level by level down to one entry covering the orbit (the aligned table)', () => {
    expect(orbit.length).toBe(3000);
    expect(aligned.dense).toBe(0);
    expect(aligned.counts[0]).toBe(2999);
    expect(aligned.counts[aligned.levels - 1]).toBe(1);
    expect(aligned.skip[entry(aligned.levels - 1, 0)]).toBe(2999);
    for (let j = 1; j < aligned.levels; j++) expect(aligned.counts[j]).toBe(Math.ceil(aligned.counts[j - 1]! / 2));
  });

  it('denser: within DENSE_ENTRIES every level starts at every m and skips min(2^j, M - m), and agrees with the aligned table where both start', () => {
    // 13 levels of 2999 entries = 38 987 <= 2^18: fully dense
    expect(table.levels).toBe(aligned.levels);
    expect(table.dense).toBeGreaterThanOrEqual(table.levels - 1);
    for (let j = 0; j < table.levels; j++) {
      expect(table.counts[j]).toBe(2999);
      for (const m of [1, 2, 3, 100, 1001, 2048, 2999]) {
        const e = entryAt(table, j, m);
        expect(table.skip[e]).toBe(Math.min(2 ** j, 3000 - m));
        const a = entryAt(aligned, j, m);
        if (a < 0) continue;
        // the same merges in the same order: identical doubles
        for (const key of ['aRe', 'aIm', 'bRe', 'bIm', 'bExp', 'logRadius', 'skip', 'minNorm', 'minAt'] as const) expect(table[key][e]).toBe(aligned[key][a]);
      }
    }
    // a long orbit keeps the aligned table and its memory (about 2M entries)
    expect(blaDensity(1_000_000)).toBe(0);
    // one cycle of a period-1012 nucleus: every start (11 levels of 1011)
    expect(blaDensity(1012)).toBeGreaterThanOrEqual(10);
    // every start of 16 384 iterates: 15 levels of 16 383 entries, within 2^18; 20 000 iterates need 15 x 19 999
    expect(15 * 16_383).toBeLessThanOrEqual(DENSE_ENTRIES);
    expect(blaDensity(16_384)).toBe(14);
    expect(15 * 19_999).toBeGreaterThan(DENSE_ENTRIES);
    expect(blaDensity(20_000)).toBe(0);
  });

  it('merged coefficients equal the composed single steps: A = prod 2 Z, B = sum of the linearised c terms (mathr deep-zoom section 3)', () => {
    const { re, im } = orbit;
    for (const [j, m, t] of [
      [3, 41, aligned],
      [5, 225, aligned],
      [6, 65, aligned],
      [7, 257, aligned],
      // starts the aligned table lacks, and an entry cut short by the orbit's end
      [5, 226, table],
      [9, 7, table],
      [9, 2700, table],
    ] as const) {
      const e = entryAt(t, j, m);
      expect(e).toBeGreaterThanOrEqual(0);
      // direct linearised iteration: z_{t+1} = 2 Z z_t (A), B_{t+1} = 2 Z B_t + 1 (c units)
      let ar = 1,
        ai = 0,
        br = 0,
        bi = 0,
        minNorm = Infinity,
        minAt = 0;
      const l = Math.min(2 ** j, orbit.length - m);
      expect(t.skip[e]).toBe(l);
      for (let s = 0; s < l; s++) {
        const zr = 2 * re[m + s]!,
          zi = 2 * im[m + s]!;
        [ar, ai] = [zr * ar - zi * ai, zr * ai + zi * ar];
        [br, bi] = [zr * br - zi * bi + 1, zr * bi + zi * br];
        // the iterates passed over, s + 1 < l (the landing iterate is tested after the skip)
        const n2 = re[m + s + 1]! ** 2 + im[m + s + 1]! ** 2;
        if (s + 1 < l && n2 < minNorm) {
          minNorm = n2;
          minAt = s + 1;
        }
      }
      // same operations in a different association: agree to rounding growth (1e-10 relative)
      expect(Math.hypot(t.aRe[e]! - ar, t.aIm[e]! - ai) / Math.hypot(ar, ai)).toBeLessThan(1e-10);
      const tb = 2 ** t.bExp[e]!;
      expect(Math.hypot(t.bRe[e]! * tb - br, t.bIm[e]! * tb - bi) / Math.hypot(br, bi)).toBeLessThan(1e-10);
      expect(Math.max(Math.abs(t.bRe[e]!), Math.abs(t.bIm[e]!))).toBeGreaterThanOrEqual(0.5);
      expect(Math.max(Math.abs(t.bRe[e]!), Math.abs(t.bIm[e]!))).toBeLessThan(1);
      expect(t.minNorm[e]).toBe(minNorm);
      expect(t.minAt[e]).toBe(minAt);
    }
  });

  it('validity radii never grow with the level at one start (the step loop stops at a single step that is not linear) and are never NaN', () => {
    for (const t of [aligned, table]) {
      for (let j = 1; j < t.levels; j++) {
        for (let m = 1; m < orbit.length; m++) {
          const e = entryAt(t, j, m);
          if (e < 0) continue;
          // the first half of a merged entry starts at the same m one level down
          expect(t.logRadius[e]).toBeLessThanOrEqual(t.logRadius[entryAt(t, j - 1, m)]!);
          expect(Number.isNaN(t.logRadius[e])).toBe(false);
        }
      }
    }
  });

  it('gives no radius to an entry whose A overflows a double (the kernel could not apply it)', () => {
    // 4000 iterates of c = i: |A| over 2048 steps is about 2^(2048 * 1.25), beyond 2^1024
    const long = computeReferenceOrbit({ re: '0', im: '1' }, 128, 4000);
    const t = buildBlaTable(long, -4000, 1);
    let overflowing = 0;
    for (let e = 0; e < t.skip.length; e++) {
      if (Number.isFinite(t.aRe[e]!) && Number.isFinite(t.aIm[e]!)) continue;
      overflowing++;
      expect(t.logRadius[e]).toBe(-Infinity);
    }
    expect(overflowing).toBeGreaterThan(0);
  });

  it('an applied entry reproduces exact perturbation to about eps (2^-40) for |z| below its radius', () => {
    const { re, im } = orbit;
    let worst = 0;
    for (const m of [1, 2, 33, 257, 777, 1025, 1026]) {
      const e = findBla(table, m, -Infinity, 2999);
      expect(e).toBeGreaterThanOrEqual(0);
      const r = 2 ** table.logRadius[e]!;
      // a delta at half the radius, and the largest offset
      let zr = 0.5 * r,
        zi = 0;
      const dr = DELTA_MAX * u,
        di = 0;
      for (let t = 0; t < table.skip[e]!; t++) {
        const Zr = re[m + t]!,
          Zi = im[m + t]!;
        [zr, zi] = [2 * (Zr * zr - Zi * zi) + zr * zr - zi * zi + dr, 2 * (Zr * zi + Zi * zr) + 2 * zr * zi + di];
      }
      const tb = 2 ** table.bExp[e]!;
      const lr = table.aRe[e]! * 0.5 * r + table.bRe[e]! * tb * dr;
      const li = table.aIm[e]! * 0.5 * r + table.bIm[e]! * tb * dr;
      worst = Math.max(worst, Math.hypot(lr - zr, li - zi) / Math.hypot(zr, zi));
    }
    // the dropped z^2 terms are below eps relative per step; allow 2^-30
    expect(worst).toBeLessThan(2 ** -30);
  });
});

describe('findBla', () => {
  it('returns -1 at m = 0 (Z_0 = 0 is never linear), respects maxSkip, and prefers the longest valid skip', () => {
    for (const t of [aligned, table]) {
      expect(findBla(t, 0, -Infinity, 100)).toBe(-1);
      const e = findBla(t, 1, -Infinity, 100);
      expect(t.skip[e]).toBeLessThanOrEqual(100);
      // the longest entry from m = 1 within 100 steps whose radius is not 0
      let best = 0;
      for (let j = 0; j < t.levels; j++) {
        const k = entryAt(t, j, 1);
        if (t.skip[k]! <= 100 && t.logRadius[k]! > -Infinity) best = Math.max(best, t.skip[k]!);
      }
      expect(best).toBeGreaterThan(8);
      expect(t.skip[e]).toBe(best);
      expect(findBla(t, 1, 1000, 100)).toBe(-1);
    }
    // at m = 1 + 3 * 16 only levels up to 4 are aligned; the denser table starts every level there
    expect(aligned.skip[findBla(aligned, 49, -Infinity, 3000)]).toBeLessThanOrEqual(16);
    const e2 = findBla(table, 49, -Infinity, 3000);
    expect(table.skip[e2]).toBeGreaterThan(16);
    expect(table.logRadius[e2]).toBeGreaterThan(-Infinity);
  });
});
