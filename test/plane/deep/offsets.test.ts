import { describe, expect, it } from 'vitest';
import { fillDeepOffsets } from '../../../src/plane/deep/offsets.js';

describe('fillDeepOffsets', () => {
  const g = { originRe: -3.5, originIm: 2.25, stepXRe: 0.5, stepXIm: 0.125, stepYRe: 0.125, stepYIm: -0.5 };

  it('gives a pixel the same offset whether it is computed in a 8x8 block or in 2x2 tiles', () => {
    const whole = { re: new Float64Array(64), im: new Float64Array(64) };
    fillDeepOffsets(g, 0, 0, 8, 8, whole.re, whole.im);
    for (let ty = 0; ty < 8; ty += 2) {
      for (let tx = 0; tx < 8; tx += 2) {
        const re = new Float64Array(4),
          im = new Float64Array(4);
        fillDeepOffsets(g, tx, ty, 2, 2, re, im);
        for (let j = 0; j < 2; j++) {
          for (let i = 0; i < 2; i++) {
            expect(re[j * 2 + i]).toBe(whole.re[(ty + j) * 8 + tx + i]);
            expect(im[j * 2 + i]).toBe(whole.im[(ty + j) * 8 + tx + i]);
          }
        }
      }
    }
  });

  it('follows origin + i stepX + j stepY (exact in binary fractions) and returns the largest component', () => {
    const re = new Float64Array(6),
      im = new Float64Array(6);
    const max = fillDeepOffsets(g, 1, 2, 3, 2, re, im);
    // pixel (x, y) = (2, 3) sits at k = 1 * 3 + 1
    expect(re[4]).toBe(-3.5 + 2 * 0.5 + 3 * 0.125);
    expect(im[4]).toBe(2.25 + 2 * 0.125 - 3 * 0.5);
    expect(max).toBe(Math.max(...Array.from(re, Math.abs), ...Array.from(im, Math.abs)));
  });
});
