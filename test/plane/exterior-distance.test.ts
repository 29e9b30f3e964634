import { describe, expect, it } from 'vitest';
import { exteriorDistance } from '../../src/plane/exterior-distance.js';

describe('exteriorDistance', () => {
  it('exteriorDistance(c = 1, n = 3, z_3 = 5) is 2 * 5 * ln 5 / 13 (hand iteration with d updated before z)', () => {
    // Exact hand computation (docs/methods.md A2 recurrence d_{k+1} = 2 z_k d_k + 1, d_0 = 0):
    // z: 0, 1, 2, 5;  d: 0, 1, 2*1*1 + 1 = 3, 2*2*3 + 1 = 13.
    expect(exteriorDistance(1, 0, 3, 5, 0)).toBeCloseTo((2 * 5 * Math.log(5)) / 13, 15);
    // Updating z before d (the pitfall noted in A2) would give d: 0, 1, 5, 51 and fail here.
    // One more step: z_4 = 26, d_4 = 2*5*13 + 1 = 131.
    expect(exteriorDistance(1, 0, 4, 26, 0)).toBeCloseTo((2 * 26 * Math.log(26)) / 131, 15);
  });

  it('exteriorDistance(c = 2i, n = 2, z_2 = -4 + 2i) matches the complex hand computation', () => {
    // z: 0, 2i, -4 + 2i; d: 0, 1, 2 (2i)(1) + 1 = 1 + 4i. b = 2 |z| ln|z| / |d|.
    const z = Math.hypot(-4, 2);
    expect(exteriorDistance(0, 2, 2, -4, 2)).toBeCloseTo((2 * z * Math.log(z)) / Math.hypot(1, 4), 15);
  });

  it('exteriorDistance(conjugate c) is bit-identical', () => {
    expect(exteriorDistance(-0.3, -0.9, 7, 100.5, -3.25)).toBe(exteriorDistance(-0.3, 0.9, 7, 100.5, 3.25));
  });
});
