import { describe, expect, it } from 'vitest';
import { smoothCount } from '../../src/plane/smooth-count.js';

/** Orbit of 0 under z^2 + c until |z| > R; returns [n, z_n]. */
function escape(cRe: number, cIm: number, R: number): [number, number, number] {
  let x = 0,
    y = 0,
    n = 0;
  while (x * x + y * y <= R * R && n < 100000) {
    [x, y] = [x * x - y * y + cRe, 2 * x * y + cIm];
    n++;
  }
  return [n, x, y];
}

describe('smoothCount', () => {
  it('smoothCount lies in (n - 1, n] for escaped orbits (docs/methods.md A1)', () => {
    const R = 1024,
      logR = Math.log(R);
    for (const [a, b] of [
      [0.3, 0],
      [-0.75, 0.1],
      [0.4, 0.6],
      [-2.1, 0],
      [1, 1],
      [0.45, 0.35],
    ]) {
      const [n, x, y] = escape(a!, b!, R);
      const mu = smoothCount(n, x, y, logR);
      expect(mu).toBeGreaterThan(n - 1);
      expect(mu).toBeLessThanOrEqual(n);
    }
  });

  it('smoothCount barely depends on which escaped iterate it is given (band continuity, docs/methods.md A1)', () => {
    // mu(n, z_n) and mu(n + 1, z_{n+1}) differ by log2(ln|z^2 + c| / (2 ln|z|)) = O(|c| / |z|^2 / ln|z|).
    for (const [a, b] of [
      [0.3, 0],
      [-0.75, 0.1],
      [0.4, 0.6],
    ]) {
      const R = 1e4,
        logR = Math.log(R);
      const [n, x, y] = escape(a!, b!, R);
      const x1 = x * x - y * y + a!,
        y1 = 2 * x * y + b!;
      expect(Math.abs(smoothCount(n, x, y, logR) - smoothCount(n + 1, x1, y1, logR))).toBeLessThan(1e-8);
    }
  });

  it('smoothCount does not depend on R beyond a constant shift log2(ln R)', () => {
    // mu_R = n - log2 ln|z| + log2 ln R: changing R shifts mu by log2(ln R' / ln R).
    const [n1, x1, y1] = escape(-0.75, 0.1, 1e3);
    const [n2, x2, y2] = escape(-0.75, 0.1, 1e6);
    const shift = Math.log2(Math.log(1e6) / Math.log(1e3));
    expect(smoothCount(n2, x2, y2, Math.log(1e6)) - smoothCount(n1, x1, y1, Math.log(1e3))).toBeCloseTo(shift, 6);
  });
});
