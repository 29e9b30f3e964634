/** BigInt fixed-point LU (src/section/constants/fixed-lu.ts) against exact rational solutions. */
import { describe, expect, it } from 'vitest';
import { luFactor, luSolve } from '../../../src/section/constants/fixed-lu.js';

const fix = (num: bigint, den: bigint, bits: number): bigint => (num << BigInt(bits)) / den;

describe('luFactor and luSolve', () => {
  it('luSolve solves [[0,2,1],[1,1,0],[3,0,1]] x = (1,2,3) to within 2^-90 of the exact x = (6/5, 4/5, -3/5) (pivoting needed)', () => {
    // Exact by Cramer's rule: det = -5; x = (6/5, 4/5, -3/5) (Python fractions; check: 2(4/5) - 3/5 = 1, 6/5 + 4/5 = 2, 18/5 - 3/5 = 3).
    const bits = 100;
    const one = 1n << BigInt(bits);
    const a = [
      [0n, 2n * one, one],
      [one, one, 0n],
      [3n * one, 0n, one],
    ];
    const x = luSolve(luFactor(a, bits), [one, 2n * one, 3n * one]);
    const exact = [fix(6n, 5n, bits), fix(4n, 5n, bits), fix(-3n, 5n, bits)];
    x.forEach((v, i) => expect(Math.abs(Number(v - exact[i]!))).toBeLessThan(2 ** 10));
  });

  it('luSolve with a right-hand side at a finer scale returns the solution at that scale (the chord step of fixed-point.ts)', () => {
    const low = 80;
    const high = 300;
    const one = 1n << BigInt(low);
    const a = [
      [4n * one, one],
      [one, 3n * one],
    ];
    // b = (1, 2) * 2^-150 written at 300 bits; x = (1/11, 7/11) * 2^-150 exactly.
    const b = [1n << 150n, 2n << 150n];
    const x = luSolve(luFactor(a, low), b);
    const exact = [fix(1n, 11n, 150), fix(7n, 11n, 150)];
    // Relative accuracy of the low factorisation: about 2^-75 of x's size 2^150 at the 300-bit scale.
    x.forEach((v, i) => expect(Number(v - exact[i]! < 0n ? exact[i]! - v : v - exact[i]!)).toBeLessThan(2 ** 80));
  });

  it('luFactor refuses a singular matrix', () => {
    const one = 1n << 64n;
    expect(() =>
      luFactor(
        [
          [one, 2n * one],
          [2n * one, 4n * one],
        ],
        64,
      ),
    ).toThrow(RangeError);
  });
});
