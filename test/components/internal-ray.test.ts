/**
 * Internal rays against the exact multiplier maps of the first components
 * (exact algebra): on the main cardioid the fixed point's multiplier t
 * gives c = t/2 - t^2/4, on the period-2 disk the 2-cycle's multiplier is
 * 4(c + 1), so c = -1 + t/4; a ray of internal angle theta is the image of
 * the radius t = r e^{2 pi i theta}, 0 <= r <= 1.
 */
import { describe, expect, it } from 'vitest';
import { internalRay } from '../../src/components/internal-ray.js';

/** The cardioid's inverse: t = 1 - sqrt(1 - 4c) (the branch with t = 0 at c = 0), complex doubles. */
function cardioidMultiplier(re: number, im: number): [number, number] {
  const ar = 1 - 4 * re;
  const ai = -4 * im;
  const m = Math.hypot(ar, ai);
  const sr = Math.sqrt((m + ar) / 2);
  const si = Math.sign(ai) * Math.sqrt(Math.max(0, (m - ar) / 2));
  return [1 - sr, -si];
}

function isqrt(n: bigint): bigint {
  let x = BigInt(Math.floor(Math.sqrt(Number(n))));
  for (;;) {
    const y = (x + n / x) / 2n;
    if (y >= x && y - x <= 1n) break;
    x = y;
  }
  while (x * x > n) x -= 1n;
  while ((x + 1n) * (x + 1n) <= n) x += 1n;
  return x;
}

describe('internalRay', () => {
  it('cardioid, angle 0: every point is c = r/2 - r^2/4 for a real r in [0, 1], ending at the cusp c = 1/4 (exact algebra)', () => {
    const ray = internalRay(1, 0, 0, { num: 0, den: 1 }, 64)!;
    expect(ray.end.re).toBe('0.25000000000000000000');
    expect(Number(ray.end.im)).toBe(0);
    const n = ray.points.length / 2;
    expect(n).toBe(65);
    let lastR = -1;
    for (let k = 0; k < n; k += 1) {
      const [tr, ti] = cardioidMultiplier(ray.points[2 * k]!, ray.points[2 * k + 1]!);
      expect(Math.abs(ti)).toBeLessThan(1e-12);
      expect(tr).toBeGreaterThan(lastR);
      // r steps of 1/64 (the walk's grid), the last the boundary itself
      expect(Math.abs(tr - k / 64)).toBeLessThan(1e-9);
      lastR = tr;
    }
  });

  it('cardioid, angle 1/2 ends at the root of the period-2 disk c = -3/4, angle 1/3 at e^{2 pi i/3}/2 - e^{4 pi i/3}/4 = -1/8 + (3 sqrt 3/8) i, to 1e-19 (the cardioid formula)', () => {
    const half = internalRay(1, 0, 0, { num: 1, den: 2 }, 32)!;
    expect(Math.abs(Number(half.end.re) + 0.75)).toBeLessThan(1e-19);
    expect(Math.abs(Number(half.end.im))).toBeLessThan(1e-19);
    const third = internalRay(1, 0, 0, { num: 1, den: 3 }, 32)!;
    expect(third.end.re).toBe('-0.12500000000000000000');
    // 3 sqrt 3 / 8 = sqrt(27) / 8, to 20 digits by integer square root (exact algebra); the last digit may round
    const scaled = isqrt(27n * 10n ** 44n) / 8n; // 10^22 sqrt(27) / 8, truncated
    const got = BigInt(third.end.im.replace('0.', '').padEnd(20, '0').slice(0, 20));
    const want = scaled / 100n; // 20 digits after the point
    expect(got - want >= -1n && got - want <= 1n, `${third.end.im} vs 0.${want}`).toBe(true);
    for (let k = 0; k < third.points.length; k += 2) {
      const [tr, ti] = cardioidMultiplier(third.points[k]!, third.points[k + 1]!);
      if (Math.hypot(tr, ti) < 1e-9) continue;
      expect(Math.abs(Math.atan2(ti, tr) - (2 * Math.PI) / 3)).toBeLessThan(1e-9);
      expect(Math.hypot(tr, ti)).toBeLessThanOrEqual(1 + 1e-12);
    }
  });

  it('period-2 disk: the ray of angle 1/4 is the segment from -1 to -1 + i/4 (multiplier 4(c + 1))', () => {
    const ray = internalRay(2, -1, 0, { num: 1, den: 4 }, 16)!;
    expect(Math.abs(Number(ray.end.re) + 1)).toBeLessThan(1e-19);
    expect(Math.abs(Number(ray.end.im) - 0.25)).toBeLessThan(1e-19);
    for (let k = 0; k < ray.points.length; k += 2) {
      expect(Math.abs(ray.points[k]! + 1)).toBeLessThan(1e-14);
      expect(Math.abs(ray.points[k + 1]! - k / 2 / 16 / 4)).toBeLessThan(1e-14);
    }
  });

  it('the period-3 satellite of the cardioid, angle 0: ends at its root, the cardioid point of internal angle 1/3 (a singular root of the system, reached through the parent)', () => {
    // nucleus of the upper period-3 bulb, -0.12256116687665362 + 0.74486176661974423 i (from memory; Newton polishes it)
    const ray = internalRay(3, -0.12256116687665362, 0.74486176661974423, { num: 0, den: 1 }, 64)!;
    expect(ray).not.toBeNull();
    expect(Math.abs(Number(ray.end.re) + 0.125)).toBeLessThan(1e-19);
    expect(Math.abs(Number(ray.end.im) - (3 * Math.sqrt(3)) / 8)).toBeLessThan(1e-15);
    expect(ray.reached).toBeGreaterThan(0.5);
  });
});
