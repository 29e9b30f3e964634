import { describe, expect, it } from 'vitest';
import { findJuliaCycle } from '../../src/dynamic/julia-cycle.js';
import { juliaTrap } from '../../src/dynamic/julia-trap.js';
import { createJuliaSampleSet, sampleJulia, type JuliaSampleSet } from '../../src/dynamic/sample-julia.js';
import { fixedPoints } from '../../src/dynamic/fixed-points.js';
import { dynamicRay } from '../../src/dynamic/dynamic-ray.js';
import { cardioidPoint, GOLDEN_MEAN } from '../../src/view/julia-sheet.js';

const R = 65536;
/** The rabbit: the period-3 nucleus with positive imaginary part, a root of c^3 + 2c^2 + c + 1 (docs/checks "period-3 nuclei"; OEIS A060006). */
const RABBIT = [-0.12256116687665361998, 0.74486176661974423659] as const;

function grid(cRe: number, cIm: number, lo: number, hi: number, n: number, iterations: number): { set: JuliaSampleSet; xs: Float64Array; ys: Float64Array; h: number } {
  const h = (hi - lo) / n;
  const xs = new Float64Array(n * n);
  const ys = new Float64Array(n * n);
  for (let j = 0; j < n; j++)
    for (let i = 0; i < n; i++) {
      xs[j * n + i] = lo + (i + 0.5) * h;
      ys[j * n + i] = lo + (j + 0.5) * h;
    }
  const set = sample(cRe, cIm, xs, ys, iterations);
  return { set, xs, ys, h };
}

function sample(cRe: number, cIm: number, xs: Float64Array, ys: Float64Array, iterations: number, cycle = findJuliaCycle(cRe, cIm)): JuliaSampleSet {
  const trap = juliaTrap(cycle, cRe, cIm, R);
  const set = createJuliaSampleSet(xs.length);
  return sampleJulia(xs, ys, xs.length, { cRe, cIm, maxIterations: iterations, escapeRadius: R }, trap, set);
}

function count(set: JuliaSampleSet, pred: (period: number) => boolean): number {
  let n = 0;
  for (const p of set.period) if (pred(p)) n++;
  return n;
}

/**
 * The class partition is the one the issue defines (f^{mP}(z) -> w_j): so
 * class(f(z)) = class(z) + 1 mod P for every interior z. The kernel never
 * sees f(z) and z together, so this holds only if the partition is right.
 */
function expectShiftInvariant(cRe: number, cIm: number, set: JuliaSampleSet, xs: Float64Array, ys: Float64Array, iterations: number): number {
  const fx = new Float64Array(xs.length),
    fy = new Float64Array(xs.length);
  for (let k = 0; k < xs.length; k++) {
    fx[k] = xs[k]! * xs[k]! - ys[k]! * ys[k]! + cRe;
    fy[k] = 2 * xs[k]! * ys[k]! + cIm;
  }
  const image = sample(cRe, cIm, fx, fy, iterations);
  let checked = 0;
  for (let k = 0; k < xs.length; k++) {
    const P = set.period[k]!;
    if (P <= 0 || image.period[k]! <= 0) continue;
    expect((set.basin[k]! + 1) % P).toBe(image.basin[k]!);
    checked++;
  }
  return checked;
}

