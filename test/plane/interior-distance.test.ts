import { describe, expect, it } from 'vitest';
import { attractingCycle } from '../../src/plane/attracting-cycle.js';
import { interiorDistance } from '../../src/plane/interior-distance.js';

describe('interiorDistance', () => {
  it('interiorDistance(c = -1, w = 0, p = 2) is 0.25, the radius of the period-2 disk', () => {
    // docs/methods.md A6 [checked]: c = -1 (p = 2) gives b = 0.25; docs/checks.md: the disk is |c + 1| < 1/4.
    expect(interiorDistance(-1, 0, 0, 0, 2)).toBe(0.25);
    // The other cycle point gives the same value (hand computation of A6 from w = -1).
    expect(interiorDistance(-1, 0, -1, 0, 2)).toBe(0.25);
  });

  it('interiorDistance(c = 0, w = 0, p = 1) is 0.5', () => {
    // docs/methods.md A6 [checked]: c = 0 gives 0.5 (true distance to the boundary 0.25).
    expect(interiorDistance(0, 0, 0, 0, 1)).toBe(0.5);
  });

  it('interiorDistance(c = -1.76, p = 3) is 0.0106 to three digits', () => {
    // docs/methods.md A6 [checked]: c = -1.76 (p = 3) gives 0.0106 (true 0.0085).
    const r = attractingCycle(-1.76, 0, 3, 0, 0);
    expect(r.ok).toBe(true);
    expect(interiorDistance(-1.76, 0, r.wRe, r.wIm, 3)).toBeCloseTo(0.0106, 4);
  });

  it('interiorDistance(c = m/2 - m^2/4, w = m/2, p = 1) equals (1 - |m|^2) |1 - m| / 2', () => {
    // Exact algebra: over one step D_z = 2w = m, D_c = 1, D_zz = 2, D_cz = 0, so
    // b = (1 - |m|^2) / |2 / (1 - m)|.
    for (const [mr, mi] of [
      [0.5, 0.5],
      [-0.7, 0.1],
      [0.9, 0],
      [0, -0.99],
    ] as const) {
      const cRe = mr / 2 - (mr * mr - mi * mi) / 4,
        cIm = mi / 2 - (mr * mi) / 2;
      const expected = ((1 - mr * mr - mi * mi) * Math.hypot(1 - mr, mi)) / 2;
      expect(interiorDistance(cRe, cIm, mr / 2, mi / 2, 1)).toBeCloseTo(expected, 14);
    }
  });

  it('interiorDistance is NaN for a repelling cycle', () => {
    // c = 0.5: fixed point (1 + i)/2 has |2w| = sqrt 2 > 1.
    expect(interiorDistance(0.5, 0, 0.5, 0.5, 1)).toBeNaN();
  });
});
