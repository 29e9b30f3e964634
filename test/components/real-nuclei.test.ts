import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { logistic } from '../../src/section/families/index.js';
import { superstableParameter } from '../../src/section/real-newton.js';

/**
 * Two independent paths to the same numbers: the census finds real nuclei by
 * tracing external rays in the c-plane and Newton on F^p(0, c) = 0 (complex,
 * doubles / double-double); the real slice finds superstable parameters by
 * Newton on f_r^p(1/2) = 1/2 for the logistic map in x-space with decimal.js.
 * The conjugacy c = r/2 - r^2/4 (exact algebra, checks.md) must carry one onto
 * the other.
 */
describe('real nuclei of the census equal the superstable logistic parameters', () => {
  it('for every real component of periods 3..9 (counts 1, 2, 3, 5, 9, 16, 28: OEIS A000048)', async () => {
    const counts: number[] = [];
    for (let p = 3; p <= 9; p++) {
      const found = await census(p);
      const real = found.components.filter((c) => c.real);
      counts.push(real.length);
      for (const c of real) {
        const cRe = c.reHi + c.reLo;
        const guess = String(1 + Math.sqrt(1 - 4 * cRe));
        const s = superstableParameter(logistic, p, guess, 30);
        expect(s.converged).toBe(true);
        const r = s.r.toNumber();
        const cFromR = r / 2 - (r * r) / 4;
        // Doubles: both ends are good to ~1e-15 relative; the c(r) map loses a little near r = 4.
        expect(Math.abs(cFromR - cRe)).toBeLessThan(1e-12);
      }
    }
    expect(counts).toEqual([1, 2, 3, 5, 9, 16, 28]);
  });
});
