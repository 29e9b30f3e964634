import { describe, expect, it } from 'vitest';
import { census, periodicNumerators } from '../../src/components/census.js';

// OEIS A000740: number of components of exact period n (also methods.md C5, checks.md "Counts").
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010];
// OEIS A000048: real components of exact period n (Metropolis, Stein & Stein 1973; checks.md).
const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170];

describe('census', () => {
  it('census(p) finds A000740(p) components and A000048(p) real ones for p = 1..12, every one with exactly two rays', async () => {
    for (let p = 1; p <= 12; p += 1) {
      const r = await census(p);
      expect(r.components.length, `period ${p}`).toBe(A000740[p - 1]);
      expect(r.components.filter((c) => c.real).length, `real, period ${p}`).toBe(A000048[p - 1]);
      expect(r.unpaired).toBe(0);
      expect(r.raysLost).toBe(0);
      if (p > 1) for (const c of r.components) expect(c.angles.length).toBe(2);
      // every nucleus lies in |c| <= 2 (methods.md C5)
      for (const c of r.components) expect(Math.hypot(c.reHi, c.imHi)).toBeLessThanOrEqual(2);
    }
  });
  it('census(2) lands 1/3 and 2/3 on c = -1; census(3) lands 3/7 and 4/7 on the real nucleus (checks.md external angles)', async () => {
    const two = (await census(2)).components;
    expect(two).toHaveLength(1);
    expect(two[0]!.angles).toEqual([1, 2]); // over 2^2 - 1 = 3
    expect(two[0]!.reHi).toBeCloseTo(-1, 14);
    const three = (await census(3)).components.filter((c) => c.real);
    expect(three[0]!.angles).toEqual([3, 4]); // over 7
    expect(three[0]!.reHi).toBeCloseTo(-1.7548776662466927, 14); // OEIS A060006: -rho^2
  });
  it('sum over d | p of N(d) = 2^(p-1) (degree of F^p(0,c); methods.md C5)', async () => {
    for (const p of [6, 8, 9]) {
      let total = 0;
      for (let d = 1; d <= p; d += 1) if (p % d === 0) total += (await census(d)).components.length;
      expect(total).toBe(2 ** (p - 1));
    }
  });
  it('periodicNumerators(4, false) lists the 12 angles of exact period 4', () => {
    expect(Array.from(periodicNumerators(4, false))).toEqual([1, 2, 3, 4, 6, 7, 8, 9, 11, 12, 13, 14]);
  });
});
