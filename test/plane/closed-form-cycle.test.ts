import { describe, expect, it } from 'vitest';
import { attractingCycle, createCycleResult } from '../../src/plane/attracting-cycle.js';
import { closedFormCycle, outsideMainCardioid } from '../../src/plane/closed-form-cycle.js';

/** c = m/2 - m^2/4 for a multiplier m = r e^{i t} (main cardioid formula, docs/checks.md). */
function cardioidPoint(r: number, t: number): [number, number] {
  const mr = r * Math.cos(t),
    mi = r * Math.sin(t);
  return [mr / 2 - (mr * mr - mi * mi) / 4, mi / 2 - (mr * mi) / 2];
}

/** c = -1 + m/4 for a multiplier m = r e^{i t} (period-2 disk, multiplier 4(c + 1), docs/checks.md). */
function diskPoint(r: number, t: number): [number, number] {
  return [-1 + (r * Math.cos(t)) / 4, (r * Math.sin(t)) / 4];
}

const ANGLES = Array.from({ length: 24 }, (_, k) => (2 * Math.PI * (k + 0.5)) / 24);

describe('closedFormCycle', () => {
  it('closedFormCycle(c = m/2 - m^2/4, |m| = 0.98) returns period 1, multiplier m and fixed point m/2', () => {
    const out = createCycleResult();
    for (const t of ANGLES) {
      const [a, b] = cardioidPoint(0.98, t);
      expect(closedFormCycle(a, b, out)).toBe(1);
      // m is recovered from c through a square root: 1e-14 allows a few ulps.
      expect(out.mulRe).toBeCloseTo(0.98 * Math.cos(t), 14);
      expect(out.mulIm).toBeCloseTo(0.98 * Math.sin(t), 14);
      expect(out.wRe * out.wRe - out.wIm * out.wIm + a - out.wRe).toBeCloseTo(0, 15);
      expect(2 * out.wRe * out.wIm + b - out.wIm).toBeCloseTo(0, 15);
    }
  });

  it('closedFormCycle(c = m/2 - m^2/4, |m| = 1.02, m away from 1) does not return period 1', () => {
    // |m| > 1 and |2 - m| > 1 (m and 2 - m give the same c), which holds for arg m > 0.14.
    const out = createCycleResult();
    for (const t of ANGLES.filter((t) => t > 0.2 && t < 2 * Math.PI - 0.2)) {
      const [a, b] = cardioidPoint(1.02, t);
      expect(closedFormCycle(a, b, out)).not.toBe(1);
    }
  });

  it('closedFormCycle(c = -1 + m/4, |m| = 0.98) returns period 2 with multiplier 4(c + 1) and a true 2-cycle point', () => {
    const out = createCycleResult();
    for (const t of ANGLES) {
      const [a, b] = diskPoint(0.98, t);
      expect(closedFormCycle(a, b, out)).toBe(2);
      expect(out.mulRe).toBe(4 * (a + 1));
      expect(out.mulIm).toBe(4 * b);
      const z1r = out.wRe * out.wRe - out.wIm * out.wIm + a,
        z1i = 2 * out.wRe * out.wIm + b;
      const z2r = z1r * z1r - z1i * z1i + a,
        z2i = 2 * z1r * z1i + b;
      expect(Math.hypot(z2r - out.wRe, z2i - out.wIm)).toBeLessThan(1e-14);
      expect(Math.hypot(z1r - out.wRe, z1i - out.wIm)).toBeGreaterThan(0.1);
    }
  });

  it('closedFormCycle(c = -1 + m/4, |m| = 1.02) does not return period 2', () => {
    const out = createCycleResult();
    for (const t of ANGLES) {
      const [a, b] = diskPoint(1.02, t);
      expect(closedFormCycle(a, b, out)).not.toBe(2);
    }
  });

  it('closedFormCycle agrees with Newton (attractingCycle) on the multiplier inside both components', () => {
    const out = createCycleResult(),
      newton = createCycleResult();
    for (const t of ANGLES) {
      for (const [[a, b], p] of [
        [cardioidPoint(0.6, t), 1],
        [diskPoint(0.6, t), 2],
      ] as const) {
        expect(closedFormCycle(a, b, out)).toBe(p);
        attractingCycle(a, b, p, out.wRe + 0.01, out.wIm - 0.01, newton);
        expect(newton.ok).toBe(true);
        expect(newton.mulRe).toBeCloseTo(out.mulRe, 13);
        expect(newton.mulIm).toBeCloseTo(out.mulIm, 13);
      }
    }
  });

  it('closedFormCycle leaves the parabolic points 1/4, -3/4, -5/4 and points outside to the iteration (returns 0)', () => {
    // Exact algebra: m = 1 at c = 1/4; m = -1 at c = -3/4 (and 4(c + 1) = 1); 4(c + 1) = -1 at c = -5/4.
    const out = createCycleResult();
    for (const [a, b] of [
      [0.25, 0],
      [-0.75, 0],
      [-1.25, 0],
      [0.3, 0],
      [-2, 0],
      [0, 1],
      [-0.12256116687665362, 0.7448617666197442],
    ]) {
      expect(closedFormCycle(a!, b!, out)).toBe(0);
    }
  });

  it('closedFormCycle(conjugate c) gives the conjugate cycle and multiplier bit for bit', () => {
    const u = createCycleResult(),
      v = createCycleResult();
    for (const t of ANGLES) {
      for (const [a, b] of [cardioidPoint(0.7, t), diskPoint(0.7, t)]) {
        expect(closedFormCycle(a, -b, v)).toBe(closedFormCycle(a, b, u));
        expect([v.wRe, v.mulRe]).toEqual([u.wRe, u.mulRe]);
        expect([v.wIm, v.mulIm]).toEqual([-u.wIm, -u.mulIm]);
      }
    }
  });
});

describe('outsideMainCardioid', () => {
  it('is false on and inside the cardioid c = m/2 - m^2/4, |m| <= 1, and true beyond it by more than the margin', () => {
    // the boundary |m| = 1 and the interior |m| = 0.5 (exact algebra: the fixed point m/2 has multiplier m)
    for (let k = 0; k < 64; k++) {
      const t = (2 * Math.PI * k) / 64;
      for (const r of [1, 0.5]) {
        const mr = r * Math.cos(t),
          mi = r * Math.sin(t);
        const cr = mr / 2 - (mr * mr - mi * mi) / 4,
          ci = mi / 2 - (2 * mr * mi) / 4;
        expect(outsideMainCardioid(cr, ci, 2 ** -30)).toBe(false);
      }
      // |m| = 1.01: outside when the other fixed point (multiplier 2 - m) repels too
      const mr = 1.01 * Math.cos(t),
        mi = 1.01 * Math.sin(t);
      if (Math.hypot(2 - mr, mi) > 1.01) expect(outsideMainCardioid(mr / 2 - (mr * mr - mi * mi) / 4, mi / 2 - (2 * mr * mi) / 4, 2 ** -30)).toBe(true);
    }
    // c = i (Misiurewicz, preperiodic) and c = 0.3 (beyond the cusp at 1/4) are outside; c = 0 inside
    expect(outsideMainCardioid(0, 1, 2 ** -30)).toBe(true);
    expect(outsideMainCardioid(0.3, 0, 2 ** -30)).toBe(true);
    expect(outsideMainCardioid(0, 0, 2 ** -30)).toBe(false);
  });
});
