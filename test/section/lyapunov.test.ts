import { describe, expect, it } from 'vitest';
import { logistic } from '../../src/section/families/index.js';
import { lyapunovExponents } from '../../src/section/lyapunov.js';

function lyap(r: number, iterations: number): { value: number; spread: number } {
  const out = new Float64Array(1);
  const spread = new Float64Array(1);
  lyapunovExponents(logistic, Float64Array.of(r), { transient: 2000, iterations, starts: 3 }, out, spread);
  return { value: out[0]!, spread: spread[0]! };
}

describe('lyapunovExponents', () => {
  it('lyapunovExponents at r = 4 gives ln 2 within the sampling error', () => {
    // docs/checks.md: exact ln 2 (conjugacy to the tent map); 2e5 samples give about 1e-3 sampling error.
    const l = lyap(4, 200_000);
    expect(Math.abs(l.value - Math.LN2)).toBeLessThan(5e-3);
  });

  it('lyapunovExponents on the stable fixed point gives ln |2 - r|', () => {
    // docs/checks.md "Lyapunov exponent on a stable fixed point": exact.
    expect(lyap(2.8, 2000).value).toBeCloseTo(Math.log(0.8), 9);
  });

  it('lyapunovExponents on the stable 2-cycle gives (1/2) ln |4 + 2r - r^2|', () => {
    // docs/checks.md "... / 2-cycle": exact.
    const r = 3.2;
    expect(lyap(r, 2000).value).toBeCloseTo(0.5 * Math.log(Math.abs(4 + 2 * r - r * r)), 9);
  });

  it('lyapunovExponents is negative in the period-3 window and positive in chaos', () => {
    // docs/methods.md E6 [checked there]: r = 3.83 gives -0.370.
    expect(lyap(3.83, 20_000).value).toBeCloseTo(-0.37, 2);
    expect(lyap(3.7, 20_000).value).toBeGreaterThan(0);
  });
});
