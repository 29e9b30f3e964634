// The "certain" count of externalAngleOf (docs/methods.md D5): every digit it
// calls certain must be a digit that c's own double cannot move, so it must be
// shared by the angle read from neighbouring doubles (c moved by 1 to 8 units
// in the last place, in directions the code does not use itself: it compares with +- and -+) traced with
// 16x the sub-steps. Before the cut to agreeing prefixes, the point by the 3/8
// ray at depth 40 claimed 41 certain digits where a finer trace agreed on 36,
// and the 5/12 points claimed a digit more than their neighbours shared.
import { describe, expect, it } from 'vitest';
import { externalAngleOf, agreeingPrefix } from '../../src/components/ray-out.js';
import { traceRayDouble } from '../../src/components/trace-ray.js';

/** Binary digits of n/d by long division (exact). */
function binary(n: number, d: number, len: number): string {
  let s = '';
  let x = n;
  for (let i = 0; i < len; i += 1) {
    x *= 2;
    s += x >= d ? '1' : '0';
    if (x >= d) x -= d;
  }
  return s;
}

const ulp = 2 ** -52;

function neighbours(cr: number, ci: number): [number, number][] {
  const out: [number, number][] = [];
  for (const k of [1, 3, 8]) {
    out.push([cr * (1 + k * ulp), ci]);
    out.push([cr, ci * (1 - k * ulp)]);
    out.push([cr * (1 + k * ulp), ci * (1 + k * ulp)]);
  }
  return out;
}

describe('externalAngleOf: the certain digits hold for every neighbouring double and a finer trace', () => {
  for (const [n, d, depth] of [
    [1, 3, 10],
    [1, 3, 24],
    [1, 7, 10],
    [1, 7, 24],
    [5, 12, 24],
    [5, 12, 40],
    [3, 8, 10],
    [3, 8, 40],
    [1, 4, 24],
  ] as const) {
    it(`a point by the ${n}/${d} ray at depth ${depth}`, () => {
      const end = traceRayDouble(n, d, depth, 8);
      const a = externalAngleOf(end.reHi, end.imHi, 64, 100_000)!;
      for (const [cr, ci] of neighbours(end.reHi, end.imHi)) {
        const b = externalAngleOf(cr, ci, 64, 100_000, 128)!;
        expect(agreeingPrefix(a.digits, b.digits)).toBeGreaterThanOrEqual(a.certain);
      }
      if (d === 3 || d === 7) {
        // periodic, not dyadic: the point sits clear of every dyadic sector boundary, so the
        // certain digits reach the depth the inward tracer put it on the ray (D4)
        expect(a.certain).toBeGreaterThanOrEqual(depth);
        expect(a.digits.slice(0, depth)).toBe(binary(n, d, depth));
      }
    });
  }

  it('a point by the dyadic 3/8 ray at depth 40 (0.011000... against 0.010111...): at most the two shared digits are certain', () => {
    // the inward trace leaves it about 2^-(40+16) from the ray (Böttcher error at |F| = 2^8), below
    // what doubles can resolve of c: the side of the ray is not known, so only 0.01 is
    const end = traceRayDouble(3, 8, 40, 8);
    const a = externalAngleOf(end.reHi, end.imHi, 64, 100_000)!;
    expect(a.certain).toBeLessThanOrEqual(2);
    expect(a.digits.slice(0, 2)).toBe('01');
  });
});
