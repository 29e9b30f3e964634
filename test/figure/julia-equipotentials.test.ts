import { describe, expect, it } from 'vitest';
import { equipotential } from '../../src/figure/equipotentials.js';
import { juliaLevelMap, juliaPotentialAt } from '../../src/figure/julia-equipotentials.js';

/**
 * The tracer solves f^(k-1)(z) = e^(2^(k-1)(G + 2 pi i theta)) with |f^(k-1)(z)| between R and R^2 (R = 65536);
 * there phi_c(w) = w (1 + O(|c| / |w|^2)) (Milnor, Dynamics in One Complex Variable, 9.3), so a point's potential
 * is G to |c| / R^2 < 5e-10 absolutely at most; near the critical point rounding adds eps |c| / |z|.
 */
const TOL = 1e-9;

describe('equipotential(G, step, juliaLevelMap(c))', () => {
  for (const G of [2, 0.5, 0.1, 0.01]) {
    it(`c = 0, G = ${G}: every point lies on the circle |z| = e^G (G_0(z) = ln|z|, exact algebra), and the curve closes`, () => {
      const pts = equipotential(G, 0.002, juliaLevelMap(0, 0))!;
      expect(pts.length).toBeGreaterThan(1000);
      // the Böttcher map of c = 0 is the identity, so here the tracer's only error is rounding
      for (let i = 0; i < pts.length; i += 2) expect(Math.abs(Math.log(Math.hypot(pts[i]!, pts[i + 1]!)) - G)).toBeLessThan(1e-14);
      expect(Math.hypot(pts[0]! - pts.at(-2)!, pts[1]! - pts.at(-1)!)).toBeLessThan(1e-12);
      // it goes round once: the winding about 0 is one turn
      let turn = 0;
      for (let i = 2; i < pts.length; i += 2) {
        let d = Math.atan2(pts[i + 1]!, pts[i]!) - Math.atan2(pts[i - 1]!, pts[i - 2]!);
        d -= 2 * Math.PI * Math.round(d / (2 * Math.PI));
        turn += d;
      }
      expect(Math.abs(turn / (2 * Math.PI) - 1)).toBeLessThan(1e-9);
    });
  }

  for (const G of [2, 0.5, 0.1, 0.01, 0.002]) {
    it(`c = -2, G = ${G}: every point lies on the ellipse of semi-axes e^G + e^-G, e^G - e^-G (Joukowski z = w + 1/w conjugates f to w^2, G = ln|w|)`, () => {
      const pts = equipotential(G, 0.001, juliaLevelMap(-2, 0))!;
      expect(pts.length).toBeGreaterThan(1000);
      const a = Math.exp(G) + Math.exp(-G);
      const b = Math.exp(G) - Math.exp(-G);
      let most = 0;
      for (let i = 0; i < pts.length; i += 2) {
        const x = pts[i]!;
        const y = pts[i + 1]!;
        // the exact potential: w = (z + sqrt(z^2 - 4)) / 2 with |w| > 1, by the principal square root
        const sr = x * x - y * y - 4;
        const si = 2 * x * y;
        const m = Math.hypot(sr, si);
        let qr = Math.sqrt((m + sr) / 2);
        let qi = (si < 0 ? -1 : 1) * Math.sqrt((m - sr) / 2);
        if (qr * x + qi * y < 0) [qr, qi] = [-qr, -qi];
        const exact = Math.log(Math.hypot((x + qr) / 2, (y + qi) / 2));
        expect(Math.abs(exact - G)).toBeLessThan(TOL * Math.max(1, G));
        most = Math.max(most, Math.abs((x / a) ** 2 + (y / b) ** 2 - 1));
      }
      // on the ellipse itself: the potential's error over |grad G| (at least 1/(a + b) on the ellipse) bounds the residual
      expect(most).toBeLessThan(4 * TOL * Math.max(1, G) * (a + b));
      // and it reaches the ends of both axes (kept points are at most 0.001 apart)
      let right = 0;
      let top = 0;
      for (let i = 0; i < pts.length; i += 2) [right, top] = [Math.max(right, pts[i]!), Math.max(top, pts[i + 1]!)];
      expect(Math.abs(right - a)).toBeLessThan(1e-6);
      expect(Math.abs(top - b)).toBeLessThan(1e-3);
    });
  }

  it('rabbit: every point has its level by direct iteration of juliaPotentialAt, to 1e-9', () => {
    const [cr, ci] = [-0.12256116687665, 0.74486176661974];
    for (const G of [0.3, 0.02]) {
      const pts = equipotential(G, 0.002, juliaLevelMap(cr, ci))!;
      for (let i = 0; i < pts.length; i += 2) expect(Math.abs(juliaPotentialAt(pts[i]!, pts[i + 1]!, cr, ci, 100000) / G - 1)).toBeLessThan(1e-8);
    }
  });
});
