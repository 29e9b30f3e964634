import { describe, expect, it } from 'vitest';
import { census, distinctNuclei } from '../../src/components/census.js';
import { periodicNumerators } from '../../src/components/periodic-angles.js';
import { landRays, RAY_RECORD } from '../../src/components/land-rays.js';
import { lavaursSweep } from '../../src/components/lavaurs-sweep.js';

// OEIS A000740: number of components of exact period n (also docs/methods.md C5, docs/checks.md "Counts").
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010];
// OEIS A000048: real components of exact period n (Metropolis, Stein & Stein 1973; docs/checks.md).
const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170];

/**
 * The angle pairs of the period-p components, checked against two theorems (Douady-Hubbard;
 * Milnor, "Periodic orbits, external rays and the Mandelbrot set", 2000): every angle of exact
 * period p under doubling lands at the root of exactly one period-p component, two per component
 * (the cardioid aside), so the pairs partition the exact-period-p angles; and rays landing at
 * different roots do not cross, so the arcs (lo, hi) of two pairs are nested or disjoint.
 */
function expectAnglePairs(p: number, pairs: ReadonlyArray<readonly number[]>): void {
  const den = 2 ** p - 1;
  const exactPeriod: number[] = [];
  for (let n = 0; n < den; n += 1) {
    let m = n,
      k = 0;
    do {
      m = (2 * m) % den;
      k += 1;
    } while (m !== n);
    if (k === p) exactPeriod.push(n);
  }
  const used = pairs.flat().sort((a, b) => a - b);
  expect(used, `period ${p}: the angles of all pairs`).toEqual(exactPeriod);
  const arcs = pairs.map((a) => [Math.min(...a), Math.max(...a)] as const).sort((a, b) => a[0] - b[0]);
  const open: number[] = [];
  for (const [lo, hi] of arcs) {
    while (open.length > 0 && open[open.length - 1]! < lo) open.pop();
    if (open.length > 0) expect(hi, `period ${p}: arc ${lo}..${hi} crosses one ending at ${open[open.length - 1]}`).toBeLessThan(open[open.length - 1]!);
    open.push(hi);
  }
}

describe('census', () => {
  it('census(p) finds A000740(p) components and A000048(p) real ones for p = 1..12, every one with an angle pair, none unpaired or lost', async () => {
    for (let p = 1; p <= 12; p += 1) {
      const r = await census(p);
      expect(r.components.length, `period ${p}`).toBe(A000740[p - 1]);
      expect(r.components.filter((c) => c.real).length, `real, period ${p}`).toBe(A000048[p - 1]);
      expect(r.unpaired).toBe(0);
      expect(r.raysLost).toBe(0);
      if (p > 1)
        expectAnglePairs(
          p,
          r.components.map((c) => c.angles),
        );
      // every nucleus lies in |c| <= 2 (docs/methods.md C5)
      for (const c of r.components) expect(Math.hypot(c.reHi, c.imHi)).toBeLessThanOrEqual(2);
    }
  });
  it('census(p) finds A000740(p) and A000048(p) components for p = 13..15 (4095, 8127, 16365; 315, 585, 1091), nothing unpaired or lost', async () => {
    const all = [4095, 8127, 16365]; // OEIS A000740
    const real = [315, 585, 1091]; // OEIS A000048
    for (let p = 13; p <= 15; p += 1) {
      const r = await census(p);
      expect(r.components.length, `period ${p}`).toBe(all[p - 13]);
      expect(r.components.filter((c) => c.real).length, `real, period ${p}`).toBe(real[p - 13]);
      expect(r.unpaired + r.raysLost).toBe(0);
    }
  });
  it('census(2) lands 1/3 and 2/3 on c = -1; census(3) lands 3/7 and 4/7 on the real nucleus (docs/checks.md external angles)', async () => {
    const two = (await census(2)).components;
    expect(two).toHaveLength(1);
    expect(two[0]!.angles).toEqual([1, 2]); // over 2^2 - 1 = 3
    expect(two[0]!.reHi).toBeCloseTo(-1, 14);
    const three = (await census(3)).components.filter((c) => c.real);
    expect(three[0]!.angles).toEqual([3, 4]); // over 7
    expect(three[0]!.reHi).toBeCloseTo(-1.7548776662466927, 14); // OEIS A060006: -rho^2
  });
  it('sum over d | p of N(d) = 2^(p-1) (degree of F^p(0,c); docs/methods.md C5)', async () => {
    for (const p of [6, 8, 9]) {
      let total = 0;
      for (let d = 1; d <= p; d += 1) if (p % d === 0) total += (await census(d)).components.length;
      expect(total).toBe(2 ** (p - 1));
    }
  });
  it('periodicNumerators(4, false) lists the 12 angles of exact period 4', () => {
    expect(Array.from(periodicNumerators(4, false))).toEqual([1, 2, 3, 4, 6, 7, 8, 9, 11, 12, 13, 14]);
  });
});

