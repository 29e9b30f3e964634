import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable, findBla } from '../../../src/plane/deep/bla-table.js';

// The Misiurewicz point c = i stays bounded (0 -> i -> -1+i -> -i -> -1+i, exact
// algebra), so the table has 2999 single steps and 13 levels; |2 Z| is 2 or 2.83.
const orbit = computeReferenceOrbit({ re: '0', im: '1' }, 128, 3000);
const UNIT = -200; // offsets in units of 2^-200
const DELTA_MAX = 4; // |c| <= 4 * 2^-200
const table = buildBlaTable(orbit, UNIT, DELTA_MAX);
const u = 2 ** UNIT;

/** Entry (level j, index i) covers reference iterations m = 1 + i 2^j .. m + skip. */
function entry(j: number, i: number): number {
  return table.offsets[j]! + i;
}

describe('buildBlaTable', () => {
  it('has M-1 single steps and halves level by level down to one entry covering the orbit', () => {
    expect(orbit.length).toBe(3000);
    expect(table.counts[0]).toBe(2999);
    expect(table.counts[table.levels - 1]).toBe(1);
    expect(table.skip[entry(table.levels - 1, 0)]).toBe(2999);
    for (let j = 1; j < table.levels; j++) expect(table.counts[j]).toBe(Math.ceil(table.counts[j - 1]! / 2));
  });

  it('merged coefficients equal the composed single steps: A = prod 2 Z, B = sum of the linearised c terms (mathr deep-zoom section 3)', () => {
    const { re, im } = orbit;
    for (const [j, i] of [
      [3, 5],
      [5, 7],
      [6, 1],
      [7, 2],
    ] as const) {
      const e = entry(j, i);
      const m = 1 + i * 2 ** j;
      // direct linearised iteration: z_{t+1} = 2 Z z_t (A), B_{t+1} = 2 Z B_t + 1 (c units)
      let ar = 1,
        ai = 0,
        br = 0,
        bi = 0,
        minNorm = Infinity,
        minAt = 0;
      for (let t = 0; t < table.skip[e]!; t++) {
        const zr = 2 * re[m + t]!,
          zi = 2 * im[m + t]!;
        [ar, ai] = [zr * ar - zi * ai, zr * ai + zi * ar];
        [br, bi] = [zr * br - zi * bi + 1, zr * bi + zi * br];
        // the iterates passed over, t + 1 < l (the landing iterate is tested after the skip)
        const n2 = re[m + t + 1]! ** 2 + im[m + t + 1]! ** 2;
        if (t + 1 < table.skip[e]! && n2 < minNorm) {
          minNorm = n2;
          minAt = t + 1;
        }
      }
      // same operations in a different association: agree to rounding growth (1e-10 relative)
      expect(Math.hypot(table.aRe[e]! - ar, table.aIm[e]! - ai) / Math.hypot(ar, ai)).toBeLessThan(1e-10);
      const tb = 2 ** table.bExp[e]!;
      expect(Math.hypot(table.bRe[e]! * tb - br, table.bIm[e]! * tb - bi) / Math.hypot(br, bi)).toBeLessThan(1e-10);
      expect(Math.max(Math.abs(table.bRe[e]!), Math.abs(table.bIm[e]!))).toBeGreaterThanOrEqual(0.5);
      expect(Math.max(Math.abs(table.bRe[e]!), Math.abs(table.bIm[e]!))).toBeLessThan(1);
      expect(table.minNorm[e]).toBe(minNorm);
      expect(table.minAt[e]).toBe(minAt);
    }
  });

  it('validity radii never grow when merging and are never NaN', () => {
    for (let j = 1; j < table.levels; j++) {
      for (let i = 0; i < table.counts[j]!; i++) {
        const e = entry(j, i);
        expect(table.logRadius[e]).toBeLessThanOrEqual(table.logRadius[entry(j - 1, 2 * i)]!);
        expect(Number.isNaN(table.logRadius[e])).toBe(false);
      }
    }
  });

  it('an applied entry reproduces exact perturbation to about eps (2^-40) for |z| below its radius', () => {
    const { re, im } = orbit;
    let worst = 0;
    for (const m of [1, 33, 257, 1025, 1026]) {
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
    expect(findBla(table, 0, -Infinity, 100)).toBe(-1);
    const e = findBla(table, 1, -Infinity, 100);
    expect(table.skip[e]).toBeLessThanOrEqual(100);
    // the longest entry from m = 1 within 100 steps whose radius is not 0
    let best = 0;
    for (let j = 0; j < table.levels; j++) {
      const k = entry(j, 0);
      if (table.skip[k]! <= 100 && table.logRadius[k]! > -Infinity) best = Math.max(best, table.skip[k]!);
    }
    expect(best).toBeGreaterThan(8);
    expect(table.skip[e]).toBe(best);
    const huge = findBla(table, 1, 1000, 100);
    expect(huge).toBe(-1);
    // at m = 1 + 3 * 16 only levels up to 4 are aligned
    const e2 = findBla(table, 49, -Infinity, 3000);
    expect(table.skip[e2]).toBeLessThanOrEqual(16);
  });
});