describe('sampleJulia: interiors against exact facts', () => {
  it('c = 0: the filled Julia set is the closed unit disk, interior area pi within 2 pi h (exact)', () => {
    const { set, h } = grid(0, 0, -1.25, 1.25, 500, 2000);
    const area = count(set, (p) => p > 0) * h * h;
    // A pixel is misjudged only if its cell meets the unit circle: those cells cover at most 2 pi * (sqrt(2) h) area.
    expect(Math.abs(area - Math.PI)).toBeLessThan(2 * Math.PI * Math.SQRT2 * h);
    expect(count(set, (p) => p > 1)).toBe(0);
  });

  it('c = -2: no interior, and every sample farther than 0.01 from the segment [-2, 2] escapes (Chebyshev conjugacy)', () => {
    const { set, xs, ys } = grid(-2, 0, -2.5, 2.5, 201, 2000);
    expect(count(set, (p) => p > 0)).toBe(0);
    for (let k = 0; k < xs.length; k++) {
      const x = xs[k]!,
        y = ys[k]!;
      const dx = Math.max(0, Math.abs(x) - 2);
      if (Math.hypot(dx, y) > 0.01) expect(set.period[k]).toBe(0);
    }
  });

  it('c = -1 (basilica): the cycle is {0, -1} (exact), every interior sample has period 2, 0 and -1 are in different classes', () => {
    const cycle = findJuliaCycle(-1, 0);
    expect(cycle.kind).toBe('attracting');
    expect(cycle.period).toBe(2);
    expect(Math.abs(cycle.pointsRe[0]!) + Math.abs(cycle.pointsIm[0]!)).toBeLessThan(1e-12);
    expect(Math.abs(cycle.pointsRe[1]! + 1) + Math.abs(cycle.pointsIm[1]!)).toBeLessThan(1e-12);
    const { set, xs, ys } = grid(-1, 0, -1.8, 1.8, 240, 2000);
    expect(count(set, (p) => p > 0)).toBeGreaterThan(1000);
    expect(count(set, (p) => p > 0 && p !== 2)).toBe(0);
    const pts = sample(-1, 0, new Float64Array([0, -1]), new Float64Array([0, 0]), 100);
    expect([...pts.period]).toEqual([2, 2]);
    expect(pts.basin[0]).toBe(0);
    expect(pts.basin[1]).toBe(1);
    expect(expectShiftInvariant(-1, 0, set, xs, ys, 2000)).toBeGreaterThan(1000);
  });

  it('c = i: the critical orbit is strictly preperiodic (0, i, -1+i, -i, -1+i, ...), so no interior: a dendrite', () => {
    const cycle = findJuliaCycle(0, 1);
    expect(cycle.kind).toBe('none');
    expect(cycle.period).toBe(2);
    // The 2-cycle {-1+i, -i} (exact orbit) with multiplier 4 (-1+i)(-i) = 4 + 4i, |4 + 4i| = 4 sqrt 2 (exact algebra).
    const pts = cycle.pointsRe.map((re, j) => [re, cycle.pointsIm[j]!]).sort((a, b) => a[0]! - b[0]!);
    expect(pts[0]![0]).toBeCloseTo(-1, 12);
    expect(pts[0]![1]).toBeCloseTo(1, 12);
    expect(pts[1]![0]).toBeCloseTo(0, 12);
    expect(pts[1]![1]).toBeCloseTo(-1, 12);
    expect(Math.hypot(cycle.multiplierRe, cycle.multiplierIm)).toBeCloseTo(4 * Math.SQRT2, 9);
    const { set } = grid(0, 1, -1.6, 1.6, 200, 2000);
    expect(count(set, (p) => p > 0)).toBe(0);
  });

  it('the rabbit: period 3 everywhere inside, classes shift under f, and all three classes meet at alpha', () => {
    const [cRe, cIm] = RABBIT;
    const cycle = findJuliaCycle(cRe, cIm);
    expect(cycle.kind).toBe('attracting');
    expect(cycle.period).toBe(3);
    // At the nucleus the cycle is the critical orbit 0 -> c -> c^2 + c (superattracting, multiplier 0).
    expect(Math.hypot(cycle.pointsRe[0]!, cycle.pointsIm[0]!)).toBeLessThan(1e-12);
    expect(Math.hypot(cycle.pointsRe[1]! - cRe, cycle.pointsIm[1]! - cIm)).toBeLessThan(1e-12);
    expect(Math.hypot(cycle.multiplierRe, cycle.multiplierIm)).toBeLessThan(1e-10);
    const { set, xs, ys } = grid(cRe, cIm, -1.6, 1.6, 240, 2000);
    expect(count(set, (p) => p > 0)).toBeGreaterThan(1000);
    expect(count(set, (p) => p > 0 && p !== 3)).toBe(0);
    expect(expectShiftInvariant(cRe, cIm, set, xs, ys, 2000)).toBeGreaterThan(1000);
    // A small circle about alpha = (1 - sqrt(1 - 4c)) / 2 (Milnor) meets the three immediate basins.
    const f = fixedPoints(cRe, cIm);
    const n = 720;
    const cx = new Float64Array(n),
      cy = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      cx[k] = f.alphaRe + 0.004 * Math.cos((2 * Math.PI * k) / n);
      cy[k] = f.alphaIm + 0.004 * Math.sin((2 * Math.PI * k) / n);
    }
    const ring = sample(cRe, cIm, cx, cy, 20000);
    expect(new Set([...ring.basin].filter((b) => b >= 0))).toEqual(new Set([0, 1, 2]));
  });

  it('the rabbit: the dynamic rays 1/7, 2/7, 4/7 land at alpha, the ray 0 at beta (Douady-Hubbard; Milnor)', () => {
    const [cRe, cIm] = RABBIT;
    const f = fixedPoints(cRe, cIm);
    const rate = Math.hypot(2 * f.alphaRe, 2 * f.alphaIm) ** 15;
    for (const num of [1, 2, 4]) {
      const d = [20, 35, 50].map((depth) => {
        const ray = dynamicRay(cRe, cIm, num, 7, { depth, sharpness: 8, radius: 256 });
        return Math.hypot(ray[ray.length - 2]! - f.alphaRe, ray[ray.length - 1]! - f.alphaIm);
      });
      // Near a repelling fixed point the ray contracts toward it by |f'(alpha)| = |2 alpha| per level
      // (f^-1 is a contraction there): 15 levels give a factor |2 alpha|^15 (about 4.6 here) each time.
      expect(d[0]! / d[1]! / rate).toBeGreaterThan(0.8);
      expect(d[0]! / d[1]! / rate).toBeLessThan(1.25);
      expect(d[1]! / d[2]! / rate).toBeGreaterThan(0.8);
      expect(d[1]! / d[2]! / rate).toBeLessThan(1.25);
      expect(d[2]!).toBeLessThan(0.01);
    }
    const zero = dynamicRay(cRe, cIm, 0, 1, { depth: 40, sharpness: 8, radius: 256 });
    expect(Math.hypot(zero[zero.length - 2]! - f.betaRe, zero[zero.length - 1]! - f.betaIm)).toBeLessThan(1e-6);
  });

  it('parabolic c = 1/4: interior of period 1; the real slice of the filled Julia set is [-1/2, 1/2] (beta = 1/2)', () => {
    const cycle = findJuliaCycle(0.25, 0);
    expect(cycle.kind).toBe('parabolic');
    expect(cycle.basinPeriod).toBe(1);
    const xs = new Float64Array(101),
      ys = new Float64Array(101);
    for (let k = 0; k < 101; k++) xs[k] = -0.7 + 0.014 * k;
    const s = sample(0.25, 0, xs, ys, 200000, cycle);
    for (let k = 0; k < 101; k++) {
      const x = xs[k]!;
      if (Math.abs(x) < 0.49) expect(s.period[k], `x = ${x}`).toBe(1);
      if (Math.abs(x) > 0.51) expect(s.period[k], `x = ${x}`).toBe(0);
    }
    const { set } = grid(0.25, 0, -1.6, 1.6, 160, 4000);
    expect(count(set, (p) => p > 0)).toBeGreaterThan(1000);
    expect(count(set, (p) => p > 1)).toBe(0);
  });

  it('parabolic c = -3/4: interior of period 2 (two petals at alpha = -1/2), classes shift under f', () => {
    const cycle = findJuliaCycle(-0.75, 0);
    expect(cycle.kind).toBe('parabolic');
    expect(cycle.period).toBe(1);
    expect(cycle.basinPeriod).toBe(2);
    expect(cycle.pointsRe[0]).toBeCloseTo(-0.5, 6);
    const { set, xs, ys } = grid(-0.75, 0, -1.6, 1.6, 160, 4000);
    expect(count(set, (p) => p > 0)).toBeGreaterThan(1000);
    expect(count(set, (p) => p > 0 && p !== 2)).toBe(0);
    expect(expectShiftInvariant(-0.75, 0, set, xs, ys, 4000)).toBeGreaterThan(1000);
  });

  it('cardioid angle 1/3: c = -1/8 + (3 sqrt 3 / 8) i (docs/checks: root of the period-3 bulb), alpha has 3 petals', () => {
    const p = cardioidPoint(1, 3);
    expect(p.cRe).toBeCloseTo(-1 / 8, 15);
    expect(p.cIm).toBeCloseTo((3 * Math.sqrt(3)) / 8, 15);
    const cycle = findJuliaCycle(p.cRe, p.cIm, { parabolic: { wRe: p.mRe / 2, wIm: p.mIm / 2, s: 1, q: 3 } });
    const { set, xs, ys } = grid(p.cRe, p.cIm, -1.6, 1.6, 160, 6000);
    expect(count(set, (q) => q > 0)).toBeGreaterThan(1000);
    expect(count(set, (q) => q > 0 && q !== 3)).toBe(0);
    expect(expectShiftInvariant(p.cRe, p.cIm, set, xs, ys, 6000)).toBeGreaterThan(1000);
    // The same c found from the critical orbit names the same rotation.
    const found = findJuliaCycle(p.cRe, p.cIm);
    expect(found.kind).toBe('parabolic');
    expect(found.rotation).toEqual({ s: 1, q: 3 });
    void cycle;
  });

  it('c outside the set (0.3): the critical orbit escapes, no interior (Cantor dust)', () => {
    expect(findJuliaCycle(0.3, 0).kind).toBe('none');
    const { set } = grid(0.3, 0, -1.6, 1.6, 100, 2000);
    expect(count(set, (p) => p > 0)).toBe(0);
  });

  it('golden-mean Siegel disk: alpha = m/2 is fixed with multiplier m, |m| = 1 (exact algebra); orbits near alpha recur; the disk renders as interior rings', () => {
    const p = cardioidPoint(0, 0);
    expect(Math.hypot(p.mRe, p.mIm)).toBeCloseTo(1, 15);
    expect(Math.atan2(p.mIm, p.mRe) / (2 * Math.PI) + 1).toBeCloseTo(GOLDEN_MEAN, 14);
    // c = m/2 - m^2/4 with m = e^(2 pi i theta), theta = (sqrt 5 - 1)/2 (the main cardioid formula,
    // docs/checks.md; exact algebra), evaluated here apart from cardioidPoint: -0.3905408702 - 0.5867879073 i.
    const th = 2 * Math.PI * ((Math.sqrt(5) - 1) / 2);
    expect(p.cRe).toBeCloseTo(Math.cos(th) / 2 - Math.cos(2 * th) / 4, 14);
    expect(p.cIm).toBeCloseTo(Math.sin(th) / 2 - Math.sin(2 * th) / 4, 14);
    const aRe = p.mRe / 2,
      aIm = p.mIm / 2;
    expect(aRe * aRe - aIm * aIm + p.cRe).toBeCloseTo(aRe, 15);
    expect(2 * aRe * aIm + p.cIm).toBeCloseTo(aIm, 15);
    const cycle = findJuliaCycle(p.cRe, p.cIm, { siegel: { wRe: aRe, wIm: aIm, name: 'golden mean' } });
    expect(cycle.kind).toBe('siegel');
    // Along a ray from alpha the orbit's mean distance grows with the start's distance: nested invariant curves.
    const n = 12;
    const xs = new Float64Array(n),
      ys = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      xs[k] = aRe + 0.01 * (k + 1);
      ys[k] = aIm;
    }
    const s = sample(p.cRe, p.cIm, xs, ys, 20000, cycle);
    for (let k = 0; k < n; k++) {
      expect(s.period[k]).toBe(1);
      expect(s.basin[k]).toBe(0);
      if (k > 0) expect(s.smooth[k]!).toBeGreaterThan(s.smooth[k - 1]!);
    }
    // Recurrence: from |u| = 0.02 the orbit neither converges to alpha nor leaves (Siegel: conjugate to a rotation).
    let x = aRe + 0.02,
      y = aIm,
      lo = Infinity,
      hi = 0;
    for (let k = 0; k < 100000; k++) {
      const u = x * x - y * y + p.cRe;
      y = 2 * x * y + p.cIm;
      x = u;
      const d = Math.hypot(x - aRe, y - aIm);
      lo = Math.min(lo, d);
      hi = Math.max(hi, d);
    }
    expect(lo).toBeGreaterThan(0.005);
    expect(hi).toBeLessThan(0.08);
  });
});