describe('distinctNuclei', () => {
  const p = 6;
  const den = 2 ** p - 1;
  const pairs = lavaursSweep(p);
  const keep = Array.from(pairs.lo.keys()).filter((i) => pairs.lo[i]! + pairs.hi[i]! <= den);
  const lo = Float64Array.from(keep, (i) => pairs.lo[i]!);
  const hi = Float64Array.from(keep, (i) => pairs.hi[i]!);
  const landed = landRays(p, lo, false, new Float64Array(lo.length * RAY_RECORD));
  const real = keep.findIndex((i) => pairs.lo[i]! + pairs.hi[i]! === den);
  const upper = keep.findIndex((i) => pairs.lo[i]! + pairs.hi[i]! < den);
  const upper2 = keep.findIndex((i, j) => j > upper && pairs.lo[i]! + pairs.hi[i]! < den);

  it('distinctNuclei(6, ...) on the landed rays gives A000740(6) = 27 components, A000048(6) = 5 real, no suspects', () => {
    const r = distinctNuclei(p, lo, hi, landed);
    expect(r.components()).toHaveLength(27);
    expect(r.components().filter((c) => c.real)).toHaveLength(5);
    expect(r.suspects).toEqual([]);
  });
  it('distinctNuclei flags two pairs that reached one nucleus, a lost ray, and a real pair off the axis', () => {
    const shared = landed.slice();
    shared.copyWithin(upper2 * RAY_RECORD, upper * RAY_RECORD, (upper + 1) * RAY_RECORD);
    const a = distinctNuclei(p, lo, hi, shared);
    expect(a.suspects).toEqual([upper, upper2].sort((x, y) => x - y));
    expect(a.components()).toHaveLength(25); // the nucleus and its mirror image are counted once each
    const lost = landed.slice();
    lost[upper * RAY_RECORD + 5] = 0;
    expect(distinctNuclei(p, lo, hi, lost).suspects).toEqual([upper]);
    const offAxis = landed.slice();
    offAxis[real * RAY_RECORD + 2] = 0.1;
    expect(distinctNuclei(p, lo, hi, offAxis).suspects).toEqual([real]);
  });
  it('landRays in careful mode (double-double, depth 3p) lands the period-9 rays on the same nuclei as the default mode', () => {
    const s = lavaursSweep(9);
    const nums = s.lo.subarray(0, 60);
    const a = landRays(9, nums, false, new Float64Array(nums.length * RAY_RECORD));
    const b = landRays(9, nums, true, new Float64Array(nums.length * RAY_RECORD));
    for (let i = 0; i < nums.length; i += 1) {
      const o = i * RAY_RECORD;
      expect(b[o + 5]).toBe(1);
      expect(Math.hypot(a[o]! - b[o]!, a[o + 2]! - b[o + 2]!)).toBeLessThan(1e-9 * a[o + 4]!);
    }
  });
});
