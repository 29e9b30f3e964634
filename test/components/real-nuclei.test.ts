import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { logistic } from '../../src/section/families/index.js';
import { findWindows } from '../../src/section/windows.js';

/**
 * Two independent paths to the same numbers: the census finds real nuclei by
 * tracing external rays in the c-plane and Newton on F^p(0, c) = 0 (complex,
 * doubles / double-double); the real slice finds superstable parameters by
 * bisection on the MSS word (kneading order) and then Newton on
 * f_r^p(1/2) = 1/2 for the logistic map in x-space with decimal.js. Neither
 * is seeded from the other. The conjugacy c = r/2 - r^2/4 (exact algebra,
 * docs/checks.md) must carry one set onto the other, one to one.
 */
describe('real nuclei of the census equal the superstable logistic parameters', () => {
  it('for every real component of periods 3..9 (counts 1, 2, 3, 5, 9, 16, 28: OEIS A000048)', async () => {
    const windows = findWindows(logistic, 9, 30).windows;
    const counts: number[] = [];
    for (let p = 3; p <= 9; p++) {
      const real = (await census(p)).components
        .filter((c) => c.real)
        .map((c) => c.reHi + c.reLo)
        .sort((a, b) => a - b);
      counts.push(real.length);
      const fromR = windows
        .filter((w) => w.period === p)
        .map((w) => {
          const r = w.superstable.toNumber();
          return r / 2 - (r * r) / 4;
        })
        .sort((a, b) => a - b);
      expect(fromR).toHaveLength(real.length);
      // Doubles: both ends are good to ~1e-15 relative; the c(r) map loses a little near r = 4.
      real.forEach((c, i) => expect(Math.abs(fromR[i]! - c), `period ${p}, nucleus ${c}`).toBeLessThan(1e-12));
    }
    expect(counts).toEqual([1, 2, 3, 5, 9, 16, 28]);
  });
});
