import { describe, expect, it } from 'vitest';
import { attractingCycle, createCycleResult, reduceCyclePeriod } from '../../src/plane/attracting-cycle.js';

/** z -> z^2 + c applied p times, for checking cycle points by direct iteration. */
function iterate(cRe: number, cIm: number, zRe: number, zIm: number, p: number): [number, number] {
  for (let j = 0; j < p; j++) [zRe, zIm] = [zRe * zRe - zIm * zIm + cRe, 2 * zRe * zIm + cIm];
  return [zRe, zIm];
}

// Period-3 nuclei: roots of c^3 + 2c^2 + c + 1 = 0 (exact polynomial; the
// real root is -rho^2 with rho the plastic number, OEIS A060006), digits as in
// docs/checks.md.
const NUCLEI3: [number, number][] = [
  [-1.75487766624669276, 0],
  [-0.12256116687665361998, 0.74486176661974423659],
  [-0.12256116687665361998, -0.74486176661974423659],
];

describe('attractingCycle', () => {
  it('attractingCycle(period-3 nucleus, p = 3, guess c) converges to a 3-cycle point with multiplier ~ 0', () => {
    for (const [a, b] of NUCLEI3) {
      const r = attractingCycle(a, b, 3, a, b);
      expect(r.converged).toBe(true);
      expect(r.ok).toBe(true);
      // At a nucleus the cycle passes through the critical point 0, so the
      // multiplier 2^p * prod z_j is 0 exactly; doubles leave ~1e-15.
      expect(Math.hypot(r.mulRe, r.mulIm)).toBeLessThan(1e-12);
      const [x, y] = iterate(a, b, r.wRe, r.wIm, 3);
      expect(Math.hypot(x - r.wRe, y - r.wIm)).toBeLessThan(1e-14);
    }
  });

  it('attractingCycle(c = m/2 - m^2/4, p = 1) returns the multiplier m (main cardioid formula, docs/checks.md)', () => {
    for (const [mr, mi] of [
      [0.5, 0],
      [0.3, -0.6],
      [-0.9, 0.1],
      [0.05, 0.95],
      [-0.2, -0.2],
    ] as const) {
      const cRe = mr / 2 - (mr * mr - mi * mi) / 4,
        cIm = mi / 2 - (2 * mr * mi) / 4;
      const r = attractingCycle(cRe, cIm, 1, 0, 0);
      expect(r.ok).toBe(true);
      // Newton vs formula; 1e-13 covers rounding of c and a few ulps of Newton.
      expect(r.mulRe).toBeCloseTo(mr, 13);
      expect(r.mulIm).toBeCloseTo(mi, 13);
    }
  });

  it('attractingCycle(c = 0.5 outside M, p = 1) converges to a repelling fixed point and reports ok = false', () => {
    // Fixed points of z^2 + 1/2: w = (1 +/- i)/2, |2w| = sqrt(2) > 1 (exact algebra).
    const r = attractingCycle(0.5, 0, 1, 0.4, 0.4);
    expect(r.converged).toBe(true);
    expect(r.ok).toBe(false);
    expect(Math.hypot(r.mulRe, r.mulIm)).toBeCloseTo(Math.SQRT2, 12);
  });

  it('attractingCycle(c = i, p = 2) finds the repelling 2-cycle {-1+i, -i} of the Misiurewicz point and rejects it', () => {
    // Orbit of 0 under z^2 + i: i, -1+i, -i, -1+i, ... (docs/checks.md); multiplier
    // 4 (-1+i)(-i) = 4 + 4i, modulus 4 sqrt 2 (exact algebra).
    const r = attractingCycle(0, 1, 2, -1, 1);
    expect(r.converged).toBe(true);
    expect(r.ok).toBe(false);
    expect(r.mulRe).toBeCloseTo(4, 12);
    expect(r.mulIm).toBeCloseTo(4, 12);
  });

  it('attractingCycle writes into the out object it is given and returns it', () => {
    const out = createCycleResult();
    expect(attractingCycle(-1, 0, 2, 0.1, 0, out)).toBe(out);
    expect(out.ok).toBe(true);
  });
});

describe('reduceCyclePeriod', () => {
  it('reduceCyclePeriod(period-3 nucleus, cycle found as period 6) returns 3 and the F^3 multiplier', () => {
    const [a, b] = NUCLEI3[1]!;
    const cycle = attractingCycle(a, b, 6, a, b);
    expect(cycle.ok).toBe(true);
    expect(reduceCyclePeriod(a, b, 6, cycle)).toBe(3);
    expect(Math.hypot(cycle.mulRe, cycle.mulIm)).toBeLessThan(1e-12);
  });

  it('reduceCyclePeriod(c = -1, cycle found as period 4) returns 2, not 1 (the fixed points of z^2 - 1 repel)', () => {
    // c = -1: fixed points (1 +/- sqrt 5)/2 have |2w| > 1; the 2-cycle {0, -1} is superattracting.
    const cycle = attractingCycle(-1, 0, 4, 0.05, 0);
    expect(cycle.ok).toBe(true);
    expect(reduceCyclePeriod(-1, 0, 4, cycle)).toBe(2);
  });

  it('reduceCyclePeriod keeps a prime period as it is', () => {
    const [a, b] = NUCLEI3[0]!;
    const cycle = attractingCycle(a, b, 3, 0, 0);
    expect(reduceCyclePeriod(a, b, 3, cycle)).toBe(3);
  });
});
