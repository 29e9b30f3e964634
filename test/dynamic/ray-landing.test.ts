import { describe, expect, it } from 'vitest';
import { dynamicRay, DEFAULT_RAY_OPTIONS } from '../../src/dynamic/dynamic-ray.js';
import { anglePeriod, rayLanding } from '../../src/dynamic/ray-landing.js';

const RAY = { ...DEFAULT_RAY_OPTIONS, depth: 48 };

/** The principal square root, written out here (not the code under test). */
function sqrt(x: number, y: number): [number, number] {
  const m = Math.hypot(x, y);
  return [Math.sqrt((m + x) / 2), (y < 0 ? -1 : 1) * Math.sqrt((m - x) / 2)];
}

function landing(cr: number, ci: number, num: number, den: number): [number, number] | null {
  return rayLanding(cr, ci, num, den, dynamicRay(cr, ci, num, den, RAY), RAY.sharpness);
}

describe('anglePeriod', () => {
  it('reads the preperiod and period of doubling mod 1: 1/7 (0, 3), 1/6 (1, 2), 0 (0, 1), 3/8 (3, 1)', () => {
    // 1/7 -> 2/7 -> 4/7 -> 1/7; 1/6 -> 1/3 -> 2/3 -> 1/3; 3/8 -> 3/4 -> 1/2 -> 0 (exact arithmetic)
    expect(anglePeriod(1, 7)).toEqual({ preperiod: 0, period: 3 });
    expect(anglePeriod(1, 6)).toEqual({ preperiod: 1, period: 2 });
    expect(anglePeriod(0, 1)).toEqual({ preperiod: 0, period: 1 });
    expect(anglePeriod(3, 8)).toEqual({ preperiod: 3, period: 1 });
  });
});

describe('rayLanding', () => {
  it('the rabbit: the rays 1/7, 2/7, 4/7 land at alpha = (1 - sqrt(1 - 4c))/2 (Douady-Hubbard), though the trace stops about 0.01 short', () => {
    const [cr, ci] = [-0.12256116687665, 0.74486176661974];
    const [sr, si] = sqrt(1 - 4 * cr, -4 * ci);
    const alpha = [(1 - sr) / 2, -si / 2];
    for (const num of [1, 2, 4]) {
      const traced = dynamicRay(cr, ci, num, 7, RAY);
      const end = Math.hypot(traced.at(-2)! - alpha[0]!, traced.at(-1)! - alpha[1]!);
      expect(end).toBeGreaterThan(1e-4);
      const z = landing(cr, ci, num, 7)!;
      expect(Math.hypot(z[0] - alpha[0]!, z[1] - alpha[1]!)).toBeLessThan(1e-12);
    }
  });

  it('c = i: the ray 1/6 lands at the critical value c = i (a Misiurewicz point: the dynamic and parameter rays of 1/6 land at c; docs/checks.md)', () => {
    const z = landing(0, 1, 1, 6)!;
    expect(Math.hypot(z[0], z[1] - 1)).toBeLessThan(1e-12);
  });

  it('c = -1: the ray 0 lands at beta = (1 + sqrt 5)/2 and the ray 1/2 at -beta (exact algebra)', () => {
    const beta = (1 + Math.sqrt(5)) / 2;
    const z0 = landing(-1, 0, 0, 1)!;
    expect(Math.hypot(z0[0] - beta, z0[1])).toBeLessThan(1e-12);
    const z1 = landing(-1, 0, 1, 2)!;
    expect(Math.hypot(z1[0] + beta, z1[1])).toBeLessThan(1e-12);
  });

  it('c = 1/4: the ray 0 lands at the parabolic fixed point 1/2, a double root where Newton is not trusted: null, the ray drawn as traced', () => {
    expect(landing(0.25, 0, 0, 1)).toBeNull();
  });
});
