import { describe, expect, it } from 'vitest';
import { parameterRay, RAY_MAX_DEPTH } from '../../src/figure/parameter-rays.js';

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

// The done-when view of issue 11: span 3 at the default plate width (1200) and at 2000 pixels across.
const PIXELS = [3 / 1200, 3 / 2000];

describe('parameterRay', () => {
  for (const [angle, re, im, kind] of EXACT) {
    it(`${angle} lands at ${re} + ${im.toFixed(6)} i (Newton), and every traced point lies outside the set`, () => {
      const ray = parameterRay(angle, 'rays', PIXELS[0]!);
      expect(ray.kind).toBe(kind);
      // to the double rounding of the exact value (the 20 printed digits come from Newton in fixed point)
      expect(Math.abs(Number(ray.landing.re) - re)).toBeLessThan(1e-15);
      expect(Math.abs(Number(ray.landing.im) - im)).toBeLessThan(1e-15);
      const n = ray.points.length / 2;
      expect(ray.points[2 * n - 2]).toBe(Number(ray.landing.re));
      // a ray is made of points of positive potential: each traced point escapes (the last one is the landing);
      // a point of level k escapes after about k iterations, so the limit is above the traced depth
      const limit = ray.tracedDepth + 100;
      for (let k = 0; k < n - 1; k++) expect(escapeTime(ray.points[2 * k]!, ray.points[2 * k + 1]!, limit), `point ${k}`).toBeLessThan(Infinity);
      // the landing itself does not escape (a root or a Misiurewicz point lies in the set)
      expect(escapeTime(re, im, 10 * limit)).toBe(Infinity);
    });

    for (const pixel of PIXELS) {
      it(`${angle}: the traced part (before the joining segment) ends within one pixel of the exact landing at pixel ${pixel}`, () => {
        const ray = parameterRay(angle, 'rays', pixel);
        expect(ray.stop).toBe('close');
        // exact landing from algebra (EXACT above); the tracer aims at half a pixel of the Newton landing
        expect(Math.hypot(ray.tracedEnd.re - re, ray.tracedEnd.im - im) / pixel).toBeLessThan(1);
        // the drawn polyline: its second-to-last point is the traced end, so the joining segment is under a pixel
        const n = ray.points.length / 2;
        expect(ray.points[2 * n - 4]).toBe(ray.tracedEnd.re);
        expect(ray.points[2 * n - 3]).toBe(ray.tracedEnd.im);
      });
    }
  }

  it('comes within 1e-12 of a Misiurewicz landing by 50 levels (geometric approach), but a parabolic root takes thousands (about 3.14/depth for 1/3)', () => {
    const mis = parameterRay('1/6', 'rays', 1e-12);
    expect(mis.tracedDepth).toBe(50);
    expect(Math.hypot(mis.tracedEnd.re - 0, mis.tracedEnd.im - 1)).toBeLessThan(1e-12);
    const root = parameterRay('1/3', 'rays', PIXELS[1]!);
    const d = Math.hypot(root.tracedEnd.re + 0.75, root.tracedEnd.im);
    // 1/depth closing: half a pixel of 0.0015 needs depth near 3.14 / 0.00075 = 4190
    expect(root.tracedDepth).toBeGreaterThan(2000);
    expect(d * root.tracedDepth).toBeGreaterThan(2);
    expect(d * root.tracedDepth).toBeLessThan(5);
  });

  it('keeps points past level 50 a quarter pixel apart (thousands of levels, a few hundred points)', () => {
    const pixel = PIXELS[1]!;
    const ray = parameterRay('1/3', 'rays', pixel);
    const n = ray.points.length / 2;
    // 1 point on the circle, 8 per level for 50 levels, then thinned points, the traced end and the landing
    const head = 1 + 50 * 8;
    expect(n).toBeLessThan(ray.tracedDepth / 4);
    for (let k = head; k < n - 2; k++) {
      const gap = Math.hypot(ray.points[2 * k]! - ray.points[2 * k - 2]!, ray.points[2 * k + 1]! - ray.points[2 * k - 1]!);
      expect(gap, `point ${k}`).toBeGreaterThanOrEqual(pixel / 4);
    }
  });

  it('stops at RAY_MAX_DEPTH levels when the pixel is too small to reach', () => {
    const ray = parameterRay('1/3', 'rays', 1e-9);
    expect(ray.stop).toBe('depth');
    expect(ray.tracedDepth).toBe(RAY_MAX_DEPTH);
  }, 30_000);
});
