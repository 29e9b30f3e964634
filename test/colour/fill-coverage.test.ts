import { describe, expect, it } from 'vitest';
import { fillCoverage, SUB } from '../../src/colour/fill-coverage.js';

const sum = (a: Float64Array): number => a.reduce((s, v) => s + v, 0);

describe('fillCoverage', () => {
  it('covers a rectangle with sides on sub-scanline bounds exactly: its area, and pixel by pixel the overlap (elementary geometry)', () => {
    // x from 1.25 to 3.75, y from 0.5 to 2.5 (multiples of 1/SUB): area 2.5 * 2 = 5
    const out = fillCoverage([[1.25, 0.5, 3.75, 0.5, 3.75, 2.5, 1.25, 2.5]], 5, 3, new Float64Array(15));
    expect(sum(out)).toBeCloseTo(5, 12);
    expect(out[1 * 5 + 2]).toBeCloseTo(1, 12);
    expect(out[1 * 5 + 1]).toBeCloseTo(0.75, 12);
    expect(out[0 * 5 + 3]).toBeCloseTo(0.75 * 0.5, 12);
    expect(out[1 * 5 + 4]).toBe(0);
  });

  it('covers a triangle to its area within the sub-scanline quantisation (area 1/2 * 4 * 4 = 8)', () => {
    const out = fillCoverage([[0, 0, 4, 4, 0, 4]], 4, 4, new Float64Array(16));
    // midpoint sampling in y of a linear width is exact for the total
    expect(Math.abs(sum(out) - 8)).toBeLessThan(1e-12);
    // each pixel within 1/SUB of its exact share (diagonal pixels hold 1/2, below it 1, above it 0)
    for (let j = 0; j < 4; j++) for (let i = 0; i < 4; i++) expect(Math.abs(out[j * 4 + i]! - (i < j ? 1 : i === j ? 0.5 : 0)), `${i},${j}`).toBeLessThanOrEqual(1 / SUB);
  });

  it('fills by nonzero winding: a hole wound the other way stays empty, an overlap wound the same way counts once', () => {
    const outer = [0, 0, 4, 0, 4, 4, 0, 4];
    const hole = [1, 1, 1, 3, 3, 3, 3, 1];
    const withHole = fillCoverage([outer, hole], 4, 4, new Float64Array(16));
    expect(sum(withHole)).toBeCloseTo(16 - 4, 12);
    expect(withHole[1 * 4 + 1]).toBe(0);
    const twice = fillCoverage([outer, [1, 1, 3, 1, 3, 3, 1, 3]], 4, 4, new Float64Array(16));
    expect(sum(twice)).toBeCloseTo(16, 12);
    for (const v of twice) expect(v).toBeLessThanOrEqual(1);
  });

  it('clips to the image: nothing is written outside width x height', () => {
    const out = fillCoverage([[-2, -2, 10, -2, 10, 10, -2, 10]], 3, 2, new Float64Array(6));
    for (const v of out) expect(v).toBeCloseTo(1, 12);
  });
});
