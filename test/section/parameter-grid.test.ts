import { describe, expect, it } from 'vitest';
import { gridPlaces, parameterGrid } from '../../src/section/parameter-grid.js';

/** A decimal string as an exact fraction n / 10^p with BigInt n. */
function scaled(s: string, p: number): bigint {
  const [int, frac = ''] = s.replace('-', '').split('.');
  const n = BigInt(int! + frac.padEnd(p, '0').slice(0, p));
  if (frac.length > p) throw new Error(`${s} has more than ${p} places`);
  return s.startsWith('-') ? -n : n;
}

describe('parameterGrid', () => {
  it('parameterGrid(2.8, 4, 7) prints 3.2 where doubles give 2.8 + 0.4 = 3.1999999999999997', () => {
    expect(2.8 + 0.4).toBe(3.1999999999999997); // IEEE 754 binary64
    expect(parameterGrid('2.8', '4', 7)).toEqual(['2.8', '3', '3.2', '3.4', '3.6', '3.8', '4']);
  });

  it('each point is within half a unit of its last place of the exact r_k = a + (b - a) k / (n - 1)', () => {
    // Exact rational arithmetic in BigInt, independent of decimal.js.
    for (const [a, b, n] of [
      ['2.8', '4', 2000],
      ['-2', '0.25', 333],
      ['0.7', '1', 10007],
    ] as const) {
      const grid = parameterGrid(a, b, n);
      const p = gridPlaces(a, b, n);
      const q = p + 1;
      const A = scaled(a, q);
      const B = scaled(b, q);
      expect(grid[0]).toBe(a);
      expect(grid[n - 1]).toBe(b);
      for (let k = 0; k < n; k++) {
        // |grid_k - r_k| <= 0.5 * 10^-p, i.e. |10^q (n-1) grid_k - (10^q (n-1) a + k 10^q (b - a))| <= 5 (n - 1).
        const g = scaled(grid[k]!, q) * BigInt(n - 1);
        const exact = A * BigInt(n - 1) + BigInt(k) * (B - A);
        const err = g > exact ? g - exact : exact - g;
        expect(err <= 5n * BigInt(n - 1)).toBe(true);
        if (k > 0) expect(Number(grid[k]) > Number(grid[k - 1])).toBe(true);
      }
    }
  });
});
