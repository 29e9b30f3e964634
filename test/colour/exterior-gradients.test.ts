import { describe, expect, it } from 'vitest';
import { EXTERIOR_GRADIENT_NAMES, gradientLinear, gradientOklab, gradientPosition, gradientStopsOklab, stopsLinear } from '../../src/colour/exterior-gradients.js';
import { oklabDistance, oklabToLinear } from '../../src/colour/oklab.js';

describe('exterior gradients', () => {
  it('every gradient stays inside the sRGB gamut along its whole cycle (1e-9)', () => {
    const t = [0, 0, 0];
    for (const name of EXTERIOR_GRADIENT_NAMES) {
      let worst = 0;
      for (let i = 0; i < 2000; i++) {
        gradientOklab(name, i / 2000, t);
        oklabToLinear(t[0]!, t[1]!, t[2]!, t);
        for (const v of t) worst = Math.max(worst, -v, v - 1);
      }
      expect(worst, name).toBeLessThanOrEqual(1e-9);
    }
  });

  it('is continuous around the cycle: t -> 1 meets t = 0 (no seam)', () => {
    for (const name of EXTERIOR_GRADIENT_NAMES) {
      const a = gradientOklab(name, 0, [0, 0, 0]) as number[];
      const b = gradientOklab(name, 1 - 1e-9, [0, 0, 0]) as number[];
      expect(oklabDistance(a, b)).toBeLessThan(1e-7);
    }
  });

  it('vellum is achromatic (a = b = 0, equal linear channels)', () => {
    const t = [0, 0, 0];
    for (let i = 0; i < 50; i++) {
      gradientLinear('vellum', i / 50, t);
      expect(Math.abs(t[0]! - t[1]!)).toBeLessThan(1e-6);
      expect(Math.abs(t[1]! - t[2]!)).toBeLessThan(1e-6);
    }
  });

  it('gradientPosition is periodic: mu and the mu one cycle later give the same t', () => {
    // log scale: u = ln(1 + mu); one cycle of 0.5 later is mu' = (1 + mu) e^0.5 - 1.
    const mu = 12.3;
    const mu2 = (1 + mu) * Math.exp(0.5) - 1;
    expect(gradientPosition(mu2, 'log', 0.5, 0.2)).toBeCloseTo(gradientPosition(mu, 'log', 0.5, 0.2), 12);
    expect(gradientPosition(mu + 20, 'linear', 20, 0.7)).toBeCloseTo(gradientPosition(mu, 'linear', 20, 0.7), 12);
    // linear: mu = 5, cycle 20, offset 0.7 -> frac(0.25 + 0.7) = 0.95 (hand computation).
    expect(gradientPosition(5, 'linear', 20, 0.7)).toBeCloseTo(0.95, 14);
  });

  it('gradientPosition stays in [0, 1) for negative, zero and huge counts', () => {
    for (const mu of [-3, 0, 1e-300, 7.5, 1e6, 1e300]) {
      const t = gradientPosition(mu, 'log', 1.3, 0.999999);
      expect(t).toBeGreaterThanOrEqual(0);
      expect(t).toBeLessThan(1);
    }
  });

  it('stopsLinear(gradientStopsOklab(name), t, out, o) gives gradientLinear(name, t) bit for bit', () => {
    // Agreement between the two code paths (the shading loop's and the generic one), at 20001 positions and the ends.
    const ref = [0, 0, 0];
    const out = new Float64Array(5);
    for (const name of EXTERIOR_GRADIENT_NAMES) {
      let mismatches = 0;
      for (let i = 0; i <= 20001; i++) {
        const t = i === 20001 ? 1 - 2 ** -53 : i / 20001;
        gradientLinear(name, t, ref);
        stopsLinear(gradientStopsOklab(name), t, out, 2);
        for (let c = 0; c < 3; c++) if (!Object.is(out[2 + c], ref[c])) mismatches++;
      }
      expect(mismatches, name).toBe(0);
    }
  });
});
