import { describe, expect, it } from 'vitest';
import { parameterRay } from '../../src/figure/parameter-rays.js';

/** Iterations of z -> z^2 + c from 0 until |z| > 2, or Infinity within `limit`. */
function escapeTime(cr: number, ci: number, limit: number): number {
  let zr = 0;
  let zi = 0;
  for (let n = 1; n <= limit; n++) {
    const t = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = t;
    if (zr * zr + zi * zi > 4) return n;
  }
  return Infinity;
}

// Exact landing points. 1/3, 2/3: the root c = -3/4 of the period-2 disk (1/3 -> 2/3 -> 1/3 has period 2).
// 1/7, 2/7: the root of the period-3 bulb on the cardioid at internal angle 1/3, c = m/2 - m^2/4 with
// m = e^{2 pi i/3} (cardioid formula; docs/methods.md C3), = -1/8 + (3 sqrt 3 / 8) i.
// 1/6: preperiod 1, period 2, lands at the Misiurewicz point c = i (0 -> i -> -1+i -> -i -> -1+i).
const EXACT: Array<[string, number, number, string]> = [
  ['1/3', -0.75, 0, 'root'],
  ['2/3', -0.75, 0, 'root'],
  ['1/7', -1 / 8, (3 * Math.sqrt(3)) / 8, 'root'],
  ['2/7', -1 / 8, (3 * Math.sqrt(3)) / 8, 'root'],
  ['1/6', 0, 1, 'misiurewicz'],
];

describe('parameterRay', () => {
  for (const [angle, re, im, kind] of EXACT) {
    it(`${angle} lands at ${re} + ${im.toFixed(6)} i (Newton), and every traced point lies outside the set`, () => {
      const ray = parameterRay(angle, 'rays');
      expect(ray.kind).toBe(kind);
      // to the double rounding of the exact value (the 20 printed digits come from Newton in fixed point)
      expect(Math.abs(Number(ray.landing.re) - re)).toBeLessThan(1e-15);
      expect(Math.abs(Number(ray.landing.im) - im)).toBeLessThan(1e-15);
      const n = ray.points.length / 2;
      expect(ray.points[2 * n - 2]).toBe(Number(ray.landing.re));
      // a ray is made of points of positive potential: each traced point escapes (the last one is the landing)
      for (let k = 0; k < n - 1; k++) expect(escapeTime(ray.points[2 * k]!, ray.points[2 * k + 1]!, 400), `point ${k}`).toBeLessThan(Infinity);
      // the landing itself does not escape (a root or a Misiurewicz point lies in the set)
      expect(escapeTime(re, im, 400)).toBe(Infinity);
    });
  }

  it('comes within 1e-12 of a Misiurewicz landing by tracing alone (geometric approach), but only to about 3/depth of a parabolic root', () => {
    const mis = parameterRay('1/6', 'rays');
    expect(Math.hypot(mis.tracedEnd.re - 0, mis.tracedEnd.im - 1)).toBeLessThan(1e-12);
    const root = parameterRay('1/3', 'rays');
    const d = Math.hypot(root.tracedEnd.re + 0.75, root.tracedEnd.im);
    expect(d).toBeGreaterThan(1e-3);
    expect(d).toBeLessThan(0.1);
  });
});
