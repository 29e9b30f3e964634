import { describe, expect, it } from 'vitest';
import { componentOutline } from '../../src/components/component-outline.js';

describe('componentOutline', () => {
  it('period 1: every point is on the main cardioid c = m/2 - m^2/4 with |m| = 1, at m = e^{2 pi i j/n} (exact algebra)', () => {
    const n = 200;
    const pts = componentOutline(1, 0, 0, n)!;
    expect(pts.length).toBe(2 * (n - 1));
    for (let j = 1; j < n; j++) {
      const a = (2 * Math.PI * j) / n;
      // m/2 - m^2/4 for m = e^{ia}
      const re = Math.cos(a) / 2 - Math.cos(2 * a) / 4;
      const im = Math.sin(a) / 2 - Math.sin(2 * a) / 4;
      expect(Math.hypot(pts[2 * (j - 1)]! - re, pts[2 * (j - 1) + 1]! - im), `j = ${j}`).toBeLessThan(1e-13);
    }
  });

  it('period 2: every point is on the circle |c + 1| = 1/4, at c = -1 + e^{2 pi i j/n}/4 (the 2-cycle multiplier is 4(c + 1))', () => {
    const n = 120;
    const pts = componentOutline(2, -1, 0, n)!;
    for (let j = 1; j < n; j++) {
      const a = (2 * Math.PI * j) / n;
      expect(Math.hypot(pts[2 * (j - 1)]! - (-1 + Math.cos(a) / 4), pts[2 * (j - 1) + 1]! - Math.sin(a) / 4), `j = ${j}`).toBeLessThan(1e-13);
    }
  });

  it('period 3, the real cardioid at -1.7549: ends next to its cusp -1.75 (root of the window, docs/methods.md C3 [checked]) from both sides', () => {
    const n = 400;
    const pts = componentOutline(3, -1.7548776662466927, 0, n)!;
    const first = Math.hypot(pts[0]! + 1.75, pts[1]!);
    const last = Math.hypot(pts[pts.length - 2]! + 1.75, pts[pts.length - 1]!);
    expect(first).toBeLessThan(1e-4);
    expect(last).toBeLessThan(1e-4);
    // symmetric about the real axis (conjugation maps the component to itself, theta to -theta)
    expect(pts[1]! + pts[pts.length - 1]!).toBeCloseTo(0, 12);
  });
});
