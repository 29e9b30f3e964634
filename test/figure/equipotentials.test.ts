import { describe, expect, it } from 'vitest';
import { equipotential } from '../../src/figure/equipotentials.js';

/** The Green's function by direct iteration (an independent loop): log|z_n| / 2^(n-1) once |z_n| > 1e50 (the tail of the series is then below 1e-99). */
function green(cr: number, ci: number): number {
  let zr = cr;
  let zi = ci;
  for (let n = 1; n < 100000; n++) {
    const m = zr * zr + zi * zi;
    if (m > 1e100) return (0.5 * Math.log(m)) / 2 ** (n - 1);
    [zr, zi] = [zr * zr - zi * zi + cr, 2 * zr * zi + ci];
  }
  return 0;
}

describe('equipotential', () => {
  it('far out (G = log 20) lies on |c + 1/2| = e^G up to the 1/(8w) term of the inverse Böttcher map Psi(w) = w - 1/2 + 1/(8w) - 1/(4w^2) + ... (from memory)', () => {
    const G = Math.log(20);
    const pts = equipotential(G, 0.01)!;
    let most = 0;
    for (let i = 0; i < pts.length; i += 2) {
      const dev = Math.abs(Math.hypot(pts[i]! + 0.5, pts[i + 1]!) - Math.exp(G));
      // | |c + 1/2| - e^G | <= e^{-G}/8 + O(e^{-2G}); the next term is 1/(4 w^2), 1/1600 here
      expect(dev).toBeLessThanOrEqual(Math.exp(-G) / 8 + Math.exp(-2 * G) / 2);
      most = Math.max(most, dev);
    }
    // and the 1/(8w) term is there: a circle about -1/2 would fail this
    expect(most).toBeGreaterThan(Math.exp(-G) / 8 - Math.exp(-2 * G) / 2);
    // closed: it ends where it began
    expect(Math.hypot(pts[0]! - pts.at(-2)!, pts[1]! - pts.at(-1)!)).toBeLessThan(1e-12);
  });

  for (const G of [0.3, 0.05, 0.01]) {
    it(`near the set (G = ${G}) every point has potential G by direct iteration, to 1e-9`, () => {
      const pts = equipotential(G, 0.002)!;
      expect(pts.length).toBeGreaterThan(1000);
      for (let i = 0; i < pts.length; i += 2) expect(Math.abs(green(pts[i]!, pts[i + 1]!) / G - 1)).toBeLessThan(1e-9);
      // symmetric about the real axis as a set: the curve reaches as far up as down, to the spacing of its kept points
      let up = 0;
      let down = 0;
      for (let i = 1; i < pts.length; i += 2) [up, down] = [Math.max(up, pts[i]!), Math.min(down, pts[i]!)];
      expect(Math.abs(up + down)).toBeLessThan(0.002);
    });
  }
});
